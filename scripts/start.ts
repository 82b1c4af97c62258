// `npm start`: database cluster → migrations → demo data → client build → serve.
// Ctrl-C stops the server and the database cleanly.
import { runMigrations } from '../server/db/migrate';
import { DEMO_PASSWORD, demoPeople, runSeed } from '../server/db/seed';
import { parseEnv } from '../server/env';
import { startServer } from '../server/server';
import { buildClientIfChanged } from './lib/build';
import { databaseUrl, ensureDatabase, startCluster, stopCluster } from './lib/postgres';

async function main() {
  // Stop the database on exit only if this run started it (another process may be using it).
  const startedCluster = startCluster();
  const external = Boolean(process.env.DATABASE_URL);
  if (!external) {
    ensureDatabase('porewise');
    process.env.DATABASE_URL = databaseUrl('porewise');
  }
  await runMigrations(process.env.DATABASE_URL!);
  await runSeed(process.env.DATABASE_URL!);
  const dev = process.argv.includes('--dev');
  if (!dev) buildClientIfChanged();
  // The Vite dev server's address must pass the API's Host and Origin checks.
  if (dev) process.env.ALLOWED_ORIGINS = [process.env.ALLOWED_ORIGINS, 'http://127.0.0.1:5173', 'http://localhost:5173'].filter(Boolean).join(',');

  const running = await startServer(parseEnv(process.env));
  // --dev: Vite's dev server with hot reload in front, proxying /api to the server above.
  const vite = dev ? await (await import('vite')).createServer({ server: { port: 5173, strictPort: true } }) : null;
  if (vite) await vite.listen();
  const width = Math.max(...demoPeople.map((p) => p.email.length));
  console.log(`\n  Porewise is running at ${vite ? 'http://127.0.0.1:5173 (hot reload; API on ' + running.url + ')' : running.url}\n`);
  console.log(`  Demo sign-ins (password: ${DEMO_PASSWORD}):`);
  for (const p of demoPeople) console.log(`    ${p.email.padEnd(width)}  ${p.role}`);
  if (running.fakeSmtp) console.log(`\n  Mail goes to the local outbox: ${running.url}/outbox`);
  console.log('\n  Press Ctrl-C to stop.\n');

  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    console.log('\n[porewise] stopping …');
    await vite?.close();
    await running.close();
    if (startedCluster) stopCluster();
    process.exit(0);
  };
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
}

main().catch((error) => {
  console.error(`[porewise] ${error instanceof Error ? error.message : error}`);
  process.exit(1);
});
