import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CartridgeDetailDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

export const getCartridge = (id: string) => api.get<CartridgeDetailDto>(`/cartridges/${encodeURIComponent(id)}`);

export const getCartridgeQueryOptions = (id: string) => queryOptions({ queryKey: cartridgeKeys.detail(id), queryFn: () => getCartridge(id) });

export function useCartridge(id: string) {
  return useQuery(getCartridgeQueryOptions(id));
}
