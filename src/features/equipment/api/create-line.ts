import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateLineInput } from '@shared/schemas/equipment';
import type { LineDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const createLine = (input: CreateLineInput) => api.post<LineDto>('/lines', input);

export function useCreateLine() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createLine, onSuccess: () => qc.invalidateQueries({ queryKey: equipmentKeys.lines() }) });
}
