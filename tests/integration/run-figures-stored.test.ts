// @vitest-environment node
// The run page and Today keep each run's figures worked out from its readings (run_figures) and
// work them out again only when something they read has changed. These tests change each of
// those things after both were read, and check both answers, byte for byte, against the same
// answers worked out from nothing (the stored rows removed), so a stale stored entry would
// show as a difference.
import { randomUUID } from 'node:crypto';
import { and, eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { planLotsTable, planTrainsTable, runFiguresTable, runReadingsTable, runsTable, usersTable, type PlanTrainStage } from '../../server/db/schema';
import type { RunDetailDto, RunInProgressDto } from '../../shared/types/runs';
import { createRunsRepository } from '../../server/modules/runs/runs.repository';
import { RUN_FIGURES_REVISION } from '../../server/modules/runs/runs.service';
import { closedRun } from '../factories/closed-run';
import { createPlanWorld, type PlanWorld } from '../factories/plans';
import { signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
beforeAll(async () => {
  // Without the kept answers (server/middleware/answer-cache.ts): each read here works the page out.
  app = await startTestApp({ config: { answerCacheBytes: 0 } });
});
afterAll(async () => {
  await app?.close();
});

type Views = { page: string; today: string };

/** The run page's body as sent, and the run's entry on Today (null once it is closed). */
async function views(client: Client, runId: string): Promise<Views> {
  const page = await client.get(`/api/runs/${runId}`);
  expect(page.status).toBe(200);
  const today = await client.get('/api/today');
  expect(today.status).toBe(200);
  const run = (today.body.runsInProgress as RunInProgressDto[]).find((r) => r.id === runId) ?? null;
  return { page: page.text, today: JSON.stringify(run) };
}

async function storedRow(runId: string) {
  const [row] = await app.db.select().from(runFiguresTable).where(eq(runFiguresTable.runId, runId));
  return row;
}

/**
 * Both views read after a change (worked out again, or wrongly the old stored entry), read
 * again (from the stored entry), and from nothing: all three must be the same bytes.
 */
async function checkedBothWays(client: Client, runId: string): Promise<Views> {
  const afterChange = await views(client, runId);
  const row = await storedRow(runId);
  expect(row.pageVersion).toBe(row.version);
  const stored = await views(client, runId);
  await app.db.delete(runFiguresTable).where(eq(runFiguresTable.runId, runId));
  const fresh = await views(client, runId);
  expect(afterChange.page).toBe(fresh.page);
  expect(afterChange.today).toBe(fresh.today);
  expect(stored.page).toBe(fresh.page);
  expect(stored.today).toBe(fresh.today);
  return fresh;
}

const page = (v: Views) => JSON.parse(v.page) as RunDetailDto;

describe('a run’s stored figures', () => {
  let owner: Client;
  let world: PlanWorld;
  let runId: string;
  let last: Views;
  /** Asserts the change made a difference, then checks it both ways. */
  const changed = async (what: string) => {
    const now = await checkedBothWays(owner, runId);
    expect(now.page, what).not.toBe(last.page);
    last = now;
    return now;
  };

  beforeAll(async () => {
    owner = (await signUp(app.baseUrl, { wineryName: 'Stored Figures Winery' })).client;
    world = await createPlanWorld(owner);
    runId = (await closedRun(owner, { close: false, world })).runId;
    // The membrane's stage gets enough readings to be thinned for the chart (150 points a stage).
    const readings = Array.from({ length: 300 }, (_x, i) => ({
      clientKey: randomUUID(),
      stageIndex: 1,
      volumeL: 3000 + 5 * (i + 1),
      upstreamBar: 2.3 + 0.0005 * i + (i % 7) * 0.002,
      downstreamBar: 2,
      flowLh: i % 50 === 0 ? 2400 : null,
    }));
    expect((await owner.post(`/api/runs/${runId}/readings/batch`, { readings })).status).toBe(200);
    last = await checkedBothWays(owner, runId);
    expect(page(last).stages[1].readingCount).toBe(303);
    expect(page(last).stages[1].readings.length).toBeLessThan(200);
  });

  it('is what the run page and Today answer while current, and is stored at the run’s version', async () => {
    await views(owner, runId);
    const row = await storedRow(runId);
    expect(row.pageVersion).toBe(row.version);
    expect(row.todayVersion).toBe(row.version);
    // A marker written into the stored entries shows on both: they are read, not worked out again.
    const marked = (row.page as { readingCount: number }[]).map((s) => ({ ...s, readingCount: 424242 }));
    const markedToday = { ...(row.today as { currentVolumeL: number }), currentVolumeL: 424242 };
    await app.db.update(runFiguresTable).set({ page: marked, today: markedToday }).where(eq(runFiguresTable.runId, runId));
    const seen = await views(owner, runId);
    expect(page(seen).stages.map((s) => s.readingCount)).toEqual([424242, 424242]);
    expect((JSON.parse(seen.today) as RunInProgressDto).currentVolumeL).toBe(424242);
    // Any write of a reading makes them stale: the marker is gone.
    const res = await owner.post(`/api/runs/${runId}/readings`, { clientKey: randomUUID(), stageIndex: 1, volumeL: 4600, upstreamBar: 2.5, downstreamBar: 2 });
    expect(res.status).toBe(201);
    const now = await changed('a reading logged');
    expect(now.page).not.toContain('424242');
    expect(now.today).not.toContain('424242');
  });

  it('follows readings, corrections, voids, changes and regenerations', async () => {
    // one reading with its stage's figures in the answer
    const one = await owner.post(`/api/runs/${runId}/readings?with=stage`, { clientKey: randomUUID(), stageIndex: 0, volumeL: 4700, upstreamBar: 3.7, downstreamBar: 2 });
    expect(one.status).toBe(201);
    let now = await changed('a reading with its stage');
    expect(JSON.stringify(one.body.stage)).toBe(JSON.stringify(page(now).stages[0]));

    // a batch
    const batch = [4710, 4720].map((v) => ({ clientKey: randomUUID(), stageIndex: 0, volumeL: v, upstreamBar: 3.72, downstreamBar: 2 }));
    expect((await owner.post(`/api/runs/${runId}/readings/batch`, { readings: batch })).status).toBe(200);
    now = await changed('a batch');

    // a correction of one of the membrane's readings (in the middle: thinned away before, kept now)
    const stored = await app.db
      .select({ id: runReadingsTable.id, volumeL: runReadingsTable.volumeL })
      .from(runReadingsTable)
      .where(and(eq(runReadingsTable.runId, runId), eq(runReadingsTable.stageIndex, 1)))
      .orderBy(runReadingsTable.volumeL);
    const middle = stored[150];
    const corrected = await owner.post(`/api/runs/${runId}/readings/${middle.id}/correct`, {
      volumeL: middle.volumeL,
      upstreamBar: 2.9,
      downstreamBar: 2,
      reason: 'Gauge read wrong.',
    });
    expect(corrected.status).toBe(201);
    now = await changed('a correction');
    expect(page(now).stages[1].readings.some((r) => r.id === middle.id)).toBe(true);

    // a void
    expect((await owner.post(`/api/runs/${runId}/readings/${stored[10].id}/void`, { reason: 'Logged twice.' })).status).toBe(201);
    await changed('a void');

    // a regeneration of the membranes in place
    const membranes = page(now).stages[1].cartridges.filter((c) => c.removedAtVolumeL === null).map((c) => c.cartridgeId);
    const regen = await owner.post(`/api/runs/${runId}/changes`, { stageIndex: 1, atVolumeL: 4720, kind: 'regeneration', removedCartridgeIds: membranes, installedCartridgeIds: [] });
    expect(regen.status).toBe(201);
    await changed('a regeneration');
  });

  it('follows the small inputs read on every request: terminal ΔP, line, gauge resolution, volume, train', async () => {
    // the prefilter type's terminal ΔP
    expect((await owner.patch(`/api/cartridge-types/${world.prefilterTypeId}`, { terminalDpBar: 4 })).status).toBe(200);
    await changed('terminal ΔP');
    // the line's speed (the prefilter's readings carry no flow: the line's flow is used)
    expect((await owner.patch(`/api/lines/${world.lineId}`, { bottlesPerHour: 6000 })).status).toBe(200);
    await changed('line');
    // the winery's gauge resolution
    expect((await owner.put('/api/settings/winery', { gaugeResolutionBar: 0.5 })).status).toBe(200);
    await changed('gauge resolution');
    expect((await owner.put('/api/settings/winery', { gaugeResolutionBar: 0.02 })).status).toBe(200);
    await changed('gauge resolution back');
    // the lot's litres to bottle (straight in the database: nothing else changes)
    const [run] = await app.db.select().from(runsTable).where(eq(runsTable.id, runId));
    await app.db.update(planLotsTable).set({ volumeL: 5200 }).where(eq(planLotsTable.id, run.planLotId));
    await changed('volume to bottle');
    // the train's second stage planned with the prefilter type
    const [lot] = await app.db.select().from(planLotsTable).where(eq(planLotsTable.id, run.planLotId));
    const [train] = await app.db.select().from(planTrainsTable).where(eq(planTrainsTable.id, lot.chosenTrainId!));
    const stages: PlanTrainStage[] = train.stages.map((s, i) => (i === 1 ? { ...s, cartridgeTypeId: world.prefilterTypeId } : s));
    await app.db.update(planTrainsTable).set({ stages }).where(eq(planTrainsTable.id, train.id));
    await changed('train stage type');
    await app.db.update(planTrainsTable).set({ stages: train.stages }).where(eq(planTrainsTable.id, train.id));
    await changed('train stage type back');
  });

  it('follows a reading removed and the current name of a reading kept without one', async () => {
    const [first] = await app.db
      .select()
      .from(runReadingsTable)
      .where(and(eq(runReadingsTable.runId, runId), eq(runReadingsTable.stageIndex, 0)))
      .orderBy(runReadingsTable.volumeL)
      .limit(1);
    // a reading kept without a name shows its author's current name
    await app.db.update(runReadingsTable).set({ createdByName: null }).where(eq(runReadingsTable.id, first.id));
    await checkedBothWays(owner, runId);
    await app.db.update(usersTable).set({ name: 'Renamed Cellar Hand' }).where(eq(usersTable.id, first.createdBy!));
    const now = await changed('a rename');
    expect(page(now).stages[0].readings.find((r) => r.id === first.id)?.byName).toBe('Renamed Cellar Hand');
    // a reading removed (straight in the database)
    await app.db.delete(runReadingsTable).where(eq(runReadingsTable.id, first.id));
    await changed('a reading removed');
  });

  it('follows a close, and a correction after it', async () => {
    expect((await owner.post(`/api/runs/${runId}/close`, { notes: 'Done.' })).status).toBe(200);
    let now = await changed('a close');
    expect(now.today).toBe('null');
    expect(page(now).stages.every((s) => s.final !== null)).toBe(true);
    const [latest] = await app.db
      .select()
      .from(runReadingsTable)
      .where(and(eq(runReadingsTable.runId, runId), eq(runReadingsTable.stageIndex, 0)))
      .orderBy(sql`${runReadingsTable.volumeL} desc`)
      .limit(1);
    const res = await owner.post(`/api/runs/${runId}/readings/${latest.id}/correct`, { volumeL: latest.volumeL, upstreamBar: 3.1, downstreamBar: 2, reason: 'Last gauge read wrong.' });
    expect(res.status).toBe(201);
    now = await changed('a correction after the close');
    expect(page(now).stages[0].final?.lastDpBar).toBeCloseTo(1.1, 6);
  });

  it('is not used when stored by code of another revision (its key differs)', async () => {
    await views(owner, runId);
    const row = await storedRow(runId);
    expect(row.pageKey).toContain(`"revision":${String(RUN_FIGURES_REVISION)}`);
    const marked = (row.page as { readingCount: number }[]).map((s) => ({ ...s, readingCount: 434343 }));
    const olderKey = row.pageKey!.replace(`"revision":${String(RUN_FIGURES_REVISION)}`, '"revision":0');
    await app.db.update(runFiguresTable).set({ page: marked, pageKey: olderKey }).where(eq(runFiguresTable.runId, runId));
    const seen = await views(owner, runId);
    expect(seen.page).not.toContain('434343');
    expect(seen.page).toBe(last.page);
    expect((await storedRow(runId)).pageKey).toBe(row.pageKey);
  });

  it('leaves an entry worked out before a write unstored (the version moved on)', async () => {
    await views(owner, runId);
    const before = await storedRow(runId);
    // a stored entry offered at the version read before a write is refused
    await app.db.execute(sql`update run_readings set at = at where run_id = ${runId}::uuid and stage_index = 0`);
    const after = await storedRow(runId);
    expect(after.version).toBe(before.version + 1);
    await createRunsRepository(app.db).storePageFigures(runId, before.version, 'stale', '[]');
    const row = await storedRow(runId);
    expect(row.pageKey).not.toBe('stale');
    expect(row.pageVersion).not.toBe(row.version);
    await checkedBothWays(owner, runId);
  });

  it('never queues a read behind a long write of the run (a logger import still open): the answer comes, unstored, and is stored after', async () => {
    const before = await views(owner, runId);
    // Both stored entries taken away, so this read works them out and tries to store them.
    await app.db.update(runFiguresTable).set({ pageVersion: null, todayVersion: null }).where(eq(runFiguresTable.runId, runId));
    const version = (await storedRow(runId)).version;
    // Another connection holds the run's figures row in an open transaction, as a long import does.
    const holder = await app.pool.connect();
    try {
      await holder.query('begin');
      await holder.query('update run_figures set version = version where run_id = $1', [runId]);
      const during = await views(owner, runId);
      expect(during.page).toBe(before.page);
      expect(during.today).toBe(before.today);
      await holder.query('rollback');
    } finally {
      holder.release();
    }
    const row = await storedRow(runId);
    expect(row.version).toBe(version);
    expect(row.pageVersion).toBeNull(); // skipped, not waited for
    await checkedBothWays(owner, runId);
  });
});
