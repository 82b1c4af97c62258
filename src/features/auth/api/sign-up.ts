import { useMutation } from '@tanstack/react-query';
import type { SignUpConfirmInput, SignUpInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { useRefreshSession } from '@/lib/session';

/** Always answers the same (new or taken address); the account is made from the mailed link. */
export const signUp = (input: SignUpInput) => api.post<{ ok: true; checkMail: true }>('/auth/sign-up', input);

export function useSignUp() {
  return useMutation({ mutationFn: signUp });
}

export const confirmSignUp = (input: SignUpConfirmInput) => api.post<{ ok: true }>('/auth/sign-up/confirm', input);

export function useConfirmSignUp() {
  const refresh = useRefreshSession();
  return useMutation({ mutationFn: confirmSignUp, onSuccess: refresh });
}
