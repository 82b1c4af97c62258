// @vitest-environment node
// Porewise as several identical server instances on one database (behind any load balancer):
// nothing that must be shared lives in a process's memory. Two apps, each with its own
// connection pool, on the one test database.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addMember, Client, signUp, startTestApp, type TestApp } from '../support/test-app';

let a: TestApp;
let b: TestApp;
beforeAll(async () => {
  [a, b] = await Promise.all([startTestApp(), startTestApp()]);
});
afterAll(async () => {
  await Promise.all([a.close(), b.close()]);
});

/** The same browser, its requests now reaching the other instance. */
function onOther(client: Client, other: TestApp): Client {
  const moved = new Client(other.baseUrl);
  for (const [k, v] of client.cookies) moved.cookies.set(k, v);
  return moved;
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
    const there = onOther(client, b);
    const key = `instances-${Date.now()}-${Math.random().toString(36).slice(2)}`;
    const body = { name: 'Tank on two servers', capacityL: 4000, notes: '' };
    const first = await client.request('POST', '/api/tanks', body, { 'idempotency-key': key });
    const replay = await there.request('POST', '/api/tanks', body, { 'idempotency-key': key });
    expect(first.status).toBe(201);
    expect(replay.status).toBe(201);
    expect(replay.headers.get('idempotent-replay')).toBe('true');
    expect(replay.body.id).toBe(first.body.id);
    expect((await there.get('/api/tanks')).body.total).toBe(1);
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
