// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { chartPointsPerStage } from '../../shared/chart/thin';
import { effectiveReadings } from '../../server/modules/runs/runs.presenter';
import { createRunsRepository } from '../../server/modules/runs/runs.repository';
import { stageFigures } from '../../server/modules/runs/runs.service';
import { gaugeResolutionFor } from '../../server/modules/winery-settings/winery-settings.service';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody, type PlanWorld } from '../factories/plans';
import { addMember, signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
let auditor: Client;
let technician: Client;
let stranger: Client;
let world: PlanWorld;
let big: { id: string };
let bigDetail: Record<string, any>;

async function startedRun() {
  const plan = await createPlan(owner, world.lineId);
  const planLotId = (await addPlanLot(owner, plan.id, world.lotId, 60000)).lots[0].id;
  const trainId = (await addTrain(owner, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
  expect((await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);
  expect((await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' })).status).toBe(200);
  const res = await technician.post('/api/runs', { planLotId });
  expect(res.status).toBe(201);
  return res.body as { id: string };
}

// ΔP rising with a little gauge jitter, so thinning would change a fit if the server used it.
const jitter = (i: number) => (((i * 7919) % 13) - 6) / 600;
const reading = (i: number) => ({
  clientKey: randomUUID(),
  stageIndex: 0,
  at: new Date(Date.UTC(2026, 9, 1, 6) + i * 5_000).toISOString(),
  volumeL: 2 * i,
  upstreamBar: 2 + 0.00004 * i + (0.0000001 * i) ** 2 + Math.abs(jitter(i)),
  downstreamBar: 2,
  flowLh: 3000,
});

beforeAll(async () => {
  app = await startTestApp();
  owner = (await signUp(app.baseUrl, { wineryName: 'Paged Readings Winery' })).client;
  auditor = (await addMember(app, owner, 'auditor')).client;
  technician = (await addMember(app, owner, 'technician')).client;
  stranger = (await signUp(app.baseUrl, { wineryName: 'Other Paged Winery' })).client;
  world = await createPlanWorld(owner);
  await fillTrainHousings(owner, world);
  big = await startedRun();
  for (let b = 0; b < 5; b++) {
    const readings = Array.from({ length: 1000 }, (_x, k) => reading(b * 1000 + k));
    const res = await technician.post(`/api/runs/${big.id}/readings/batch`, { readings });
    expect(res.body).toEqual({ stored: 1000, duplicates: 0 });
  }
  bigDetail = (await owner.get(`/api/runs/${big.id}`)).body;
}, 240_000);
afterAll(async () => {
  await app?.close();
});

describe('run detail at 5,000 readings', () => {
  it('sends at most 150 KB, the chart points thinned and the count whole', async () => {
    // Uncompressed JSON (the body as decoded, whatever the wire encoding).
    const res = await owner.request('GET', `/api/runs/${big.id}`, undefined, { 'accept-encoding': 'identity' });
    expect(res.status).toBe(200);
    expect(Buffer.byteLength(res.text)).toBeLessThanOrEqual(150 * 1024);
    const stage = bigDetail.stages[0];
    expect(bigDetail.readingCount).toBe(5000);
    expect(stage.readingCount).toBe(5000);
    expect(stage.readings.length).toBeLessThanOrEqual(chartPointsPerStage(bigDetail.stages.length));
    expect(stage.readings[0].volumeL).toBe(0);
    expect(stage.readings.at(-1).volumeL).toBe(2 * 4999);
  });

  it('forecasts from all the readings, not the chart points', async () => {
    const winery = await app.db.execute(sql`select winery_id from runs where id = ${big.id}::uuid`);
    const wineryId = (winery.rows[0] as { winery_id: string }).winery_id;
    const repo = createRunsRepository(app.db);
    const all = effectiveReadings(await repo.readings(wineryId, big.id, 0), await repo.corrections(wineryId, big.id));
    expect(all.length).toBe(5000);
    const args = {
      terminalDpBar: bigDetail.stages[0].terminalDpBar as number,
      lineFlowLh: bigDetail.requiredFlowLh as number | null,
      currentVolumeL: bigDetail.currentVolumeL as number,
      volumeToBottleL: bigDetail.volumeToBottleL as number,
      restartsAtL: [],
      resolutionBar: await gaugeResolutionFor(app.db, wineryId),
    };
    const fromAll = stageFigures({ ...args, readings: all });
    expect(fromAll.forecast).not.toBeNull();
    expect(bigDetail.stages[0].forecast).toEqual(JSON.parse(JSON.stringify(fromAll.forecast)));
    // The fit is the same too (its per-reading residuals are not sent).
    const { residuals, ...fit } = fromAll.fit as unknown as { residuals: number[] };
    expect(residuals.length).toBe(5000);
    expect(bigDetail.stages[0].fit).toEqual(JSON.parse(JSON.stringify(fit)));
  });
});

describe('GET /api/runs/:id/readings', () => {
  it('pages a stage newest first, with the total', async () => {
    const first = await auditor.get(`/api/runs/${big.id}/readings?stage=0&page=1&pageSize=10`);
    expect(first.status).toBe(200);
    expect(first.body.total).toBe(5000);
    expect(first.body.items.map((r: { volumeL: number }) => r.volumeL)).toEqual(Array.from({ length: 10 }, (_x, k) => 2 * (4999 - k)));
    const third = await auditor.get(`/api/runs/${big.id}/readings?stage=0&page=3&pageSize=10`);
    expect(third.body.items[0].volumeL).toBe(2 * (4999 - 20));
    const last = await auditor.get(`/api/runs/${big.id}/readings?stage=0&page=500&pageSize=10`);
    expect(last.body.items.at(-1).volumeL).toBe(0);
    const past = await auditor.get(`/api/runs/${big.id}/readings?stage=0&page=501&pageSize=10`);
    expect(past.body).toEqual({ items: [], total: 5000 });
    const none = await auditor.get(`/api/runs/${big.id}/readings?stage=1`);
    expect(none.body).toEqual({ items: [], total: 0 });
  });

  it('shows corrections and voids on the page, and keeps those readings among the chart points', async () => {
    const run = await startedRun();
    const readings = Array.from({ length: 700 }, (_x, i) => reading(i));
    expect((await technician.post(`/api/runs/${run.id}/readings/batch`, { readings })).status).toBe(200);
    const page = await owner.get(`/api/runs/${run.id}/readings?stage=0&page=2&pageSize=5`);
    const [a, b] = page.body.items as { id: string; volumeL: number; upstreamBar: number }[];
    const fixed = await owner.post(`/api/runs/${run.id}/readings/${a.id}/correct`, { volumeL: a.volumeL, upstreamBar: a.upstreamBar + 0.001, downstreamBar: 2, reason: 'Misread the upstream gauge.' });
    expect(fixed.status).toBe(201);
    expect((await owner.post(`/api/runs/${run.id}/readings/${b.id}/void`, { reason: 'Gauge was being swapped.' })).status).toBe(201);
    const again = await owner.get(`/api/runs/${run.id}/readings?stage=0&page=2&pageSize=5`);
    const [a2, b2] = again.body.items;
    expect(a2.id).toBe(a.id);
    expect(a2.upstreamBar).toBeCloseTo(a.upstreamBar + 0.001, 9);
    expect(a2.original.upstreamBar).toBe(a.upstreamBar);
    expect(a2.corrections).toEqual([expect.objectContaining({ kind: 'correct', reason: 'Misread the upstream gauge.' })]);
    expect(b2).toEqual(expect.objectContaining({ id: b.id, voided: true }));
    const detail = (await owner.get(`/api/runs/${run.id}`)).body;
    const ids = detail.stages[0].readings.map((r: { id: string }) => r.id);
    expect(detail.stages[0].readings.length).toBeLessThan(700);
    expect(ids).toContain(a.id);
    expect(ids).toContain(b.id);
  });

  it('answers 404 to another winery and 400 to a bad page', async () => {
    expect((await stranger.get(`/api/runs/${big.id}/readings?stage=0`)).status).toBe(404);
    for (const q of ['page=0', 'page=x', 'pageSize=101', 'pageSize=0', 'stage=-1', 'stage=a']) {
      const res = await owner.get(`/api/runs/${big.id}/readings?${q}`);
      expect(res.status, q).toBe(400);
      expect(Object.keys(res.body.error.fields as object).length, q).toBeGreaterThan(0);
    }
    expect((await owner.get(`/api/runs/${randomUUID()}/readings`)).status).toBe(404);
    expect((await owner.get('/api/runs/not-an-id/readings')).status).toBe(404);
  });
});
