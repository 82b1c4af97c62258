import { migrate } from 'drizzle-orm/node-postgres/migrator';
import { fileURLToPath } from 'node:url';
import { createDatabase } from './client';

const migrationsFolder = fileURLToPath(new URL('../../drizzle', import.meta.url));

/** Applies the committed drizzle-kit migrations (a no-op when up to date). */
export async function runMigrations(url: string) {
  const { db, pool } = createDatabase(url, { max: 1 });
  try {
    await migrate(db, { migrationsFolder });
  } finally {
    await pool.end();
  }
}
