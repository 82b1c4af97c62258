import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { tankKeys } from './keys';

export const deleteTank = (id: string) => api.delete<void>(`/tanks/${id}`);

export function useDeleteTank() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: deleteTank, onSuccess: () => qc.invalidateQueries({ queryKey: tankKeys.all }) });
}
