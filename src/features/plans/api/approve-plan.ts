import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const approvePlan = (planId: string) => api.post<PlanDto>(`/plans/${encodeURIComponent(planId)}/approve`);

export function useApprovePlan() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: approvePlan, onSuccess: (plan) => storePlan(qc, plan) });
}
