import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres';
import pg from 'pg';
import * as schema from './schema';

export type Database = NodePgDatabase<typeof schema>;
/** A database handle or an open transaction: repositories accept either. */
export type DbOrTx = Database | Parameters<Parameters<Database['transaction']>[0]>[0];

export function createDatabase(url: string, opts: { max?: number } = {}) {
  // JIT compilation costs more than it saves on the app's short queries (a 10k-row Today plan spent most of its time compiling).
  const pool = new pg.Pool({ connectionString: url, max: opts.max ?? 10, options: '-c jit=off' });
  const db = drizzle(pool, { schema });
  return { db, pool };
}
