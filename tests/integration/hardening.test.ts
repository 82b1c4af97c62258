// @vitest-environment node
// The findings of the hardening probe, each reproduced as it was reported, and now answered
// properly. (The database restart, the SIGKILL fault and the clean stop are in tests/faults/,
// which run after the rest of the suite; the route fuzzing is in fuzz.test.ts.)
import { randomUUID } from 'node:crypto';
import { existsSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDatabase } from '../../server/db/client';
import { withoutSchemaChanges } from '../support/schema-lock';
import { backupDatabase, clusterSetting, databaseUrl, restoreDatabase } from '../../scripts/lib/postgres';
import { JSON_MAX_DEPTH, JSON_MAX_ELEMENTS } from '../../shared/schemas/text';
import { createTank } from '../factories/cellar';
import { addMember, Client, linkFrom, signUp, startTestApp, TEST_OUTBOX_KEY, TEST_PASSWORD, uniqueEmail, type TestApp } from '../support/test-app';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp({ config: { rateLimitScale: 1 } });
});
afterAll(async () => {
  await app?.close();
});

const INTERNAL = /Maximum call stack|RangeError|TypeError|at .*\.(ts|js):\d+|violates|syntax|relation "|column "|duplicate key|invalid input|unsupported Unicode/i;

describe('finding 2: deeply nested JSON cannot stall the server', () => {
  it("'['*8000 + ']'*8000 to /api/invitations/preview, signed out → 400 too_complex, no internal message", async () => {
    const body = '['.repeat(8000) + ']'.repeat(8000);
    const res = await new Client(app.baseUrl).request('POST', '/api/invitations/preview', body, { 'content-type': 'application/json' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('too_complex');
    expect(res.text).not.toMatch(INTERNAL);
    expect((await new Client(app.baseUrl).get('/api/health')).status).toBe(200);
  });

  it(`refuses more than ${JSON_MAX_DEPTH} levels of objects, and more than ${JSON_MAX_ELEMENTS} items`, async () => {
    const deep = '{"a":'.repeat(JSON_MAX_DEPTH + 1) + '1' + '}'.repeat(JSON_MAX_DEPTH + 1);
    const wide = `[${'0,'.repeat(JSON_MAX_ELEMENTS + 1)}0]`;
    for (const body of [deep, wide]) {
      const res = await new Client(app.baseUrl).request('POST', '/api/auth/sign-in', body, { 'content-type': 'application/json' });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('too_complex');
    }
    // Brackets inside strings do not count.
    const inString = JSON.stringify({ email: '['.repeat(500) + '@x.test', password: 'x' });
    const ok = await new Client(app.baseUrl).request('POST', '/api/auth/sign-in', inString, { 'content-type': 'application/json' });
    expect(ok.status).toBe(400);
    expect(ok.body.error.code).toBe('invalid_input');
  });

  it('a body at the depth limit still reaches validation (400 with fields, not a stack overflow)', async () => {
    const atLimit = '['.repeat(JSON_MAX_DEPTH) + ']'.repeat(JSON_MAX_DEPTH);
    const res = await new Client(app.baseUrl).request('POST', '/api/invitations/preview', atLimit, { 'content-type': 'application/json' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
  });
});

describe('finding 3: the development outbox is the owner’s', () => {
  it('request a reset for someone, read the outbox signed out → 404: the link cannot be read', async () => {
    const { email } = await signUp(app.baseUrl);
    const stranger = new Client(app.baseUrl);
    expect((await stranger.post('/api/auth/password-reset/request', { email })).status).toBe(202);
    await app.mail.waitFor(email, { subject: /Reset/ });
    const res = await stranger.get('/api/dev/outbox');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
    expect(res.text).not.toMatch(/reset-password/);
    expect((await stranger.get('/api/dev/outbox?key=wrong-key-of-some-length')).status).toBe(404);
  });

  it('opens for a signed-in owner and with the printed key; not for other roles', async () => {
    const { client: owner } = await signUp(app.baseUrl);
    expect((await owner.get('/api/dev/outbox')).status).toBe(200);
    const { client: manager } = await addMember(app, owner, 'cellar-master');
    expect((await manager.get('/api/dev/outbox')).status).toBe(404);
    const withKey = await new Client(app.baseUrl).get(`/api/dev/outbox?key=${TEST_OUTBOX_KEY}`);
    expect(withKey.status).toBe(200);
    expect(Array.isArray(withKey.body.items)).toBe(true);
    const viaHeader = await new Client(app.baseUrl).request('GET', '/api/dev/outbox', undefined, { 'x-outbox-key': TEST_OUTBOX_KEY });
    expect(viaHeader.status).toBe(200);
  });
});

describe('finding 4: no 500 for malformed ids, cookies, text or e-mail', () => {
  it('a malformed percent-escape in an :id is a 400, signed out and signed in', async () => {
    const { client } = await signUp(app.baseUrl);
    for (const path of ['/api/tanks/%ff', '/api/lots/%E0%A4%A', '/api/cartridges/%', '/api/plans/%ff/lots/%zz']) {
      for (const who of [new Client(app.baseUrl), client]) {
        const res = await who.get(path);
        expect([400, 404]).toContain(res.status);
        expect(res.text).not.toMatch(INTERNAL);
      }
    }
    expect((await client.get('/api/tanks/%ff')).body.error.code).toBe('bad_path');
  });

  it.each([['%00'], ['%ff'], ['not-a-session-id-at-all!'], ['abcdefghijklmnopqrstuvwxyz234567abcdefgh']])(
    'session cookie porewise_session=%s → signed out and cleared, /api/health still 200',
    async (value) => {
      const client = new Client(app.baseUrl);
      client.cookies.set('porewise_session', value);
      expect((await client.get('/api/health')).status).toBe(200);
      client.cookies.set('porewise_session', value);
      expect((await client.get('/api/app-info')).status).toBe(200);
      client.cookies.set('porewise_session', value);
      const me = await client.get('/api/me');
      expect(me.status).toBe(401);
      expect(me.body.error.code).toBe('unauthenticated');
      expect(me.headers.getSetCookie().join('\n')).toMatch(/porewise_session=;.*Max-Age=0/i);
    },
  );

  it('a lone surrogate into retire reason, cycle agent, stage name and threshold source → 400 naming the field', async () => {
    const { client } = await signUp(app.baseUrl);
    const id = randomUUID();
    const cases: [string, string, unknown, string][] = [
      ['POST', `/api/cartridges/${id}/retire`, { reason: 'worn \ud800' }, 'reason'],
      ['POST', `/api/cartridges/${id}/cycles`, { kind: 'chemical', agent: '\udc00caustic' }, 'agent'],
      ['POST', `/api/plans/${id}/lots/${id}/trains`, { name: 'A', stages: [{ name: 'pre\ud83d' }] }, 'stages.0.name'],
      ['PUT', '/api/settings/winery', { readinessThresholds: { source: '\ud800' } }, 'readinessThresholds.source'],
      ['PUT', '/api/me', { name: 'Ada\ud800' }, 'name'],
    ];
    for (const [method, path, body, field] of cases) {
      const res = await client.request(method, path, body);
      expect(res.status, `${method} ${path}`).toBe(400);
      expect(res.body.error.fields[field], `${method} ${path}`).toMatch(/surrogate/);
    }
  });

  it('NUL in a query string or in a nested key is a 400 naming the field', async () => {
    const { client } = await signUp(app.baseUrl);
    const q = await client.get('/api/tanks?search=a%00b');
    expect(q.status).toBe(400);
    expect(q.body.error.fields.search).toMatch(/NUL/);
    const key = await client.put('/api/me', { ['na\u0000me']: 'x' });
    expect(key.status).toBe(400);
  });

  it('two reading clientKeys that differ only in a lone surrogate are both refused, never collapsed into one', async () => {
    const { client } = await signUp(app.baseUrl);
    const runId = randomUUID();
    for (const clientKey of ['key-\ud800', 'key-\udbff']) {
      const res = await client.post(`/api/runs/${runId}/readings`, { clientKey, stageIndex: 0, volumeL: 1, upstreamBar: 2, downstreamBar: 1.9 });
      expect(res.status).toBe(400);
      expect(res.body.error.fields.clientKey).toMatch(/surrogate/);
    }
  });

  it('{"email":{"toString":1}} on sign-in and reset request → 400', async () => {
    for (const path of ['/api/auth/sign-in', '/api/auth/password-reset/request']) {
      const res = await new Client(app.baseUrl).post(path, { email: { toString: 1 }, password: 'x' });
      expect(res.status, path).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
    }
  });
});

describe('finding 5: durable storage', () => {
  it('the cluster runs with fsync and full_page_writes on', () => {
    expect(clusterSetting('fsync')).toBe('on');
    expect(clusterSetting('full_page_writes')).toBe('on');
  });

  it('db:backup writes a custom-format dump; db:restore brings it back into a fresh database', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Backup Test Cellars' });
    const tank = await createTank(client, { name: `Backup tank ${randomUUID().slice(0, 8)}` });
    // Test apps of other files (the browser tests, in `npm test`) may be starting meanwhile.
    const file = await withoutSchemaChanges(app.pool, () => backupDatabase('porewise_test', join(process.env.TMPDIR ?? '/tmp', `porewise-backup-${process.pid}.dump`)));
    const target = `porewise_restore_${process.pid}`;
    try {
      expect(existsSync(file)).toBe(true);
      const { keptAs } = restoreDatabase(file, target);
      expect(keptAs).toBeNull();
      const restored = createDatabase(databaseUrl(target), { max: 1 });
      try {
        const rows = await restored.db.execute(sql`select name from tanks where id = ${tank.id}`);
        expect(rows.rows).toEqual([{ name: tank.name }]);
        const users = await restored.db.execute(sql`select count(*)::int as n from users`);
        expect((users.rows[0] as { n: number }).n).toBeGreaterThan(0);
      } finally {
        await restored.pool.end();
      }
      // Restoring over an existing database keeps the old one aside instead of destroying it.
      const again = restoreDatabase(file, target);
      expect(again.keptAs).toMatch(new RegExp(`^${target}_before_restore_`));
      await app.db.execute(sql.raw(`DROP DATABASE IF EXISTS ${again.keptAs} WITH (FORCE)`));
    } finally {
      await app.db.execute(sql.raw(`DROP DATABASE IF EXISTS ${target} WITH (FORCE)`));
      rmSync(file, { force: true });
    }
  });
});

describe('finding 6: nobody can lock a person out of sign-in', () => {
  let proxied: TestApp;
  beforeAll(async () => {
    proxied = await startTestApp({ config: { rateLimitScale: 1, trustProxy: 'loopback' } });
  });
  afterAll(async () => {
    await proxied?.close();
  });
  const from = (ip: string) => ({ 'x-forwarded-for': ip });

  it('ten wrong passwords from one machine: that machine gets 429, the right password from another still signs in', async () => {
    const { email } = await signUp(proxied.baseUrl);
    for (let i = 0; i < 10; i += 1) {
      const res = await new Client(proxied.baseUrl).request('POST', '/api/auth/sign-in', { email, password: `wrong-${i}` }, from('203.0.113.9'));
      expect(res.status).toBe(401);
    }
    const attacker = await new Client(proxied.baseUrl).request('POST', '/api/auth/sign-in', { email, password: TEST_PASSWORD }, from('203.0.113.9'));
    expect(attacker.status).toBe(429);
    const owner = new Client(proxied.baseUrl);
    const res = await owner.request('POST', '/api/auth/sign-in', { email, password: TEST_PASSWORD }, from('198.51.100.20'));
    expect(res.status).toBe(200);
    expect((await owner.get('/api/me')).status).toBe(200);
  });
});

describe('finding 7 (sign-up) is in auth.test.ts; finding 8: headers', () => {
  it("CSP: style-src and font-src 'self' only, no https: wildcard, no unsafe-inline; a Permissions-Policy", async () => {
    const res = await new Client(app.baseUrl).get('/api/health');
    const csp = res.headers.get('content-security-policy')!;
    const directive = (name: string) => csp.split(';').map((d) => d.trim()).find((d) => d.startsWith(`${name} `));
    expect(directive('style-src')).toBe("style-src 'self'");
    expect(directive('font-src')).toBe("font-src 'self'");
    expect(csp).not.toMatch(/https:(?!\/)/);
    expect(csp).not.toMatch(/unsafe-inline/);
    expect(res.headers.get('permissions-policy')).toMatch(/camera=\(\)/);
    expect(res.headers.get('permissions-policy')).toMatch(/geolocation=\(\)/);
  });

  it('HSTS only when served over HTTPS', async () => {
    expect((await new Client(app.baseUrl).get('/api/health')).headers.get('strict-transport-security')).toBeNull();
    const behindTls = await startTestApp({ config: { trustProxy: 'loopback', secureCookies: true } });
    try {
      const res = await new Client(behindTls.baseUrl).request('GET', '/api/health', undefined, { 'x-forwarded-proto': 'https' });
      expect(res.headers.get('strict-transport-security')).toMatch(/max-age=\d+/);
      const plain = await new Client(behindTls.baseUrl).get('/api/health');
      expect(plain.headers.get('strict-transport-security')).toBeNull();
    } finally {
      await behindTls.close();
    }
  });
});

describe('sign-up mail still reaches the person (the link is the only way in)', () => {
  it('the confirm link comes from the outbox as well', async () => {
    const email = uniqueEmail();
    await new Client(app.baseUrl).post('/api/auth/sign-up', { name: 'Outbox Reader', email, password: TEST_PASSWORD, wineryName: 'W' });
    await app.mail.waitFor(email, { subject: /Confirm/, timeoutMs: 20_000 });
    const res = await new Client(app.baseUrl).get(`/api/dev/outbox?key=${TEST_OUTBOX_KEY}`);
    const mine = (res.body.items as { to: string[]; text: string }[]).find((m) => m.to.includes(email))!;
    expect(linkFrom(mine.text, '/confirm-sign-up')).toMatch(/token=/);
  });
});
