import type { AuditListQuery } from '@shared/schemas/audit';
import { queryRoots } from '@/lib/query-keys';

export type AuditFilters = Partial<AuditListQuery>;

export const auditKeys = {
  all: queryRoots.audit,
  list: (filters: AuditFilters) => [...auditKeys.all, 'list', filters] as const,
  people: () => [...auditKeys.all, 'people'] as const,
};

/** `?a=1&b=2` from the set values of a filter object (empty values left out). */
export function queryString(filters: Record<string, string | number | undefined | null>) {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== null && v !== '') params.set(k, String(v));
  const s = params.toString();
  return s ? `?${s}` : '';
}

/** The CSV download of the change log with the same filters (no paging: the whole filtered log). */
export const auditCsvUrl = (filters: AuditFilters) => {
  const { page: _page, pageSize: _pageSize, ...rest } = filters;
  return `/api/audit/csv${queryString(rest)}`;
};
