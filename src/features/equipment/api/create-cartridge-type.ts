import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateCartridgeTypeInput } from '@shared/schemas/equipment';
import type { CartridgeTypeDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const createCartridgeType = (input: CreateCartridgeTypeInput) => api.post<CartridgeTypeDto>('/cartridge-types', input);

export function useCreateCartridgeType() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createCartridgeType, onSuccess: () => qc.invalidateQueries({ queryKey: equipmentKeys.cartridgeTypes() }) });
}
