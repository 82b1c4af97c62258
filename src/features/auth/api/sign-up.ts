import { useMutation } from '@tanstack/react-query';
import type { SignUpInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { useRefreshSession } from '@/lib/session';

export const signUp = (input: SignUpInput) => api.post<{ ok: true }>('/auth/sign-up', input);

export function useSignUp() {
  const refresh = useRefreshSession();
  return useMutation({ mutationFn: signUp, onSuccess: refresh });
}
