// Keeps a whole-database dump of porewise_test apart from the test apps' schema changes.
//
// Every test app creates its own job-queue schema when it starts and drops it when it closes; in
// `npm test` the browser tests' apps do so at any moment, beside the API tests. pg_dump lists the
// tables under one snapshot and then locks them one by one: a table dropped in between makes the
// dump fail. So each create or drop holds a shared advisory lock, and a dump holds it exclusively.
import type pg from 'pg';

/** The advisory lock's key (any constant no other code of the app uses). */
const SCHEMA_CHANGE_LOCK = 7_240_113;

async function holding<T>(pool: pg.Pool, mode: 'shared' | 'exclusive', fn: () => Promise<T> | T): Promise<T> {
  const client = await pool.connect();
  const suffix = mode === 'shared' ? '_shared' : '';
  try {
    await client.query(`select pg_advisory_lock${suffix}($1)`, [SCHEMA_CHANGE_LOCK]);
    try {
      return await fn();
    } finally {
      await client.query(`select pg_advisory_unlock${suffix}($1)`, [SCHEMA_CHANGE_LOCK]);
    }
  } finally {
    client.release();
  }
}

/** Runs `fn` (which creates or drops a schema) while no dump runs. */
export const duringSchemaChange = <T>(pool: pg.Pool, fn: () => Promise<T> | T) => holding(pool, 'shared', fn);

/** Runs `fn` (a dump of the test database) while no test app creates or drops a schema. */
export const withoutSchemaChanges = <T>(pool: pg.Pool, fn: () => Promise<T> | T) => holding(pool, 'exclusive', fn);
