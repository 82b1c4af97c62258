import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateTrainInput } from '@shared/schemas/plans';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const updateTrain = ({ planId, planLotId, trainId, changes }: { planId: string; planLotId: string; trainId: string; changes: UpdateTrainInput }) =>
  api.patch<PlanDto>(`/plans/${encodeURIComponent(planId)}/lots/${encodeURIComponent(planLotId)}/trains/${encodeURIComponent(trainId)}`, changes);

export function useUpdateTrain() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateTrain, onSuccess: (plan) => storePlan(qc, plan) });
}
