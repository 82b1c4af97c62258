import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateCartridgeTypeInput } from '@shared/schemas/equipment';
import type { CartridgeTypeDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const updateCartridgeType = ({ id, changes }: { id: string; changes: UpdateCartridgeTypeInput }) =>
  api.patch<CartridgeTypeDto>(`/cartridge-types/${encodeURIComponent(id)}`, changes);

export function useUpdateCartridgeType() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateCartridgeType, onSuccess: () => qc.invalidateQueries({ queryKey: equipmentKeys.cartridgeTypes() }) });
}
