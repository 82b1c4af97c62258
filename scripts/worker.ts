// `npm run worker`: the job workers alone (no web server), against the local cluster unless
// DATABASE_URL is given. Run the web side with WORKERS=false to split them.
import { databaseUrl, ensureDatabase, startCluster } from './lib/postgres';

if (!process.env.DATABASE_URL) {
  startCluster();
  ensureDatabase('porewise');
  process.env.DATABASE_URL = databaseUrl('porewise');
}
await import('../server/worker');
