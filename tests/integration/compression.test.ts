// @vitest-environment node
// Text answers are compressed (brotli or gzip, as the client accepts) and hashed client files
// are cached for a year as immutable, while index.html is always revalidated.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { request } from 'node:http';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signUp, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;
let dir: string;
beforeAll(async () => {
  dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-client-'));
  mkdirSync(join(dir, 'assets'));
  writeFileSync(join(dir, 'index.html'), `<!doctype html><html><body>${'<p>Porewise</p>'.repeat(200)}</body></html>`);
  writeFileSync(join(dir, 'assets', 'today-Ab12Cd34.js'), `export const words = ${JSON.stringify('Porewise '.repeat(500))};`);
  app = await startTestApp({ config: { clientDir: dir } });
});
afterAll(async () => {
  await app.close();
  rmSync(dir, { recursive: true, force: true });
});

/** A raw GET (no automatic decompression), returning the status and headers. */
function get(path: string, headers: Record<string, string>) {
  return new Promise<{ status: number; headers: import('node:http').IncomingHttpHeaders }>((resolve, reject) => {
    const req = request(app.baseUrl + path, { headers }, (res) => {
      res.resume();
      res.on('end', () => resolve({ status: res.statusCode ?? 0, headers: res.headers }));
    });
    req.on('error', reject);
    req.end();
  });
}

describe('compression and caching', () => {
  it('compresses API answers with brotli or gzip as accepted, and not when not accepted', async () => {
    const { client } = await signUp(app.baseUrl);
    const cookie = [...client.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
    // Enough tanks for an answer above the 1 KB threshold.
    for (let i = 0; i < 12; i++) await client.post('/api/tanks', { name: `Compressed tank ${String(i)}`, capacityL: 1000 + i, notes: 'A note long enough to matter.' });
    const br = await get('/api/tanks', { cookie, 'accept-encoding': 'br, gzip' });
    expect(br.status).toBe(200);
    expect(br.headers['content-encoding']).toBe('br');
    const gz = await get('/api/tanks', { cookie, 'accept-encoding': 'gzip' });
    expect(gz.headers['content-encoding']).toBe('gzip');
    const plain = await get('/api/tanks', { cookie });
    expect(plain.headers['content-encoding']).toBeUndefined();
    expect(br.headers['cache-control']).toBe('no-store');
  });

  it('serves hashed client files compressed and immutable for a year; index.html revalidated', async () => {
    const asset = await get('/assets/today-Ab12Cd34.js', { 'accept-encoding': 'gzip' });
    expect(asset.status).toBe(200);
    expect(asset.headers['content-encoding']).toBe('gzip');
    expect(asset.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    const page = await get('/today', { 'accept-encoding': 'gzip' });
    expect(page.status).toBe(200);
    expect(page.headers['content-encoding']).toBe('gzip');
    expect(page.headers['cache-control']).toBe('no-cache');
  });
});
