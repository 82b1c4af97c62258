// `npm start`: database cluster → migrations → demo data → client build → serve.
// Ctrl-C (SIGINT to the whole process group, as a terminal sends it), SIGTERM or SIGHUP stop the
// server and the database this run started — at any moment, also while still starting up.
import { randomBytes } from 'node:crypto';
import { runMigrations } from '../server/db/migrate';
import { DEMO_PASSWORD, demoPeople, runSeed } from '../server/db/seed';
import { parseEnv } from '../server/env';
import { startServer } from '../server/server';
import { buildClientIfChanged } from './lib/build';
import { clusterIsRunning, databaseUrl, ensureDatabase, startCluster, stopCluster } from './lib/postgres';

type Closable = { close(): Promise<unknown> };
const STOP_TIMEOUT_MS = 8_000;

let startedCluster = false;
const running: Closable[] = [];
let stopping = false;

/** Closes what is running (each with a time limit), then always stops the database this run started. */
async function stop(code = 0) {
  if (stopping) return;
  stopping = true;
  console.log('\n[porewise] stopping …');
  try {
    for (const item of running.reverse()) {
      await Promise.race([item.close().catch(() => {}), new Promise((r) => setTimeout(r, STOP_TIMEOUT_MS).unref())]);
    }
  } finally {
    if (startedCluster) stopCluster();
    process.exit(code);
  }
}

for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) process.on(signal, () => void stop(0));

async function main() {
  // Stop the database on exit only if this run started it (another process may be using it).
  // Decided before starting, so that a Ctrl-C arriving while PostgreSQL starts still stops it.
  startedCluster = !clusterIsRunning();
  startCluster();
  if (stopping) return;
  const external = Boolean(process.env.DATABASE_URL);
  if (!external) {
    ensureDatabase('porewise');
    process.env.DATABASE_URL = databaseUrl('porewise');
  }
  await runMigrations(process.env.DATABASE_URL!);
  await runSeed(process.env.DATABASE_URL!);
  const dev = process.argv.includes('--dev');
  if (!dev && !process.argv.includes('--no-build')) buildClientIfChanged();
  // The Vite dev server's address must pass the API's Host and Origin checks.
  if (dev) process.env.ALLOWED_ORIGINS = [process.env.ALLOWED_ORIGINS, 'http://127.0.0.1:5173', 'http://localhost:5173'].filter(Boolean).join(',');
  if (stopping) return;

  // A fresh outbox key per start unless one is set: the printed link is the only way in without signing in.
  process.env.DEV_OUTBOX_KEY ??= randomBytes(18).toString('base64url');
  const server = await startServer(parseEnv(process.env));
  running.push(server);
  // --dev: Vite's dev server with hot reload in front, proxying /api to the server above.
  const vite = dev ? await (await import('vite')).createServer({ server: { port: 5173, strictPort: true } }) : null;
  if (vite) {
    running.push(vite);
    await vite.listen();
  }
  const width = Math.max(...demoPeople.map((p) => p.email.length));
  console.log(`\n  Porewise is running at ${vite ? 'http://127.0.0.1:5173 (hot reload; API on ' + server.url + ')' : server.url}\n`);
  console.log(`  Demo sign-ins (password: ${DEMO_PASSWORD}):`);
  for (const p of demoPeople) console.log(`    ${p.email.padEnd(width)}  ${p.role}`);
  if (server.fakeSmtp && server.outboxKey) {
    console.log(`\n  Mail goes to the local outbox (owners see it signed in; this link opens it for anyone holding it):`);
    console.log(`    ${vite ? 'http://127.0.0.1:5173' : server.url}/outbox?key=${server.outboxKey}`);
  }
  console.log('\n  Press Ctrl-C to stop.\n');
}

main().catch((error) => {
  console.error(`[porewise] ${error instanceof Error ? error.message : error}`);
  void stop(1);
});
