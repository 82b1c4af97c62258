// A winery's data version: the triggers of migration 0025 leave a row in winery_changes per
// (winery, transaction) that wrote its data; the session lookup (server/lib/auth.ts) reads the
// version as the folded count plus those rows. Folding keeps the rows few; it moves them into
// the count in one statement, so the version a reader sees never changes by being folded.
import { sql, type SQL, type SQLWrapper } from 'drizzle-orm';
import type { DbOrTx } from './client';

/** The version of the winery `wineryId` names (a column or a value), as text: the count plus the rows. */
export function dataVersionOf(wineryId: SQLWrapper | string): SQL<string | null> {
  return sql<string | null>`(select (coalesce((select c.n from winery_change_counts c where c.winery_id = ${wineryId}), 0)
    + (select count(*) from winery_changes w where w.winery_id = ${wineryId}))::text)`;
}

/** How often each server process folds (any number may fold at once: a row is folded once). */
export const FOLD_EVERY_MS = 30_000;

/** Folds every committed row into the per-winery counts; answers how many rows it moved. */
export async function foldWineryChanges(db: DbOrTx): Promise<number> {
  const { rows } = await db.execute<{ moved: string }>(sql`select fold_winery_changes()::text as moved`);
  return Number(rows[0]?.moved ?? 0);
}

/** The winery's data version now (what the session lookup reads), as text: it only grows. */
export async function wineryDataVersion(db: DbOrTx, wineryId: string): Promise<string> {
  const { rows } = await db.execute<{ v: string }>(sql`select ${dataVersionOf(wineryId)} as v`);
  return rows[0].v;
}
