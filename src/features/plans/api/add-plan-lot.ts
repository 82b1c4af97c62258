import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AddPlanLotInput } from '@shared/schemas/plans';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const addPlanLot = ({ planId, input }: { planId: string; input: AddPlanLotInput }) =>
  api.post<PlanDto>(`/plans/${encodeURIComponent(planId)}/lots`, input);

export function useAddPlanLot() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: addPlanLot, onSuccess: (plan) => storePlan(qc, plan) });
}
