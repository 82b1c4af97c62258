import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { planKeys } from './keys';

export const deletePlan = (id: string) => api.delete<void>(`/plans/${encodeURIComponent(id)}`);

export function useDeletePlan() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: deletePlan,
    onSuccess: (_void, id) => {
      qc.removeQueries({ queryKey: planKeys.detail(id) });
      void qc.invalidateQueries({ queryKey: planKeys.lists() });
    },
  });
}
