import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const reopenPlan = (planId: string) => api.post<PlanDto>(`/plans/${encodeURIComponent(planId)}/reopen`);

export function useReopenPlan() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: reopenPlan, onSuccess: (plan) => storePlan(qc, plan) });
}
