import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { teamKeys } from './keys';

export const removeMember = (userId: string) => api.delete<void>(`/team/${encodeURIComponent(userId)}`);

export function useRemoveMember() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: removeMember, onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.all }) });
}
