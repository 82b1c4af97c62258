import { useMutation } from '@tanstack/react-query';
import type { SignInInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { useRefreshSession } from '@/lib/session';

export const signIn = (input: SignInInput) => api.post<{ ok: true }>('/auth/sign-in', input);

export function useSignIn() {
  const refresh = useRefreshSession();
  return useMutation({ mutationFn: signIn, onSuccess: refresh });
}
