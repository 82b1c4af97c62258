import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const removePlanLot = ({ planId, planLotId }: { planId: string; planLotId: string }) =>
  api.delete<PlanDto>(`/plans/${encodeURIComponent(planId)}/lots/${encodeURIComponent(planLotId)}`);

export function useRemovePlanLot() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: removePlanLot, onSuccess: (plan) => storePlan(qc, plan) });
}
