import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { ListDto } from '@shared/types/api';
import type { AuditEventDto } from '@shared/types/audit';
import { api } from '@/lib/api-client';
import { auditKeys, queryString, type AuditFilters } from './keys';

export const getAuditEvents = (filters: AuditFilters = {}) => api.get<ListDto<AuditEventDto>>(`/audit${queryString(filters)}`);

export const getAuditEventsQueryOptions = (filters: AuditFilters = {}) =>
  queryOptions({ queryKey: auditKeys.list(filters), queryFn: () => getAuditEvents(filters), placeholderData: keepPreviousData });

/** One page of the change log, filtered on the server. */
export function useAuditEvents(filters: AuditFilters = {}, opts: { enabled?: boolean } = {}) {
  return useQuery({ ...getAuditEventsQueryOptions(filters), enabled: opts.enabled ?? true });
}
