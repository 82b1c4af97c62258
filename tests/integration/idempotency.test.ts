// @vitest-environment node
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signUp, startTestApp, type TestApp } from '../support/test-app';
import { expectReplayedCreate } from '../support/idempotency';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app.close();
});

const key = () => `test-${Date.now()}-${Math.random().toString(36).slice(2)}`;

describe('Idempotency-Key', () => {
  it('a retry gets the first answer and makes no second record', async () => {
    const { client } = await signUp(app.baseUrl);
    const k = key();
    await expectReplayedCreate(client, client, '/api/tanks', { name: 'Retry tank', capacityL: 5000, notes: '' }, k);
    expect((await client.get('/api/tanks')).body.total).toBe(1);
  });

  it('two copies sent at once make one record', async () => {
    const { client } = await signUp(app.baseUrl);
    const k = key();
    const body = { name: 'Race tank', capacityL: 5000, notes: '' };
    const results = await Promise.all([0, 1, 2].map(() => client.request('POST', '/api/tanks', body, { 'idempotency-key': k })));
    expect(results.filter((r) => r.status === 201).length).toBeGreaterThanOrEqual(1);
    for (const r of results) expect([201, 409]).toContain(r.status);
    expect((await client.get('/api/tanks')).body.total).toBe(1);
  });

  it('the same key with another body is refused, not answered with the first record', async () => {
    const { client } = await signUp(app.baseUrl);
    const k = key();
    await client.request('POST', '/api/tanks', { name: 'Tank A', capacityL: 5000, notes: '' }, { 'idempotency-key': k });
    const other = await client.request('POST', '/api/tanks', { name: 'Tank B', capacityL: 5000, notes: '' }, { 'idempotency-key': k });
    expect(other.status).toBe(422);
    expect(other.body.error.code).toBe('idempotency_key_reused');
  });

  it('a refused request frees its key for a corrected retry', async () => {
    const { client } = await signUp(app.baseUrl);
    const k = key();
    const bad = await client.request('POST', '/api/tanks', { name: '', capacityL: -1, notes: '' }, { 'idempotency-key': k });
    expect(bad.status).toBe(400);
    await new Promise((r) => setTimeout(r, 50));
    const sameAgain = await client.request('POST', '/api/tanks', { name: '', capacityL: -1, notes: '' }, { 'idempotency-key': k });
    expect(sameAgain.status).toBe(400);
  });

  it('a key used in one winery does not replay in another', async () => {
    const { client, me } = await signUp(app.baseUrl, { wineryName: 'First' });
    const second = await signUp(app.baseUrl, { wineryName: 'Second' });
    // The first person joins the second winery, then reuses a key there.
    const inv = await second.client.post('/api/team/invitations', { email: me.user.email, role: 'cellar-master' });
    expect(inv.status).toBe(201);
    const mail = await app.mail.waitFor(me.user.email, { subject: /invited you/ });
    const token = new URL(mail.text.match(/https?:\/\/\S*\/invitation\S*/)![0]).searchParams.get('token')!;
    expect((await client.post('/api/invitations/accept', { token })).status).toBe(200);
    const k = key();
    await client.put('/api/me/active-winery', { wineryId: me.activeWineryId });
    const inFirst = await client.request('POST', '/api/tanks', { name: 'Shared name', capacityL: 1000, notes: '' }, { 'idempotency-key': k });
    expect(inFirst.status).toBe(201);
    await client.put('/api/me/active-winery', { wineryId: second.me.activeWineryId });
    const inSecond = await client.request('POST', '/api/tanks', { name: 'Shared name', capacityL: 1000, notes: '' }, { 'idempotency-key': k });
    expect(inSecond.status).toBe(422);
    expect((await second.client.get('/api/tanks')).body.total).toBe(0);
  });
});
