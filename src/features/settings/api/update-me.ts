import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { UpdateMeInput } from '@shared/schemas/auth';
import type { MeDto } from '@shared/types/api';
import { api } from '@/lib/api-client';
import { sessionKeys } from '@/lib/session';

export const updateMe = (input: UpdateMeInput) => api.patch<MeDto>('/me', input);

export function useUpdateMe() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: updateMe, onSuccess: (me) => qc.setQueryData(sessionKeys.me(), me) });
}
