import { queryRoots } from '@/lib/query-keys';

export const invitationKeys = {
  all: queryRoots.invitation,
  preview: (token: string) => [...invitationKeys.all, 'preview', token] as const,
};
