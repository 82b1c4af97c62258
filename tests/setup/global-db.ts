// Vitest global setup for server and browser tests: the private cluster and a migrated test
// database. `npm test` already did this; running vitest directly does it here.
import { runMigrations } from '../../server/db/migrate';
import { databaseUrl, ensureDatabase, startCluster } from '../../scripts/lib/postgres';

export default async function setup() {
  startCluster();
  if (!process.env.POREWISE_TEST_DB_READY) {
    ensureDatabase('porewise_test');
    await runMigrations(databaseUrl('porewise_test'));
  }
}
