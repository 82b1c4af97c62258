import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const markPlanDone = (planId: string) => api.post<PlanDto>(`/plans/${encodeURIComponent(planId)}/done`);

export function useMarkPlanDone() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: markPlanDone, onSuccess: (plan) => storePlan(qc, plan) });
}
