import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MailFailureDto } from '@shared/types/alerts';
import { api } from '@/lib/api-client';
import { alertKeys } from './keys';

export const getMailFailures = () => api.get<{ items: MailFailureDto[] }>('/settings/mail-failures');
export const getMailFailuresQueryOptions = () => queryOptions({ queryKey: alertKeys.mailFailures(), queryFn: getMailFailures });

export function useMailFailures(opts: { enabled: boolean }) {
  return useQuery({ ...getMailFailuresQueryOptions(), enabled: opts.enabled });
}
