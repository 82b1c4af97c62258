import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AuditPersonDto } from '@shared/types/audit';
import { api } from '@/lib/api-client';
import { auditKeys } from './keys';

export const getAuditPeople = () => api.get<{ items: AuditPersonDto[] }>('/audit/people');

export const getAuditPeopleQueryOptions = () => queryOptions({ queryKey: auditKeys.people(), queryFn: getAuditPeople });

/** People who appear in the change log, for the person filter. */
export function useAuditPeople() {
  return useQuery(getAuditPeopleQueryOptions());
}
