// @vitest-environment node
// Fault: the server process is killed with SIGKILL while a phone posts run readings with retries
// (each reading keeps its clientKey until the server has stored it), then started again. Every
// reading is stored exactly once: none lost, none doubled.
import { randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runReadingsTable } from '../../server/db/schema';
import { databaseUrl } from '../../scripts/lib/postgres';
import { startedRunOn } from '../factories/plans';
import { setupApiApp } from '../support/api-app';
import { Client } from '../support/test-app';
import { exited, freePort, spawnTs, waitUntil } from './support';

const app = setupApiApp({ wineryName: 'Fault Test Cellars', world: 'filled' });
let runId: string;
let dir: string;

beforeAll(async () => {
  runId = (await startedRunOn(app.owner, app.world)).id;
  dir = mkdtempSync(join(process.env.TMPDIR ?? '/tmp', 'porewise-fault-'));
});
afterAll(async () => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

describe('SIGKILL while readings are posted', () => {
  it('stores every reading once after the server is killed and started again', async () => {
    const port = await freePort();
    const url = `http://127.0.0.1:${port}`;
    const env = {
      ...process.env,
      NODE_ENV: 'test',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATABASE_URL: databaseUrl('porewise_test'),
      FAKE_SERVICES_DIR: dir,
      CLIENT_DIR: join(dir, 'no-client'),
      RATE_LIMIT_SCALE: '100',
    };
    const start = () => spawnTs('server/index.ts', [], env);
    const healthy = async () => fetch(`${url}/api/health`).then((r) => r.ok, () => false);
    let server = start();
    await waitUntil(healthy, 60_000, 'the server to start');

    const phone = new Client(url);
    phone.cookies = new Map(app.owner.cookies);
    const readings = Array.from({ length: 40 }, (_, i) => ({
      clientKey: randomUUID(),
      stageIndex: 0,
      volumeL: 100 * (i + 1),
      upstreamBar: 2.2 + i * 0.005,
      downstreamBar: 2.0,
    }));
    let attempts = 0;
    let killed = false;
    /** Like the phone: resend the same reading (same clientKey) until the server has stored it. */
    async function post(reading: (typeof readings)[number]) {
      for (;;) {
        attempts += 1;
        const res = await phone.post(`/api/runs/${runId}/readings`, reading).catch(() => null);
        if (res && (res.status === 200 || res.status === 201)) return;
        if (res && res.status < 500) throw new Error(`reading refused: ${res.status} ${res.text}`);
        await new Promise((r) => setTimeout(r, 100));
      }
    }

    for (const [i, reading] of readings.entries()) {
      if (i === 15) {
        // Kill while this reading is in flight, then bring the server back.
        const inFlight = post(reading);
        server.child.kill('SIGKILL');
        killed = true;
        expect(await exited(server.child, 10_000)).toBe('SIGKILL');
        server = start();
        await waitUntil(healthy, 60_000, 'the server to restart');
        await inFlight;
      } else {
        await post(reading);
      }
    }
    expect(killed).toBe(true);
    expect(attempts).toBeGreaterThan(readings.length); // at least one resend happened

    // One more resend of every reading: the server answers the stored one, nothing new.
    for (const reading of readings) await post(reading);

    const stored = await app.db.select().from(runReadingsTable).where(eq(runReadingsTable.runId, runId));
    expect(stored).toHaveLength(readings.length);
    expect(new Set(stored.map((r) => r.clientKey))).toEqual(new Set(readings.map((r) => r.clientKey)));

    server.child.kill('SIGTERM');
    await exited(server.child, 15_000);
  });
});
