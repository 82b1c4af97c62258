import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { InstallCartridgeInput } from '@shared/schemas/cartridges';
import type { CartridgeDto } from '@shared/types/cartridges';
import { api } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

export const installCartridge = ({ id, ...input }: InstallCartridgeInput & { id: string }) =>
  api.post<CartridgeDto>(`/cartridges/${encodeURIComponent(id)}/install`, input);

export function useInstallCartridge() {
  const qc = useQueryClient();
  // A move changes the list, the summary, the housing view and the detail.
  return useMutation({ mutationFn: installCartridge, onSuccess: () => qc.invalidateQueries({ queryKey: cartridgeKeys.all }) });
}
