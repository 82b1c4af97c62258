import { and, asc, desc, eq, inArray, type AnyColumn, type SQL } from 'drizzle-orm';
import type { PgColumn, PgSelect, PgTable, PgUpdateSetSource } from 'drizzle-orm/pg-core';
import type { ListQuery } from '../../shared/schemas/list';
import type { DbOrTx } from './client';

/** LIMIT/OFFSET of a list query. */
export function pageWindow(query: Pick<ListQuery, 'page' | 'pageSize'>) {
  return { limit: query.pageSize, offset: (query.page - 1) * query.pageSize };
}

/** ORDER BY for a validated sort key, with a stable tie-breaker. */
export function orderBy<S extends string>(query: Pick<ListQuery<S>, 'sort' | 'order'>, columns: Record<S, AnyColumn | SQL>, tieBreaker: AnyColumn): SQL[] {
  const dir = query.order === 'desc' ? desc : asc;
  return [dir(columns[query.sort]), asc(tieBreaker)];
}

/** One page of a list: the validated sort with its tie-breaker, then LIMIT/OFFSET (`qb` from `.$dynamic()`). */
export function sortedPage<Q extends PgSelect, S extends string>(
  qb: Q,
  query: Pick<ListQuery<S>, 'sort' | 'order' | 'page' | 'pageSize'>,
  columns: Record<S, AnyColumn | SQL>,
  tieBreaker: AnyColumn,
) {
  const { limit, offset } = pageWindow(query);
  return qb.orderBy(...orderBy(query, columns, tieBreaker)).limit(limit).offset(offset);
}

/** Escapes LIKE wildcards in user search text. */
export function likePattern(q: string) {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
}

// ---- one row of a winery-owned table, by id ----------------------------------------------
// A foreign id matches nothing, exactly like a missing one (the caller answers 404).

/** A winery-owned table: its rows have an `id` and a `wineryId`. */
export type OwnedTable = PgTable & { id: PgColumn; wineryId: PgColumn };

/** WHERE the row is the winery's and has this id. */
export function ownRow(table: OwnedTable, wineryId: string, id: string): SQL {
  return and(eq(table.wineryId, wineryId), eq(table.id, id))!;
}

/** Whether the winery has this row. */
export async function ownRowExists(db: DbOrTx, table: OwnedTable, wineryId: string, id: string): Promise<boolean> {
  const [row] = await db.select({ id: table.id }).from(table).where(ownRow(table, wineryId, id));
  return Boolean(row);
}

/** The winery's row; null when it is not there. */
export async function findOwnRow<T extends OwnedTable>(db: DbOrTx, table: T, wineryId: string, id: string): Promise<T['$inferSelect'] | null> {
  // As in updateOwnRowReturning: the rows of `select()` from a type-parameter table are the table's.
  const rows = (await db.select().from(table as OwnedTable).where(ownRow(table, wineryId, id))) as T['$inferSelect'][];
  return rows[0] ?? null;
}

/** Locks the winery's row (FOR UPDATE, until the transaction ends); whether it was there. */
export async function lockOwnRow(db: DbOrTx, table: OwnedTable, wineryId: string, id: string): Promise<boolean> {
  const [row] = await db.select({ id: table.id }).from(table).where(ownRow(table, wineryId, id)).for('update');
  return Boolean(row);
}

/** The winery's row, locked (FOR UPDATE) until the transaction ends; null when it is not there. */
export async function lockedOwnRow<T extends OwnedTable>(db: DbOrTx, table: T, wineryId: string, id: string): Promise<T['$inferSelect'] | null> {
  // As in findOwnRow.
  const rows = (await db.select().from(table as OwnedTable).where(ownRow(table, wineryId, id)).for('update')) as T['$inferSelect'][];
  return rows[0] ?? null;
}

/** Updates the winery's row; whether it was there. */
export async function updateOwnRow<T extends OwnedTable>(db: DbOrTx, table: T, wineryId: string, id: string, set: PgUpdateSetSource<T>): Promise<boolean> {
  const rows = await db.update(table).set(set).where(ownRow(table, wineryId, id)).returning({ id: table.id });
  return rows.length > 0;
}

/** Deletes the winery's row; whether it was there. */
export async function deleteOwnRow(db: DbOrTx, table: OwnedTable, wineryId: string, id: string): Promise<boolean> {
  const rows = await db.delete(table).where(ownRow(table, wineryId, id)).returning({ id: table.id });
  return rows.length > 0;
}

/** Updates the winery's row; the row as it is now, or null when it was not there. */
export async function updateOwnRowReturning<T extends OwnedTable>(
  db: DbOrTx,
  table: T,
  wineryId: string,
  id: string,
  set: PgUpdateSetSource<T>,
): Promise<T['$inferSelect'] | null> {
  // Drizzle does not resolve `returning()` of a table given as a type parameter: the rows are the table's.
  const rows = (await db.update(table).set(set).where(ownRow(table, wineryId, id)).returning()) as T['$inferSelect'][];
  return rows[0] ?? null;
}

/** Which of these ids are the winery's rows of the table (one query; an empty list asks nothing). */
export async function ownIdsAmong(db: DbOrTx, table: OwnedTable, wineryId: string, ids: string[]): Promise<Set<string>> {
  if (ids.length === 0) return new Set<string>();
  const rows = (await db
    .select({ id: table.id })
    .from(table as OwnedTable)
    .where(and(eq(table.wineryId, wineryId), inArray(table.id, ids)))) as { id: string }[];
  return new Set(rows.map((r) => r.id));
}
