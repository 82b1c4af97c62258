import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { LotListItemDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { lotKeys, queryString, type LotsFilters } from './keys';

export const getLots = (filters: LotsFilters = {}) => api.get<ListDto<LotListItemDto>>(`/lots${queryString(filters)}`);

export const getLotsQueryOptions = (filters: LotsFilters = {}) =>
  queryOptions({ queryKey: lotKeys.list(filters), queryFn: () => getLots(filters), placeholderData: keepPreviousData });

export function useLots(filters: LotsFilters = {}) {
  return useQuery(getLotsQueryOptions(filters));
}
