// @vitest-environment node
// Finding 1 of the hardening probe: `pg_ctl -m fast restart` on the cluster killed the API server
// ("Unhandled 'error' event … terminating connection due to administrator command"). Here the test
// cluster is restarted in the middle of the file and the same server keeps answering; while the
// database cannot be reached at all, requests get 503 with Retry-After and /api/health says db:false.
// (This project runs after the rest of the suite, so the restart disturbs no other test.)
import { createServer, connect, type Server, type Socket } from 'node:net';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { clusterPort, restartCluster } from '../../scripts/lib/postgres';
import { createTank } from '../factories/cellar';
import { Client, signUp, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
beforeAll(async () => {
  app = await startTestApp();
  owner = (await signUp(app.baseUrl, { wineryName: 'Restart Test Cellars' })).client;
});
afterAll(async () => {
  await app?.close();
});

/** Polls until `path` answers 200; every answer meanwhile must be a 503 (never a 500 or a dropped connection). */
async function until200(client: Client, path: string, timeoutMs = 30_000) {
  const seen: number[] = [];
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await client.get(path);
    if (res.status === 200) return { res, seen };
    seen.push(res.status);
    expect(res.status).toBe(503);
    if (Date.now() > deadline) throw new Error(`${path} still ${res.status} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

describe('a PostgreSQL restart in the middle of the suite', () => {
  it('before: the server answers', async () => {
    await createTank(owner);
    expect((await owner.get('/api/tanks')).status).toBe(200);
    // Every pooled connection is open and idle, so the restart ends them all.
    await Promise.all(Array.from({ length: 5 }, () => owner.get('/api/tanks')));
  });

  it('pg_ctl -m fast restart: the server survives and recovers by itself', async () => {
    restartCluster();
    await new Promise((r) => setTimeout(r, 300)); // let the pool see its connections end
    await until200(owner, '/api/health');
    await until200(owner, '/api/tanks');
    const res = await owner.post('/api/tanks', { name: `After restart ${Date.now()}`, capacityL: 1000, notes: '' });
    expect(res.status).toBe(201);
  });

  it('after: the suite keeps going on the same server', async () => {
    expect((await new Client(app.baseUrl).get('/api/health')).body).toEqual({ ok: true, db: true });
    expect((await owner.get('/api/me')).status).toBe(200);
  });
});

/** A TCP proxy to the cluster that can be cut (connections dropped, port closed) and restored. */
async function startProxy(targetPort: number) {
  const sockets = new Set<Socket>();
  let server: Server | null = null;
  let port = 0;
  const listen = () =>
    new Promise<void>((resolve) => {
      server = createServer((inbound) => {
        const outbound = connect(targetPort, '127.0.0.1');
        for (const s of [inbound, outbound]) {
          sockets.add(s);
          s.on('error', () => {});
          s.on('close', () => sockets.delete(s));
        }
        inbound.pipe(outbound).pipe(inbound);
      });
      server.listen(port, '127.0.0.1', () => {
        port = (server!.address() as AddressInfo).port;
        resolve();
      });
    });
  await listen();
  return {
    get port() {
      return port;
    },
    async cut() {
      await new Promise<void>((r) => {
        server!.close(() => r());
        for (const s of sockets) s.destroy();
      });
    },
    restore: listen,
    close() {
      for (const s of sockets) s.destroy();
      server?.close();
    },
  };
}

describe('while the database cannot be reached', () => {
  it('answers 503 with Retry-After, /api/health says db:false, and recovers when it returns', async () => {
    const proxy = await startProxy(clusterPort());
    const viaProxy = await startTestApp({ databaseUrl: `postgres://postgres@127.0.0.1:${proxy.port}/porewise_test` });
    try {
      const client = new Client(viaProxy.baseUrl);
      client.cookies = new Map(owner.cookies);
      expect((await client.get('/api/tanks')).status).toBe(200);

      await proxy.cut();
      const health = await client.get('/api/health');
      expect(health.status).toBe(503);
      expect(health.body).toEqual({ ok: false, db: false });
      for (const res of [await client.get('/api/tanks'), await client.post('/api/tanks', { name: 'While down', capacityL: 1000, notes: '' })]) {
        expect(res.status).toBe(503);
        expect(res.body.error.code).toBe('unavailable');
        expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0);
        expect(res.text).not.toMatch(/ECONNREFUSED|terminat|at .*\.ts:\d+/);
      }

      await proxy.restore();
      await until200(client, '/api/health');
      expect((await client.get('/api/tanks')).status).toBe(200);
    } finally {
      await viaProxy.close();
      proxy.close();
    }
  });
});
