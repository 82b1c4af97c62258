// @vitest-environment node
// The rate-limit counters in PostgreSQL (rate_limit_hits) through the express-rate-limit Store.
import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PostgresRateLimitStore } from '../../server/middleware/rate-limit-store';
import { createRateLimitRepository } from '../../server/modules/auth/rate-limit.repository';
import { startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app.close();
});

const store = (windowMs: number) => {
  const s = new PostgresRateLimitStore(createRateLimitRepository(app.db), `store-test-${randomBytes(4).toString('hex')}:`);
  s.init({ windowMs } as Parameters<PostgresRateLimitStore['init']>[0]);
  return s;
};

describe('rate-limit counters in PostgreSQL', () => {
  it('counts hits in a window, decrements, resets, and starts a new window after the old one ends', async () => {
    const s = store(60_000);
    const first = await s.increment('203.0.113.7');
    expect(first.totalHits).toBe(1);
    expect(first.resetTime!.getTime()).toBeGreaterThan(Date.now() + 50_000);
    expect((await s.increment('203.0.113.7')).totalHits).toBe(2);
    expect((await s.increment('203.0.113.8')).totalHits).toBe(1);
    await s.decrement('203.0.113.7');
    expect((await s.get('203.0.113.7'))?.totalHits).toBe(1);
    await s.resetKey('203.0.113.7');
    expect(await s.get('203.0.113.7')).toBeUndefined();

    const short = store(300);
    expect((await short.increment('k')).totalHits).toBe(1);
    expect((await short.increment('k')).totalHits).toBe(2);
    await new Promise((r) => setTimeout(r, 500));
    expect(await short.get('k')).toBeUndefined();
    expect((await short.increment('k')).totalHits).toBe(1);
  });

  it('two stores with the same prefix share a count (two instances), another prefix does not', async () => {
    const prefix = `shared-${randomBytes(4).toString('hex')}:`;
    const [a, b] = [0, 1].map(() => {
      const s = new PostgresRateLimitStore(createRateLimitRepository(app.db), prefix);
      s.init({ windowMs: 60_000 } as Parameters<PostgresRateLimitStore['init']>[0]);
      return s;
    });
    const hits = await Promise.all(Array.from({ length: 20 }, (_, i) => (i % 2 ? a : b).increment('198.51.100.1')));
    expect(hits.map((h) => h.totalHits).sort((x, y) => x - y)).toEqual(Array.from({ length: 20 }, (_, i) => i + 1));
    expect((await store(60_000).get('198.51.100.1'))).toBeUndefined();
  });
});
