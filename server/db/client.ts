import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import { logger } from '../lib/logger';
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

const UNAVAILABLE_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'ENOTFOUND', 'EHOSTUNREACH', 'ENETUNREACH', 'EAI_AGAIN',
  '57P01', // admin_shutdown
  '57P02', // crash_shutdown
  '57P03', // cannot_connect_now (starting up or shutting down)
  '53300', // too_many_connections
]);
const UNAVAILABLE_MESSAGES = /Connection terminated|connection error|timeout exceeded when trying to connect|the database system is (starting up|shutting down)|Client was closed|not queryable/i;

/** True when an error (or its cause chain) says the database cannot be reached right now. */
export function isDatabaseUnavailable(error: unknown): boolean {
  let e: unknown = error;
  for (let depth = 0; e && typeof e === 'object' && depth < 5; depth += 1) {
    const { code, message } = e as { code?: unknown; message?: unknown };
    if (typeof code === 'string' && (UNAVAILABLE_CODES.has(code) || code.startsWith('08'))) return true;
    if (typeof message === 'string' && UNAVAILABLE_MESSAGES.test(message)) return true;
    const errors = (e as { errors?: unknown }).errors; // AggregateError from a dual-stack connect
    if (Array.isArray(errors) && errors.some((x) => isDatabaseUnavailable(x))) return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}
