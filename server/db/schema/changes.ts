import { bigint, pgTable, primaryKey, uuid } from 'drizzle-orm/pg-core';

/**
 * Which write transactions touched a winery's data: one row per (winery, transaction), written
 * by statement triggers on every table of winery data (migration 0025), whoever writes. Rows of
 * different transactions never conflict, so writers never wait on each other here. A winery's
 * data version is `winery_change_counts.n` plus its rows here: it grows by one with each commit
 * that touched the winery, and only then (an aborted transaction's row never shows). Read with
 * the session (server/lib/auth.ts) it keys the stored answers (server/middleware/answer-cache.ts).
 */
export const wineryChangesTable = pgTable(
  'winery_changes',
  {
    wineryId: uuid('winery_id').notNull(),
    txid: bigint('txid', { mode: 'number' }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.wineryId, t.txid] })],
);

/** Folded `winery_changes` rows, per winery (`fold_winery_changes()`, one statement). */
export const wineryChangeCountsTable = pgTable('winery_change_counts', {
  wineryId: uuid('winery_id').primaryKey(),
  n: bigint('n', { mode: 'number' }).notNull().default(0),
});
