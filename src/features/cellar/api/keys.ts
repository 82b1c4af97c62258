import type { LotsListQuery, TanksListQuery } from '@shared/schemas/cellar';

export type LotsFilters = Partial<LotsListQuery>;
export type TanksFilters = Partial<TanksListQuery>;

export const cellarKeys = {
  all: ['cellar'] as const,
  tanks: () => [...cellarKeys.all, 'tanks'] as const,
  tankList: (filters: TanksFilters) => [...cellarKeys.tanks(), 'list', filters] as const,
  lots: () => [...cellarKeys.all, 'lots'] as const,
  lotList: (filters: LotsFilters) => [...cellarKeys.lots(), 'list', filters] as const,
  lotDetail: (id: string) => [...cellarKeys.lots(), 'detail', id] as const,
  labResults: (lotId: string) => [...cellarKeys.lotDetail(lotId), 'lab-results'] as const,
};

/** `?a=1&b=2` from the set values of a filter object (empty values left out). */
export function queryString(filters: Record<string, string | number | undefined | null>) {
  const params = new URLSearchParams();
  for (const [k, v] of Object.entries(filters)) if (v !== undefined && v !== null && v !== '') params.set(k, String(v));
  const s = params.toString();
  return s ? `?${s}` : '';
}
