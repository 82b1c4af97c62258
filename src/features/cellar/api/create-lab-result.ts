import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LabResultInput } from '@shared/schemas/cellar';
import type { LabResultDto } from '@shared/types/cellar';
import { api } from '@/lib/api-client';
import { lotKeys } from './keys';

export const createLabResult = ({ lotId, input }: { lotId: string; input: LabResultInput }) => api.post<LabResultDto>(`/lots/${lotId}/lab-results`, input);

export function useCreateLabResult() {
  const qc = useQueryClient();
  // The lot's verdict and the lots table depend on the latest result.
  return useMutation({ mutationFn: createLabResult, onSuccess: () => qc.invalidateQueries({ queryKey: lotKeys.all }) });
}
