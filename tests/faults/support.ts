// Helpers for tests that run Porewise as a separate process.
import { spawn, type ChildProcess } from 'node:child_process';
import { resolve } from 'node:path';

export const root = resolve(import.meta.dirname, '../..');

/** A TCP port that was free a moment ago (one copy, with the API tests' server processes). */
export { freePort } from '../support/server-process';

/** `node --import tsx <script>`: one process (no tsx wrapper), so a signal reaches the server itself. */
export function spawnTs(script: string, args: string[], env: NodeJS.ProcessEnv, opts: { detached?: boolean } = {}) {
  const child = spawn(process.execPath, ['--import', 'tsx', script, ...args], {
    cwd: root,
    env,
    detached: opts.detached ?? false,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (d) => (output += d));
  child.stderr!.on('data', (d) => (output += d));
  return { child, output: () => output };
}

/** Resolves with the exit code (or signal) of a child, or rejects after `timeoutMs`. */
export function exited(child: ChildProcess, timeoutMs: number): Promise<number | string> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve(child.exitCode ?? child.signalCode!);
  return new Promise((resolvePromise, reject) => {
    const timer = setTimeout(() => reject(new Error(`process ${child.pid} still running after ${timeoutMs} ms`)), timeoutMs);
    child.once('exit', (code, signal) => {
      clearTimeout(timer);
      resolvePromise(code ?? signal ?? -1);
    });
  });
}

/** Waits until `check()` is true. */
export async function waitUntil(check: () => boolean | Promise<boolean>, timeoutMs: number, what: string) {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}
