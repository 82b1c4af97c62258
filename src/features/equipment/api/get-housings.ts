import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { HousingDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys, listSearch, type HousingListParams } from './keys';

export const getHousings = (params: HousingListParams) => api.get<ListDto<HousingDto>>(`/housings?${listSearch(params)}`);

export const getHousingsQueryOptions = (params: HousingListParams) =>
  queryOptions({ queryKey: equipmentKeys.housingList(params), queryFn: () => getHousings(params), placeholderData: keepPreviousData });

export function useHousings(params: HousingListParams) {
  return useQuery(getHousingsQueryOptions(params));
}
