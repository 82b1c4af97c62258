import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CartridgeDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

export const removeCartridge = (id: string) => api.post<CartridgeDto>(`/cartridges/${encodeURIComponent(id)}/remove`);

export function useRemoveCartridge() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: removeCartridge, onSuccess: () => qc.invalidateQueries({ queryKey: cartridgeKeys.all }) });
}
