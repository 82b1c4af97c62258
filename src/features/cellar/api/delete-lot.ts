import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { cellarKeys, lotKeys } from './keys';

export const deleteLot = (id: string) => api.delete<void>(`/lots/${id}`);

export function useDeleteLot() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: deleteLot,
    onSuccess: (_data, id) => {
      qc.removeQueries({ queryKey: lotKeys.detail(id) });
      return qc.invalidateQueries({ queryKey: cellarKeys.all });
    },
  });
}
