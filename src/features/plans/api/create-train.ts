import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateTrainInput } from '@shared/schemas/plans';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const createTrain = ({ planId, planLotId, input }: { planId: string; planLotId: string; input: CreateTrainInput }) =>
  api.post<PlanDto>(`/plans/${encodeURIComponent(planId)}/lots/${encodeURIComponent(planLotId)}/trains`, input);

export function useCreateTrain() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createTrain, onSuccess: (plan) => storePlan(qc, plan) });
}
