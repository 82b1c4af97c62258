import { asc, desc, type AnyColumn, type SQL } from 'drizzle-orm';
import type { ListQuery } from '../../shared/schemas/list';

/** LIMIT/OFFSET of a list query. */
export function pageWindow(query: Pick<ListQuery, 'page' | 'pageSize'>) {
  return { limit: query.pageSize, offset: (query.page - 1) * query.pageSize };
}

/** ORDER BY for a validated sort key, with a stable tie-breaker. */
export function orderBy<S extends string>(query: Pick<ListQuery<S>, 'sort' | 'order'>, columns: Record<S, AnyColumn | SQL>, tieBreaker: AnyColumn): SQL[] {
  const dir = query.order === 'desc' ? desc : asc;
  return [dir(columns[query.sort]), asc(tieBreaker)];
}

/** Escapes LIKE wildcards in user search text. */
export function likePattern(q: string) {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}
