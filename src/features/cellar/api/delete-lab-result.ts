import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { lotKeys } from './keys';

export const deleteLabResult = ({ lotId, id }: { lotId: string; id: string }) => api.delete<void>(`/lots/${lotId}/lab-results/${id}`);

export function useDeleteLabResult() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: deleteLabResult, onSuccess: () => qc.invalidateQueries({ queryKey: lotKeys.all }) });
}
