import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdatePlanInput } from '@shared/schemas/plans';
import type { PlanDto } from '@shared/types/plans';
import { api } from '@/lib/api-client';
import { storePlan } from './get-plan';

export const updatePlan = ({ id, changes }: { id: string; changes: UpdatePlanInput }) => api.patch<PlanDto>(`/plans/${encodeURIComponent(id)}`, changes);

export function useUpdatePlan() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updatePlan, onSuccess: (plan) => storePlan(qc, plan) });
}
