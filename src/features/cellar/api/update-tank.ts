import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { TankInput } from '@shared/schemas/cellar';
import type { TankDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { cellarKeys } from './keys';

export const updateTank = ({ id, input }: { id: string; input: TankInput }) => api.patch<TankDto>(`/tanks/${id}`, input);

export function useUpdateTank() {
  const qc = useQueryClient();
  // Lots show their tank's name, so both lists refresh.
  return useMutation({ mutationFn: updateTank, onSuccess: () => qc.invalidateQueries({ queryKey: cellarKeys.all }) });
}
