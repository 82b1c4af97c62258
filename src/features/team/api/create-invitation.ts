import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateInvitationInput } from '@shared/schemas/team';
import type { InvitationDto } from '@shared/types/api';
import { api } from '@/lib/api-client';
import { teamKeys } from './keys';

export const createInvitation = (input: CreateInvitationInput) => api.post<InvitationDto>('/team/invitations', input);

export function useCreateInvitation() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: createInvitation, onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.all }) });
}
