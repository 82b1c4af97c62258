import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TankInput } from '@shared/schemas/cellar';
import type { TankDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { tankKeys } from './keys';

export const createTank = (input: TankInput) => api.post<TankDto>('/tanks', input);

export function useCreateTank() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createTank, onSuccess: () => qc.invalidateQueries({ queryKey: tankKeys.all }) });
}
