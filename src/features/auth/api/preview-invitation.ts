import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationPreviewDto } from '@shared/types/api';
import { api } from '@/lib/api-client';
import { invitationKeys } from './keys';

export const previewInvitation = (token: string) => api.post<InvitationPreviewDto>('/invitations/preview', { token });

export const previewInvitationQueryOptions = (token: string) =>
  queryOptions({ queryKey: invitationKeys.preview(token), queryFn: () => previewInvitation(token), enabled: token.length > 0 });

export function usePreviewInvitation(token: string) {
  return useQuery(previewInvitationQueryOptions(token));
}
