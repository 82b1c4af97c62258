import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const deleteHousing = (id: string) => api.delete<void>(`/housings/${encodeURIComponent(id)}`);

export function useDeleteHousing() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: deleteHousing, onSuccess: () => qc.invalidateQueries({ queryKey: equipmentKeys.housings() }) });
}
