// Vitest global setup for server and browser tests: the private cluster and a migrated test
// database. `npm test` already did this; running vitest directly does it here.
import { startCluster } from '../../scripts/lib/postgres';
import { prepareTestDatabase } from './test-database';

export default async function setup() {
  startCluster();
  if (!process.env.POREWISE_TEST_DB_READY) await prepareTestDatabase();
}
