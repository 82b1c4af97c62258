import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateCartridgeInput } from '@shared/schemas/cartridges';
import type { CartridgeDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

export const updateCartridge = ({ id, ...input }: UpdateCartridgeInput & { id: string }) =>
  api.patch<CartridgeDto>(`/cartridges/${encodeURIComponent(id)}`, input);

export function useUpdateCartridge() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateCartridge, onSuccess: () => qc.invalidateQueries({ queryKey: cartridgeKeys.all }) });
}
