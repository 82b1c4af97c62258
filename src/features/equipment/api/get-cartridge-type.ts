import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CartridgeTypeDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const getCartridgeType = (id: string) => api.get<CartridgeTypeDto>(`/cartridge-types/${encodeURIComponent(id)}`);

export const getCartridgeTypeQueryOptions = (id: string) =>
  queryOptions({ queryKey: equipmentKeys.cartridgeType(id), queryFn: () => getCartridgeType(id) });

export function useCartridgeType(id: string | null) {
  return useQuery({ ...getCartridgeTypeQueryOptions(id ?? ''), enabled: Boolean(id) });
}
