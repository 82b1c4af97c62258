import { queryRoots } from '@/lib/query-keys';

/** Filters of the bottled-lots list, as sent to GET /api/records/lots. */
export type RecordLotFilters = {
  from?: string;
  to?: string;
  q?: string;
  style?: string;
  serial?: string;
  batch?: string;
  page?: number;
};

export const recordKeys = {
  all: queryRoots.records,
  lists: () => [...recordKeys.all, 'lots'] as const,
  list: (filters: RecordLotFilters) => [...recordKeys.lists(), filters] as const,
  detail: (lotId: string) => [...recordKeys.all, 'lot', lotId] as const,
};

/** The query string of a filter set (empty values left out). */
export function recordFilterQuery(filters: RecordLotFilters): string {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== '' && v !== null) params.set(k, String(v));
  const s = params.toString();
  return s ? `?${s}` : '';
}
