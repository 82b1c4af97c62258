import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Role } from '@shared/permissions';
import type { TeamDto } from '@shared/types/api';
import { api } from '@/lib/api-client';
import { sessionKeys } from '@/lib/session';
import { teamKeys } from './keys';

export const changeRole = ({ userId, role }: { userId: string; role: Role }) =>
  api.patch<TeamDto>(`/team/${encodeURIComponent(userId)}`, { role });

export function useChangeRole() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: changeRole,
    onSuccess: (team) => {
      qc.setQueryData(teamKeys.detail(), team);
      // The owner may have changed their own role.
      void qc.invalidateQueries({ queryKey: sessionKeys.me() });
    },
  });
}
