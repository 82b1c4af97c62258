// `npm start`: database cluster → migrations → demo data → client build → serve.
// Ctrl-C stops the server and the database cleanly.
import { runMigrations } from '../server/db/migrate';
import { DEMO_PASSWORD, demoPeople, runSeed } from '../server/db/seed';
import { parseEnv } from '../server/env';
import { startServer } from '../server/server';
import { buildClientIfChanged } from './lib/build';
import { databaseUrl, ensureDatabase, startCluster, stopCluster } from './lib/postgres';

async function main() {
  startCluster();
  const external = Boolean(process.env.DATABASE_URL);
  if (!external) {
    ensureDatabase('porewise');
    process.env.DATABASE_URL = databaseUrl('porewise');
  }
  await runMigrations(process.env.DATABASE_URL!);
  await runSeed(process.env.DATABASE_URL!);
  buildClientIfChanged();

  const running = await startServer(parseEnv(process.env));
  const width = Math.max(...demoPeople.map((p) => p.email.length));
  console.log(`\n  Porewise is running at ${running.url}\n`);
  console.log(`  Demo sign-ins (password: ${DEMO_PASSWORD}):`);
  for (const p of demoPeople) console.log(`    ${p.email.padEnd(width)}  ${p.role}`);
  if (running.fakeSmtp) console.log(`\n  Mail goes to the local outbox: ${running.url}/outbox`);
  console.log('\n  Press Ctrl-C to stop.\n');

  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    console.log('\n[porewise] stopping …');
    await running.close();
    stopCluster();
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((error) => {
  console.error(`[porewise] ${error instanceof Error ? error.message : error}`);
  process.exit(1);
});
