import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { CartridgeDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { cartridgeKeys, type CartridgeFilters } from './keys';

export function cartridgesSearch(filters: CartridgeFilters) {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== '') params.set(k, String(v));
  const s = params.toString();
  return s ? `?${s}` : '';
}

export const getCartridges = (filters: CartridgeFilters) => api.get<ListDto<CartridgeDto>>(`/cartridges${cartridgesSearch(filters)}`);

export const getCartridgesQueryOptions = (filters: CartridgeFilters) =>
  queryOptions({ queryKey: cartridgeKeys.list(filters), queryFn: () => getCartridges(filters), placeholderData: keepPreviousData });

export function useCartridges(filters: CartridgeFilters, opts: { enabled?: boolean } = {}) {
  return useQuery({ ...getCartridgesQueryOptions(filters), enabled: opts.enabled ?? true });
}
