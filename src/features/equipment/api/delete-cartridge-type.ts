import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const deleteCartridgeType = (id: string) => api.delete<void>(`/cartridge-types/${encodeURIComponent(id)}`);

export function useDeleteCartridgeType() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: deleteCartridgeType, onSuccess: () => qc.invalidateQueries({ queryKey: equipmentKeys.cartridgeTypes() }) });
}
