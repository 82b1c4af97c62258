import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LabResultInput } from '@shared/schemas/cellar';
import type { LabResultDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { lotKeys } from './keys';

export const updateLabResult = ({ lotId, id, input }: { lotId: string; id: string; input: LabResultInput }) =>
  api.patch<LabResultDto>(`/lots/${lotId}/lab-results/${id}`, input);

export function useUpdateLabResult() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateLabResult, onSuccess: () => qc.invalidateQueries({ queryKey: lotKeys.all }) });
}
