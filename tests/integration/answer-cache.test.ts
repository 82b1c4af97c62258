// @vitest-environment node
// Read answers kept in the server process (server/middleware/answer-cache.ts), keyed on the
// winery's data version that every committed write raises (migrations 0024–0025). These tests
// read, change the data in every way it can change — through the app, through SQL on another
// connection as a script or psql would, in a transaction that is rolled back, by folding — and
// read again: a kept answer is reused only while nothing it was worked out from has changed.
import { randomUUID } from 'node:crypto';
import pg from 'pg';
import { beforeEach, describe, expect, it } from 'vitest';
import { databaseUrl } from '../../scripts/lib/postgres';
import { foldWineryChanges, wineryDataVersion } from '../../server/db/winery-changes';
import { CLOCK_STEP_MS } from '../../server/middleware/answer-cache';
import { startedRunOn } from '../factories/plans';
import { setupApiApp } from '../support/api-app';

const app = setupApiApp({ wineryName: 'Kept Answers Test Winery', otherWineryName: 'Kept Answers Other Winery', members: ['auditor'], world: 'filled' });

const reused = () => app.answers.stats().reused;
const clockStep = () => Math.floor(Date.now() / CLOCK_STEP_MS);

/**
 * Reads `path` twice as the owner and answers both with whether the second was the kept answer.
 * The pair is read again when something was written in between (the alert check that follows
 * the set-up's writes) or the clock stepped: the answer could then rightly differ.
 */
async function readTwiceQuietly(path: string) {
  for (let attempt = 0; ; attempt++) {
    await app.alerts.idle(); // an alert evaluation after an earlier write would change the version
    const version = await wineryDataVersion(app.db, app.wineryId);
    const step = clockStep();
    const before = reused();
    const first = await app.owner.get(path);
    const second = await app.owner.get(path);
    const quiet = (await wineryDataVersion(app.db, app.wineryId)) === version && clockStep() === step;
    if (quiet || attempt === 5) return { first, second, reusedOnce: reused() === before + 1 };
  }
}

async function withClient<T>(work: (c: pg.Client) => Promise<T>): Promise<T> {
  const c = new pg.Client({ connectionString: databaseUrl('porewise_test') });
  await c.connect();
  try {
    return await work(c);
  } finally {
    await c.end();
  }
}

describe('kept read answers', () => {
  // An alert evaluation after an earlier test's write (up to EVALUATE_GAP_MS later) would move the version mid-test.
  beforeEach(() => app.alerts.idle());
  it('a second read with nothing changed is the kept answer, the same bytes and ETag', async () => {
    const { first, second, reusedOnce } = await readTwiceQuietly('/api/today');
    expect(first.status).toBe(200);
    expect(second.status).toBe(200);
    expect(reusedOnce).toBe(true);
    expect(second.text).toBe(first.text);
    expect(second.headers.get('content-type')).toMatch(/^application\/json/);
    expect(second.headers.get('etag')).toMatch(/^W\/"/);
    expect(second.headers.get('etag')).toBe(first.headers.get('etag'));
  });

  it('a reading logged through the app shows on the next read of the run, the runs list and Today', async () => {
    const runId = (await startedRunOn(app.owner, app.world)).id;
    const run0 = await app.owner.get(`/api/runs/${runId}`);
    const list0 = await app.owner.get('/api/runs');
    await app.owner.get(`/api/runs/${runId}`); // kept
    const versionBefore = await wineryDataVersion(app.db, app.wineryId);
    const logged = await app.owner.post(`/api/runs/${runId}/readings`, { clientKey: randomUUID(), stageIndex: 0, volumeL: 1500, upstreamBar: 2.3, downstreamBar: 2 });
    expect(logged.status).toBe(201);
    expect(BigInt(await wineryDataVersion(app.db, app.wineryId))).toBeGreaterThan(BigInt(versionBefore));
    const run1 = await app.owner.get(`/api/runs/${runId}`);
    expect(run1.text).not.toBe(run0.text);
    expect(JSON.stringify(run1.body)).toContain('1500');
    const list1 = await app.owner.get('/api/runs');
    expect(list1.text).not.toBe(list0.text);
  });

  it('a change written outside the app (SQL on another connection, as a script would) shows on the next read', async () => {
    const list = await app.owner.get('/api/cartridges?page=1&pageSize=50');
    expect(list.status).toBe(200);
    const item = list.body.items[0] as { id: string; serial: string };
    await app.owner.get('/api/cartridges?page=1&pageSize=50'); // kept
    const serial = `SQL-${randomUUID().slice(0, 8)}`;
    await withClient((c) => c.query('update cartridges set serial = $1 where id = $2', [serial, item.id]));
    const after = await app.owner.get(`/api/cartridges/${item.id}`);
    expect(after.body.serial).toBe(serial);
    const listAfter = await app.owner.get('/api/cartridges?page=1&pageSize=50');
    expect(JSON.stringify(listAfter.body)).toContain(serial);
  });

  it('a rolled-back write leaves the version as it was, and the kept answer stands', async () => {
    const version = await wineryDataVersion(app.db, app.wineryId);
    await withClient(async (c) => {
      await c.query('begin');
      await c.query(`update plans set name = 'never kept' where winery_id = $1`, [app.wineryId]);
      await c.query('rollback');
    });
    expect(await wineryDataVersion(app.db, app.wineryId)).toBe(version);
    const { second, reusedOnce } = await readTwiceQuietly('/api/plans');
    expect(reusedOnce).toBe(true);
    expect(second.text).not.toContain('never kept');
  });

  it('folding moves the rows into the count: the version reads the same before and after', async () => {
    await withClient((c) => c.query(`update plans set notes = coalesce(notes, '') where winery_id = $1`, [app.wineryId]));
    const version = await wineryDataVersion(app.db, app.wineryId);
    await foldWineryChanges(app.db);
    expect(await wineryDataVersion(app.db, app.wineryId)).toBe(version);
    await foldWineryChanges(app.db); // nothing left: still the same
    expect(await wineryDataVersion(app.db, app.wineryId)).toBe(version);
    await withClient((c) => c.query(`update plans set notes = coalesce(notes, '') where winery_id = $1`, [app.wineryId]));
    expect(BigInt(await wineryDataVersion(app.db, app.wineryId))).toBe(BigInt(version) + 1n);
  });

  it('a change in one winery leaves the other winery’s version alone', async () => {
    const other = await wineryDataVersion(app.db, app.otherWineryId);
    await withClient((c) => c.query(`update plans set notes = coalesce(notes, '') where winery_id = $1`, [app.wineryId]));
    expect(await wineryDataVersion(app.db, app.otherWineryId)).toBe(other);
  });

  it('is kept per person and role: the auditor never gets the owner’s kept answer; another winery gets 404', async () => {
    const runId = (await startedRunOn(app.owner, app.world)).id;
    await app.owner.get(`/api/runs/${runId}`);
    await app.owner.get(`/api/runs/${runId}`);
    const before = app.answers.stats();
    const seen = await app.members.auditor.get(`/api/runs/${runId}`);
    expect(seen.status).toBe(200);
    expect(app.answers.stats().reused).toBe(before.reused);
    expect(app.answers.stats().stored).toBe(before.stored + 1);
    expect((await app.other.get(`/api/runs/${runId}`)).status).toBe(404);
    expect((await app.other.get(`/api/runs/${runId}`)).status).toBe(404);
  });

  it('a renamed person raises the version of every winery they belong to (names show on records and lists)', async () => {
    const mine = await wineryDataVersion(app.db, app.wineryId);
    const other = await wineryDataVersion(app.db, app.otherWineryId);
    await withClient((c) => c.query('update users set name = $1 where id = $2', [`Renamed ${randomUUID().slice(0, 6)}`, app.ownerMe.user.id]));
    expect(BigInt(await wineryDataVersion(app.db, app.wineryId))).toBe(BigInt(mine) + 1n);
    expect(await wineryDataVersion(app.db, app.otherWineryId)).toBe(other);
  });
});
