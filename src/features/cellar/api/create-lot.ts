import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LotInput } from '@shared/schemas/cellar';
import type { LotDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { cellarKeys } from './keys';

export const createLot = (input: LotInput) => api.post<LotDto>('/lots', input);

export function useCreateLot() {
  const qc = useQueryClient();
  // Tanks count their lots, so the whole cellar refreshes.
  return useMutation({ mutationFn: createLot, onSuccess: () => qc.invalidateQueries({ queryKey: cellarKeys.all }) });
}
