import type { LotsListQuery, TanksListQuery } from '@shared/schemas/cellar';
import { queryRoots } from '@/lib/query-keys';

export type LotsFilters = Partial<LotsListQuery>;
export type TanksFilters = Partial<TanksListQuery>;

/** Tanks and lots together: a lot's tank shows in both lists, so some writes refresh the whole cellar. */
export const cellarKeys = {
  all: queryRoots.cellar,
};

export const tankKeys = {
  all: [...cellarKeys.all, 'tanks'] as const,
  list: (filters: TanksFilters) => [...tankKeys.all, 'list', filters] as const,
};

export const lotKeys = {
  all: [...cellarKeys.all, 'lots'] as const,
  list: (filters: LotsFilters) => [...lotKeys.all, 'list', filters] as const,
  detail: (id: string) => [...lotKeys.all, 'detail', id] as const,
  labResults: (lotId: string) => [...lotKeys.detail(lotId), 'lab-results'] as const,
};

/** `?a=1&b=2` from the set values of a filter object (empty values left out). */
export function queryString(filters: Record<string, string | number | undefined | null>) {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== null && v !== '') params.set(k, String(v));
  const s = params.toString();
  return s ? `?${s}` : '';
}
