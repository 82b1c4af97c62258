import { useMutation } from '@tanstack/react-query';
import type { AcceptInvitationInput } from '@shared/schemas/team';
import { api } from '@/lib/api-client';
import { useRefreshSession } from '@/lib/session';

export const acceptInvitation = (input: AcceptInvitationInput) => api.post<{ wineryId: string }>('/invitations/accept', input);

export function useAcceptInvitation() {
  const refresh = useRefreshSession();
  return useMutation({ mutationFn: acceptInvitation, onSuccess: refresh });
}
