// @vitest-environment node
// Porewise as several identical server instances on one database (behind any load balancer):
// nothing that must be shared lives in a process's memory. Two apps, each with its own
// connection pool, on the one test database; and two real server processes for the limits.
import type { ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { databaseUrl } from '../../scripts/lib/postgres';
import { freePort, spawnServer } from '../support/server-process';
import { addMember, Client, signUp, startTestApp, TEST_PASSWORD, type TestApp } from '../support/test-app';
import { expectReplayedCreate } from '../support/idempotency';

let a: TestApp;
let b: TestApp;
beforeAll(async () => {
  [a, b] = await Promise.all([startTestApp(), startTestApp()]);
});
afterAll(async () => {
  await Promise.all([a.close(), b.close()]);
});

const processes: ChildProcess[] = [];
const dirs: string[] = [];
const queueSchemas: string[] = [];
afterAll(async () => {
  for (const c of processes) if (c.exitCode === null) c.kill('SIGKILL');
  const pool = new pg.Pool({ connectionString: databaseUrl('porewise_test'), max: 1 });
  for (const s of queueSchemas) await pool.query(`drop schema if exists ${s} cascade`).catch(() => {});
  await pool.end();
  for (const d of dirs) rmSync(d, { recursive: true, force: true });
});

/** `server/index.ts` in its own process, as production runs it (rate limits at scale 1, no namespace). */
async function startServerProcess(extraEnv: NodeJS.ProcessEnv = {}): Promise<{ url: string; child: ChildProcess }> {
  const port = await freePort();
  const dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-instance-'));
  const schema = `pgboss_inst_${randomBytes(5).toString('hex')}`;
  dirs.push(dir);
  queueSchemas.push(schema);
  const started = await spawnServer({ port, dir, startMs: 90_000, env: { QUEUE_SCHEMA: schema, RATE_LIMIT_SCALE: '1', ...extraEnv } });
  processes.push(started.child);
  return started;
}

/** The same browser, its requests now reaching the other instance. */
function onOther(client: Client, other: TestApp): Client {
  const moved = new Client(other.baseUrl);
  for (const [k, v] of client.cookies) moved.cookies.set(k, v);
  return moved;
}

/** A tank made with an Idempotency-Key through `first`, the same request replayed through `second`: the first answer, one tank. */
async function expectOneTankFromReplay(first: Client, second: Client) {
  const key = `instances-${Date.now()}-${Math.random().toString(36).slice(2)}`;
  await expectReplayedCreate(first, second, '/api/tanks', { name: 'Tank on two servers', capacityL: 4000, notes: '' }, key);
  expect((await second.get('/api/tanks')).body.total).toBe(1);
}

describe('two server instances on one database', () => {
  it('a session made on one works on the other, and signing out on one ends it on both', async () => {
    const { client } = await signUp(a.baseUrl, { name: 'Two Places' });
    const there = onOther(client, b);
    const me = await there.get('/api/me');
    expect(me.status).toBe(200);
    expect(me.body.user.name).toBe('Two Places');
    expect((await there.get('/api/tanks')).status).toBe(200);

    expect((await client.post('/api/auth/sign-out')).status).toBeLessThan(300);
    expect((await there.get('/api/me')).status).toBe(401);
  });

  it('an Idempotency-Key replayed on the other instance returns the first answer and makes no second record', async () => {
    const { client } = await signUp(a.baseUrl);
    await expectOneTankFromReplay(client, onOther(client, b));
  });

  it('a role changed on one instance governs the next request on the other', async () => {
    const { client: owner } = await signUp(a.baseUrl, { wineryName: 'Role Winery' });
    const member = await addMember(a, owner, 'cellar-master');
    const there = onOther(member.client, b);
    expect((await there.post('/api/tanks', { name: 'Made on B', capacityL: 1000, notes: '' })).status).toBe(201);

    expect((await owner.patch(`/api/team/${member.userId}`, { role: 'auditor' })).status).toBe(200);
    expect((await there.post('/api/tanks', { name: 'Refused on B', capacityL: 1000, notes: '' })).status).toBe(403);
    expect((await owner.delete(`/api/team/${member.userId}`)).status).toBe(204);
    expect((await there.get('/api/tanks')).status).toBe(403);
  });
});

describe('two server processes on one database', () => {
  it('the sign-in limit counts across both, a session and an Idempotency-Key made on one hold on the other, and a drained one stops cleanly', async () => {
    const [first, second] = await Promise.all([startServerProcess(), startServerProcess({ SHUTDOWN_DRAIN_MS: '1500' })]);
    const [one, two] = [first.url, second.url];
    // The account is made through an in-process test app on the same database.
    const { email } = await signUp(a.baseUrl);
    const statuses: number[] = [];
    for (let i = 0; i < 10; i += 1) {
      statuses.push((await new Client(i % 2 ? two : one).post('/api/auth/sign-in', { email, password: `wrong-${String(i)}` })).status);
    }
    // five failures on each process: neither alone reached its limit of ten
    expect(statuses).toEqual(Array(10).fill(401));
    for (const url of [one, two]) {
      const blocked = await new Client(url).post('/api/auth/sign-in', { email, password: TEST_PASSWORD });
      expect(blocked.status).toBe(429);
      expect(blocked.body.error.code).toBe('rate_limited');
      expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0);
    }
    // a session made on one process works on the other
    const other = await signUp(a.baseUrl);
    const signedIn = new Client(one);
    expect((await signedIn.post('/api/auth/sign-in', { email: other.email, password: TEST_PASSWORD })).status).toBe(200);
    const there = new Client(two);
    for (const [k, v] of signedIn.cookies) there.cookies.set(k, v);
    expect((await there.get('/api/me')).status).toBe(200);
    // an Idempotency-Key replayed on the other process returns the first answer, and no second tank
    await expectOneTankFromReplay(signedIn, there);

    // Graceful shutdown behind a load balancer: on SIGTERM, readiness turns 503 at once while
    // the instance still answers (the drain time); then it exits cleanly. The other serves on.
    expect((await fetch(`${two}/api/health/ready`)).status).toBe(200);
    const exit = new Promise<number | null>((r) => second.child.once('exit', (code) => r(code)));
    second.child.kill('SIGTERM');
    let ready = await fetch(`${two}/api/health/ready`);
    for (let i = 0; i < 20 && ready.status === 200; i += 1) {
      await new Promise((r) => setTimeout(r, 25));
      ready = await fetch(`${two}/api/health/ready`);
    }
    expect(ready.status).toBe(503);
    expect(await ready.json()).toEqual({ ready: false, draining: true, db: null });
    expect((await there.get('/api/me')).status).toBe(200);
    expect(await exit).toBe(0);
    expect((await signedIn.get('/api/me')).status).toBe(200);
    expect((await fetch(`${one}/api/health/ready`)).status).toBe(200);
  }, 180_000);
});
