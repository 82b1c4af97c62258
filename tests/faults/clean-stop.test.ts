// @vitest-environment node
// Finding 9 of the hardening probe: Ctrl-C sent to the whole process group (as a terminal does)
// left PostgreSQL running after `npm start` stopped. Here `npm start`'s script runs with its own
// private cluster in a temporary folder, in its own process group; the group gets SIGINT (and,
// the second time, SIGTERM); the server and the database it started must both be gone.
import { spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readdirSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { exited, freePort, spawnTs, waitUntil } from './support';

const dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-stop-'));
const pgDir = join(dir, 'pg');
let pgPort = 0;

afterAll(() => {
  // Should a test fail half-way, do not leave a cluster behind.
  const bin = pgBin();
  if (bin && existsSync(join(pgDir, 'data', 'PG_VERSION'))) {
    const stop = [join(bin, 'pg_ctl'), '-D', join(pgDir, 'data'), '-m', 'immediate', 'stop'];
    if (process.getuid?.() === 0) spawnSync('runuser', ['-u', 'pgrunner', '--', ...stop]);
    else spawnSync(stop[0], stop.slice(1));
  }
  rmSync(dir, { recursive: true, force: true });
});

function pgBin(): string | null {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base).filter((v) => existsSync(join(base, v, 'bin', 'pg_ctl'))).sort((a, b) => Number(a) - Number(b));
  return versions.length ? join(base, versions[versions.length - 1], 'bin') : null;
}

/** True while a postmaster is running for the temporary cluster (its pid file exists and the port answers). */
function clusterUp(): boolean {
  if (!existsSync(join(pgDir, 'data', 'postmaster.pid'))) return false;
  const probe = spawnSync(join(pgBin()!, 'pg_isready'), ['-h', '127.0.0.1', '-p', String(pgPort), '-t', '2']);
  return probe.status === 0;
}

async function startAndStop(signal: 'SIGINT' | 'SIGTERM') {
  pgPort ||= await freePort();
  const port = await freePort();
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    NODE_ENV: 'development',
    POREWISE_PG_DIR: pgDir,
    PGPORT: String(pgPort),
    PORT: String(port),
    FAKE_SERVICES_DIR: join(dir, 'services'),
    CLIENT_DIR: join(dir, 'no-client'),
    LOG_LEVEL: 'warn',
  };
  delete env.DATABASE_URL;
  delete env.VITEST;
  const app = spawnTs('scripts/start.ts', ['--no-build'], env, { detached: true });
  try {
    await waitUntil(() => app.output().includes('Press Ctrl-C to stop'), 150_000, `npm start to be ready:\n${app.output()}`);
  } catch (error) {
    process.kill(-app.child.pid!, 'SIGKILL');
    throw error;
  }
  expect(clusterUp()).toBe(true);
  expect((await fetch(`http://127.0.0.1:${port}/api/health`)).status).toBe(200);

  process.kill(-app.child.pid!, signal); // the whole process group, as a terminal's Ctrl-C
  expect(await exited(app.child, 60_000)).toBe(0);
  expect(app.output()).toContain('PostgreSQL stopped');
  expect(clusterUp()).toBe(false);
  expect(await fetch(`http://127.0.0.1:${port}/api/health`).then(() => 'answered', () => 'gone')).toBe('gone');
}

describe('npm start stops cleanly', () => {
  it('Ctrl-C to the process group stops the server and the database it started', async () => {
    await startAndStop('SIGINT');
  }, 240_000);

  it('SIGTERM to the process group does the same', async () => {
    await startAndStop('SIGTERM');
  }, 240_000);
});
