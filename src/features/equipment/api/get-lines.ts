import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { LineDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys, listSearch, type LineListParams } from './keys';

export const getLines = (params: LineListParams) => api.get<ListDto<LineDto>>(`/lines?${listSearch(params)}`);

export const getLinesQueryOptions = (params: LineListParams) =>
  queryOptions({ queryKey: equipmentKeys.lineList(params), queryFn: () => getLines(params), placeholderData: keepPreviousData });

export function useLines(params: LineListParams) {
  return useQuery(getLinesQueryOptions(params));
}
