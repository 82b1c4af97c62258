import { useMutation } from '@tanstack/react-query';
import type { PasswordResetRequestInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';

export const requestPasswordReset = (input: PasswordResetRequestInput) => api.post<{ ok: true }>('/auth/password-reset/request', input);

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
