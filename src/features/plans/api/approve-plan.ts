import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

/** Approves a plan; `reason` accepts the cautions the server named (flux above design, a lot not ready, a shortfall). */
export const approvePlan = ({ planId, reason }: { planId: string; reason?: string }) =>
  api.post<PlanDto>(`/plans/${encodeURIComponent(planId)}/approve`, reason ? { reason } : {});

export function useApprovePlan() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: approvePlan, onSuccess: (plan) => storePlan(qc, plan) });
}
