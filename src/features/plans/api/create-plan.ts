import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreatePlanInput } from '@shared/schemas/plans';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const createPlan = (input: CreatePlanInput) => api.post<PlanDto>('/plans', input);

export function useCreatePlan() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createPlan, onSuccess: (plan) => storePlan(qc, plan) });
}
