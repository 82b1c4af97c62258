import type { PlanListQuery } from '@shared/schemas/plans';
import { queryRoots } from '@/lib/query-keys';

export type PlanListParams = Partial<PlanListQuery>;

export const planKeys = {
  all: queryRoots.plans,
  lists: () => [...planKeys.all, 'list'] as const,
  list: (params: PlanListParams) => [...planKeys.lists(), params] as const,
  detail: (id: string) => [...planKeys.all, 'detail', id] as const,
  lineOptions: () => [...planKeys.all, 'line-options'] as const,
  lotOptions: () => [...planKeys.all, 'lot-options'] as const,
};

/** `?a=1&b=2` from the set values (empty values left out). */
export function queryString(params: Record<string, string | number | undefined | null>) {
  const search = new URLSearchParams();
  for (const [k, v] of Object.entries(params)) if (v !== undefined && v !== null && v !== '') search.set(k, String(v));
  const s = search.toString();
  return s ? `?${s}` : '';
}
