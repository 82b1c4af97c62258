import { useMutation } from '@tanstack/react-query';
import type { PasswordResetConfirmInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { useRefreshSession } from '@/lib/session';

export const confirmPasswordReset = (input: PasswordResetConfirmInput) => api.post<{ ok: true }>('/auth/password-reset/confirm', input);

export function useConfirmPasswordReset() {
  const refresh = useRefreshSession();
  return useMutation({ mutationFn: confirmPasswordReset, onSuccess: refresh });
}
