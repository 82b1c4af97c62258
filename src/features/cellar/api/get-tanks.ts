import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { TankDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { queryString, tankKeys, type TanksFilters } from './keys';

export const getTanks = (filters: TanksFilters = {}) => api.get<ListDto<TankDto>>(`/tanks${queryString(filters)}`);

export const getTanksQueryOptions = (filters: TanksFilters = {}) =>
  queryOptions({ queryKey: tankKeys.list(filters), queryFn: () => getTanks(filters), placeholderData: keepPreviousData });

export function useTanks(filters: TanksFilters = {}) {
  return useQuery(getTanksQueryOptions(filters));
}
