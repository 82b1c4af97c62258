import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { teamKeys } from './keys';

export const revokeInvitation = (id: string) => api.delete<void>(`/team/invitations/${encodeURIComponent(id)}`);

export function useRevokeInvitation() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: revokeInvitation, onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.all }) });
}
