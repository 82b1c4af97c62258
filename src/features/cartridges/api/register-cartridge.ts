import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateCartridgeInput } from '@shared/schemas/cartridges';
import type { CartridgeDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

export const registerCartridge = (input: CreateCartridgeInput) => api.post<CartridgeDto>('/cartridges', input);

export function useRegisterCartridge() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: registerCartridge, onSuccess: () => qc.invalidateQueries({ queryKey: cartridgeKeys.all }) });
}
