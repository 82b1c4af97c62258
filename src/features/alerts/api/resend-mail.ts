import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { alertKeys } from './keys';

export const resendMail = (id: string) => api.post<{ queued: boolean }>(`/settings/mail-failures/${id}/resend`);

export function useResendMail() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: resendMail, onSettled: () => qc.invalidateQueries({ queryKey: alertKeys.mailFailures() }) });
}
