import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const deleteTrain = ({ planId, planLotId, trainId }: { planId: string; planLotId: string; trainId: string }) =>
  api.delete<PlanDto>(`/plans/${encodeURIComponent(planId)}/lots/${encodeURIComponent(planLotId)}/trains/${encodeURIComponent(trainId)}`);

export function useDeleteTrain() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: deleteTrain, onSuccess: (plan) => storePlan(qc, plan) });
}
