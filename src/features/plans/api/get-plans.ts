import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { PlanListItemDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { planKeys, queryString, type PlanListParams } from './keys';

export const getPlans = (params: PlanListParams) => api.get<ListDto<PlanListItemDto>>(`/plans${queryString(params)}`);

export const getPlansQueryOptions = (params: PlanListParams) =>
  queryOptions({ queryKey: planKeys.list(params), queryFn: () => getPlans(params), placeholderData: keepPreviousData });

export function usePlans(params: PlanListParams) {
  return useQuery(getPlansQueryOptions(params));
}
