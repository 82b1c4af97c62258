// `server/index.ts` as its own process, as production runs it, for the API tests that need a real
// server process (two instances on one database; a process killed before its mail went out).
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer, type AddressInfo } from 'node:net';
import { join } from 'node:path';
import { databaseUrl } from '../../scripts/lib/postgres';

/** A TCP port that was free a moment ago. */
export async function freePort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
  const { port } = server.address() as AddressInfo;
  await new Promise<void>((r) => server.close(() => r()));
  return port;
}

/**
 * Spawns `server/index.ts` on `port` (test database, fake services in `dir`, the queue in
 * `QUEUE_SCHEMA` of `env`) and resolves once it answers /api/health; rejects if it exits or does
 * not start within `startMs`. `env` is laid over the common settings.
 */
export async function spawnServer(opts: { port: number; dir: string; env: NodeJS.ProcessEnv; startMs: number }): Promise<{ url: string; child: ChildProcess }> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/index.ts'], {
    env: {
      ...process.env,
      NODE_ENV: 'test',
      HOST: '127.0.0.1',
      PORT: String(opts.port),
      DATABASE_URL: databaseUrl('porewise_test'),
      QUEUE_POLL_SECONDS: '0.5',
      FAKE_SERVICES_DIR: opts.dir,
      CLIENT_DIR: join(opts.dir, 'no-client'),
      ...opts.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (d) => (output += d));
  child.stderr!.on('data', (d) => (output += d));
  const url = `http://127.0.0.1:${String(opts.port)}`;
  const deadline = Date.now() + opts.startMs;
  for (;;) {
    if (child.exitCode !== null) throw new Error(`server exited: ${output}`);
    if (await fetch(`${url}/api/health`).then((r) => r.ok, () => false)) return { url, child };
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error(`server did not start: ${output}`);
    }
    await new Promise((r) => setTimeout(r, 200));
  }
}
