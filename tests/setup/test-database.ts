// The throwaway test database: created (or made afresh), tuned for speed, migrated. Used by
// `npm test` (scripts/test.ts) and by the vitest global setup when vitest runs on its own.
import pg from 'pg';
import { runMigrations } from '../../server/db/migrate';
import { databaseUrl, ensureDatabase } from '../../scripts/lib/postgres';

export const TEST_DATABASE = 'porewise_test';

/**
 * Creates `porewise_test` (with `fresh`, drops it first), turns off waiting for the WAL flush at
 * each commit in that database only, and applies the migrations.
 *
 * synchronous_commit = off: a commit answers before its WAL record reaches the disk. A crash may
 * lose the last moments of commits but never corrupts anything (fsync and full-page writes stay
 * on for the whole cluster), and nothing in a throwaway test database needs to outlive a crash.
 * The suite makes thousands of small commits (sign-ups, readings, job-queue bookkeeping), each of
 * which otherwise waits for a flush. The app's own database keeps the durable default.
 */
export async function prepareTestDatabase(opts: { fresh?: boolean } = {}) {
  ensureDatabase(TEST_DATABASE, opts);
  const client = new pg.Client({ connectionString: databaseUrl(TEST_DATABASE) });
  await client.connect();
  try {
    await client.query(`ALTER DATABASE ${TEST_DATABASE} SET synchronous_commit = off`);
  } finally {
    await client.end();
  }
  await runMigrations(databaseUrl(TEST_DATABASE));
}
