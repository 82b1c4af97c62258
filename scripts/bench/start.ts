/**
 * A warm `npm start` (dependencies installed and the client built, nothing changed since): the
 * time from the command to a healthy `/api/health`, against a bare Express 5 process started the
 * same way (its own `tsx` process, ready when it answers). One untimed start first, so a changed
 * build or a missing database is not counted; then the median of three. The demo database and
 * the cluster are the worktree's own; a cluster this command starts is stopped with it.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { writeFileSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { clusterIsRunning } from '../lib/postgres';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
const GOAL_S = 15;

async function healthy(port: number, urlPath: string, child: ChildProcess, limitMs: number): Promise<void> {
  const deadline = Date.now() + limitMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`exited with ${String(child.exitCode)} before answering`);
    const ok = await fetch(`http://127.0.0.1:${String(port)}${urlPath}`).then(
      (r) => r.ok,
      () => false,
    );
    if (ok) return;
    await new Promise((r) => setTimeout(r, 50));
  }
  throw new Error(`no answer on ${urlPath} within ${String(limitMs / 1000)} s`);
}

/** Starts the command in its own process group, times it to a healthy answer, then stops the group (as Ctrl-C does). */
async function timedStart(cmd: string, args: string[], port: number, urlPath: string): Promise<number> {
  const t0 = performance.now();
  const child = spawn(cmd, args, { cwd: root, detached: true, stdio: 'ignore', env: { ...process.env, PORT: String(port) } });
  try {
    await healthy(port, urlPath, child, 180_000);
    return (performance.now() - t0) / 1000;
  } finally {
    const exited = new Promise((r) => child.once('exit', r));
    try {
      process.kill(-child.pid!, 'SIGINT');
    } catch {
      /* already gone */
    }
    await Promise.race([exited, new Promise((r) => setTimeout(r, 15_000))]);
  }
}

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];

export async function report() {
  const port = 3800 + (process.pid % 50);
  const clusterWasUp = clusterIsRunning();
  mkdirSync(path.join(root, '.data'), { recursive: true });
  const bodies = path.join(root, '.data', `bench-start-${String(process.pid)}.json`);
  writeFileSync(bodies, JSON.stringify({ '/api/health': { ok: true } }));
  const npm = () => timedStart('npm', ['start'], port, '/api/health');
  const bare = () => timedStart(process.execPath, ['--import', 'tsx', path.join(root, 'scripts/bench/serve.ts'), 'bare', String(port), bodies], port, '/api/health');
  await npm(); // warm-up: a changed build or a new database is done here
  const app: number[] = [];
  const peer: number[] = [];
  for (let i = 0; i < 3; i++) {
    app.push(await npm());
    peer.push(await bare());
  }
  const a = median(app);
  const b = median(peer);
  console.log(`  warm npm start to a healthy /api/health: ${a.toFixed(1)} s (median of 3; goal ≤ ${String(GOAL_S)} s)${clusterWasUp ? ', PostgreSQL already running' : ', PostgreSQL started and stopped each time'}`);
  console.log(`  a bare Express 5 process started the same way: ${b.toFixed(1)} s → npm start takes ${(a / b).toFixed(1)}× that`);
}
