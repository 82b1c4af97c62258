import { sql } from 'drizzle-orm';
import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import { logger } from '../lib/logger';
import { isLockNotAvailable } from './errors';
import * as schema from './schema';

export type Database = NodePgDatabase<typeof schema>;
/** A database handle or an open transaction: repositories accept either. */
export type DbOrTx = Database | Parameters<Parameters<Database['transaction']>[0]>[0];

export function createDatabase(url: string, opts: { max?: number } = {}) {
  // JIT compilation costs more than it saves on the app's short queries (a 10k-row Today plan spent most of its time compiling).
  const pool = new pg.Pool({ connectionString: url, max: opts.max ?? 10, connectionTimeoutMillis: 5_000, options: '-c jit=off' });
  // An idle client whose connection the server ends (restart, failover, admin command) emits
  // 'error' on the pool; without a listener Node would exit. The pool drops that client and
  // opens a new connection on the next query, so the server recovers by itself.
  pool.on('error', (err) => logger.warn({ code: (err as { code?: string }).code, message: err.message }, 'database connection lost (idle client)'));
  // A client checked out of the pool (a transaction between two of its queries) can lose its
  // connection too; its error then reaches the waiting query or the next one, never the process.
  pool.on('connect', (client) => {
    client.on('error', (err) => logger.warn({ code: (err as { code?: string }).code, message: err.message }, 'database connection lost (client in use)'));
  });
  const db = drizzle(pool, { schema });
  return { db, pool };
}

/** How long a cache write waits for a row another transaction holds before it gives up. */
export const CACHE_WRITE_LOCK_TIMEOUT_MS = 100;

/**
 * Runs a write of derived figures (a cache the next read can work out again) so that it never
 * queues behind a long write of the same row — a logger import holding the run until it commits:
 * in its own transaction with a short `lock_timeout`; when the lock is not had in time the
 * write is skipped (false). Inside a caller's transaction the write simply runs there.
 */
export async function writeCacheWithoutWaiting(db: DbOrTx, write: (tx: DbOrTx) => Promise<unknown>): Promise<boolean> {
  if ('rollback' in db) {
    await write(db);
    return true;
  }
  try {
    await db.transaction(async (tx) => {
      await tx.execute(sql.raw(`set local lock_timeout = '${String(CACHE_WRITE_LOCK_TIMEOUT_MS)}ms'`));
      await write(tx);
    });
    return true;
  } catch (error) {
    if (isLockNotAvailable(error)) return false;
    throw error;
  }
}

type DriverClient = { query(config: { text: string; values?: unknown[]; name?: string }): Promise<{ rows: unknown[] }> };

/** The node-postgres client under a handle: the pool, or the client of the open transaction (so SQL sent here joins it). */
export function driverClientOf(db: DbOrTx): DriverClient {
  return (db as unknown as { session: { client: DriverClient } }).session.client;
}

/**
 * Raw SQL as a named prepared statement on the handle's connection: PostgreSQL plans it once per
 * connection instead of on every call (for the hottest writes, whose CTEs Drizzle's builder cannot
 * prepare). `name` must be unique to `text`. Parameters are positional ($1, $2, …).
 */
export async function executeNamed(db: DbOrTx, name: string, text: string, values: unknown[]): Promise<Record<string, unknown>[]> {
  const result = await driverClientOf(db).query({ name, text, values });
  return result.rows as Record<string, unknown>[];
}
