import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RecordLotListDto } from '@shared/types/records';
import { api } from '@/lib/api-client';
import { recordFilterQuery, recordKeys, type RecordLotFilters } from './keys';

export const getRecordLots = (filters: RecordLotFilters) => api.get<RecordLotListDto>(`/records/lots${recordFilterQuery(filters)}`);
export const getRecordLotsQueryOptions = (filters: RecordLotFilters) =>
  queryOptions({ queryKey: recordKeys.list(filters), queryFn: () => getRecordLots(filters), placeholderData: keepPreviousData });
export function useRecordLots(filters: RecordLotFilters) {
  return useQuery(getRecordLotsQueryOptions(filters));
}
