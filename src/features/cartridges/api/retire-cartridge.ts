import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RetireCartridgeInput } from '@shared/schemas/cartridges';
import type { CartridgeDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

export const retireCartridge = ({ id, ...input }: RetireCartridgeInput & { id: string }) =>
  api.post<CartridgeDto>(`/cartridges/${encodeURIComponent(id)}/retire`, input);

export function useRetireCartridge() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: retireCartridge, onSuccess: () => qc.invalidateQueries({ queryKey: cartridgeKeys.all }) });
}
