// `npm run db:stop | db:migrate | db:seed` — small database chores for contributors.
import { databaseUrl, ensureDatabase, startCluster, stopCluster } from './lib/postgres';

const command = process.argv[2];

async function main() {
  if (command === 'stop') return stopCluster();
  startCluster();
  ensureDatabase('porewise');
  process.env.DATABASE_URL ??= databaseUrl('porewise');
  if (command === 'migrate') {
    const { runMigrations } = await import('../server/db/migrate');
    await runMigrations(process.env.DATABASE_URL);
  } else if (command === 'seed') {
    const { runSeed } = await import('../server/db/seed');
    await runSeed(process.env.DATABASE_URL);
  } else {
    console.error('usage: tsx scripts/db-cli.ts stop | migrate | seed');
    process.exitCode = 1;
  }
}

main().catch((error) => {
  console.error(error instanceof Error ? error.message : error);
  process.exit(1);
});
