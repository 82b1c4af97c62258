import { useMutation } from '@tanstack/react-query';
import type { VerifyRecordInput } from '@shared/schemas/records';
import type { VerifyRecordDto } from '@shared/types/records';
import { api } from '@/lib/api-client';

export const verifyRecord = (input: VerifyRecordInput) => api.post<VerifyRecordDto>('/records/verify', input);
export function useVerifyRecord() {
  return useMutation({ mutationFn: verifyRecord });
}
