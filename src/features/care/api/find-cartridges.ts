import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { CartridgeDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { careKeys } from './keys';

export const FIND_LIMIT = 8;

/** Cartridges whose serial (or batch) contains `q`. */
export const findCartridges = (q: string) =>
  api.get<ListDto<CartridgeDto>>(`/cartridges?${new URLSearchParams({ q, pageSize: String(FIND_LIMIT), sort: 'serial', order: 'asc' }).toString()}`);

export const findCartridgesQueryOptions = (q: string) => queryOptions({ queryKey: careKeys.search(q), queryFn: () => findCartridges(q) });

export function useFindCartridges(q: string) {
  const term = q.trim();
  return useQuery({ ...findCartridgesQueryOptions(term), enabled: term.length >= 2, placeholderData: keepPreviousData });
}
