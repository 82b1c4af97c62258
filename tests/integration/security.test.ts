// @vitest-environment node
import { request as httpRequest } from 'node:http';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signUp, startTestApp, TEST_PASSWORD, uniqueEmail, type TestApp } from '../support/test-app';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp({ config: { rateLimitScale: 1 } });
});
afterAll(async () => {
  await app.close();
});

describe('input handling', () => {
  it('answers malformed JSON with 400, not 500', async () => {
    const res = await new Client(app.baseUrl).request('POST', '/api/auth/sign-in', '{"email": ', { 'content-type': 'application/json' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('malformed');
  });

  it('answers a body over 1 MB with 413', async () => {
    const big = JSON.stringify({ email: 'a@b.test', password: 'x'.repeat(1_100_000) });
    const res = await new Client(app.baseUrl).request('POST', '/api/auth/sign-in', big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('too_large');
  });

  it.each([
    ['missing fields', {}],
    ['wrong types', { name: 5, email: ['x'], password: null, wineryName: {} }],
    ['bad e-mail and short password', { name: 'A', email: 'not-an-email', password: 'short', wineryName: 'W' }],
  ])('sign-up with %s → 400 with field messages', async (_label, body) => {
    const res = await new Client(app.baseUrl).post('/api/auth/sign-up', body);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(Object.keys(res.body.error.fields).length).toBeGreaterThan(0);
  });

  it('never answers with a stack trace', async () => {
    const res = await new Client(app.baseUrl).request('POST', '/api/auth/sign-up', '[[[', { 'content-type': 'application/json' });
    expect(res.text).not.toMatch(/at .*\.ts:\d+/);
  });

  it('answers unknown API paths with a JSON 404', async () => {
    const res = await new Client(app.baseUrl).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('origin check', () => {
  it('refuses a state-changing request from another origin', async () => {
    const res = await new Client(app.baseUrl, 'https://evil.example').post('/api/auth/sign-in', { email: 'a@b.test', password: 'x' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
  });

  it('refuses a state-changing request without an Origin header', async () => {
    const { client } = await signUp(app.baseUrl);
    const noOrigin = new Client(app.baseUrl, null);
    noOrigin.cookies = client.cookies;
    const res = await noOrigin.put('/api/me', { units: 'us' });
    expect(res.status).toBe(403);
  });

  it('lets reads through without an Origin header', async () => {
    expect((await new Client(app.baseUrl, null).get('/api/health')).status).toBe(200);
  });
});

describe('host check (DNS rebinding)', () => {
  /** node:http lets a test set the Host header, which fetch does not. */
  function rawRequest(method: string, path: string, headers: Record<string, string>, body?: string) {
    const url = new URL(app.baseUrl);
    return new Promise<{ status: number; body: string }>((resolve, reject) => {
      const req = httpRequest({ host: url.hostname, port: url.port, method, path, headers }, (res) => {
        let data = '';
        res.on('data', (c) => (data += c));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, body: data }));
      });
      req.on('error', reject);
      req.end(body);
    });
  }

  it('refuses an API request addressed to another host name, even with a matching Origin', async () => {
    const res = await rawRequest(
      'POST',
      '/api/auth/sign-up',
      { host: `rebind.example:${new URL(app.baseUrl).port}`, origin: `http://rebind.example:${new URL(app.baseUrl).port}`, 'content-type': 'application/json' },
      JSON.stringify({ name: 'X', email: uniqueEmail(), password: TEST_PASSWORD, wineryName: 'W' }),
    );
    expect(res.status).toBe(421);
    expect(JSON.parse(res.body).error.code).toBe('bad_host');
  });

  it('refuses reads for another host name too (the mail outbox included)', async () => {
    const res = await rawRequest('GET', '/api/dev/outbox', { host: 'rebind.example' });
    expect(res.status).toBe(421);
  });
});

describe('headers', () => {
  it('sends a content security policy and nosniff', async () => {
    const res = await new Client(app.baseUrl).get('/api/health');
    expect(res.headers.get('content-security-policy')).toMatch(/default-src 'self'/);
    expect(res.headers.get('content-security-policy')).toMatch(/script-src 'self'/);
    expect(res.headers.get('x-content-type-options')).toBe('nosniff');
  });
});

describe('rate limits', () => {
  it('allows 10 failed sign-ins per account in 15 minutes, then 429 with Retry-After', async () => {
    const { email } = await signUp(app.baseUrl);
    const statuses: number[] = [];
    for (let i = 0; i < 10; i += 1) {
      statuses.push((await new Client(app.baseUrl).post('/api/auth/sign-in', { email, password: `wrong-${i}` })).status);
    }
    expect(statuses).toEqual(Array(10).fill(401));
    const blocked = await new Client(app.baseUrl).post('/api/auth/sign-in', { email, password: TEST_PASSWORD });
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers.get('retry-after'))).toBeGreaterThan(0);
    expect(blocked.body.error.code).toBe('rate_limited');
  });

  it('limits password reset requests per account', async () => {
    const email = uniqueEmail('reset');
    const statuses: number[] = [];
    for (let i = 0; i < 6; i += 1) statuses.push((await new Client(app.baseUrl).post('/api/auth/password-reset/request', { email })).status);
    expect(statuses.slice(0, 5)).toEqual(Array(5).fill(202));
    expect(statuses[5]).toBe(429);
  });
});

describe('input that PostgreSQL would refuse', () => {
  it('a NUL character in text is a 400 with the field named', async () => {
    const { client } = await signUp(app.baseUrl);
    const res = await client.put('/api/me', { name: 'Ada\u0000' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.name).toMatch(/NUL/);
  });
});
