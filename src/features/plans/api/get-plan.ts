import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { planKeys } from './keys';

export const getPlan = (id: string) => api.get<PlanDto>(`/plans/${encodeURIComponent(id)}`);

export const getPlanQueryOptions = (id: string) => queryOptions({ queryKey: planKeys.detail(id), queryFn: () => getPlan(id) });

export function usePlan(id: string) {
  return useQuery(getPlanQueryOptions(id));
}

/** Every plan write answers the whole plan: keep it, and let the lists refetch. */
export function storePlan(qc: QueryClient, plan: PlanDto) {
  qc.setQueryData(planKeys.detail(plan.id), plan);
  void qc.invalidateQueries({ queryKey: planKeys.lists() });
}
