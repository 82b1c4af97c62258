import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdatePlanLotInput } from '@shared/schemas/plans';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const updatePlanLot = ({ planId, planLotId, changes }: { planId: string; planLotId: string; changes: UpdatePlanLotInput }) =>
  api.patch<PlanDto>(`/plans/${encodeURIComponent(planId)}/lots/${encodeURIComponent(planLotId)}`, changes);

export function useUpdatePlanLot() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updatePlanLot, onSuccess: (plan) => storePlan(qc, plan) });
}
