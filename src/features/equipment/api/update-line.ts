import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateLineInput } from '@shared/schemas/equipment';
import type { LineDto } from '@shared/types/equipment';
import { api } from '@/lib/api-client';
import { equipmentKeys } from './keys';

export const updateLine = ({ id, changes }: { id: string; changes: UpdateLineInput }) =>
  api.patch<LineDto>(`/lines/${encodeURIComponent(id)}`, changes);

export function useUpdateLine() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateLine, onSuccess: () => qc.invalidateQueries({ queryKey: equipmentKeys.lines() }) });
}
