import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const deleteLine = (id: string) => api.delete<void>(`/lines/${encodeURIComponent(id)}`);

export function useDeleteLine() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: deleteLine, onSuccess: () => qc.invalidateQueries({ queryKey: equipmentKeys.lines() }) });
}
