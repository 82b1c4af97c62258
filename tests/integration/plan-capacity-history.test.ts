// @vitest-environment node
// Capacity per m² learned from the winery's own closed runs of similar wines (issue: plans you
// can approve with confidence): the plan's stage takes the median L/m² of the nearest similar
// runs and names its evidence; a lot's Vmax disc test still wins for membranes; another style
// and another winery's runs do not count.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PlanDto } from '../../shared/types/plans';
import { createLabResult, createLot, discPoints } from '../factories/cellar';
import { correctReadingVolume, createClosedRunReaching } from '../factories/past-runs';
import { addPlanLot, addTrain, createPlan, trainBody } from '../factories/plans';
import { createRecordWorld, type BottledWorld } from '../factories/records';
import { signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
let world: BottledWorld;
const runIds: string[] = [];

// The world's housings hold 3 × 30-inch: 9 ten-inch equivalents; prefilter 0.45 m² and
// membrane 0.7 m² per 10-inch → 4.05 m² and 6.3 m² (tests/factories/plans.ts, equipment.ts).
const PRE_M2 = 9 * 0.45;
const MEM_M2 = 9 * 0.7;

beforeAll(async () => {
  app = await startTestApp();
  owner = (await signUp(app.baseUrl, { wineryName: 'Capacity History Winery' })).client;
  world = await createRecordWorld(owner);
  // Three whites (clogging index t400 − 2·t200: 10, 14, 40 s) and one red, through the same train.
  const whites: { reach: [number, number]; t200s: number; t400s: number }[] = [
    { reach: [4050, 6300], t200s: 30, t400s: 70 }, // CI 10 → 1,000 L/m² prefilter, 1,000 L/m² membrane
    { reach: [6075, 7560], t200s: 30, t400s: 74 }, // CI 14 → 1,500 and 1,200 L/m²
    { reach: [2025, 5040], t200s: 30, t400s: 100 }, // CI 40 → 500 and 800 L/m²
  ];
  for (const wv of whites) {
    runIds.push((await createClosedRunReaching(owner, world, { style: 'white', reachL: wv.reach, t200s: wv.t200s, t400s: wv.t400s })).runId);
  }
  await createClosedRunReaching(owner, world, { style: 'red', reachL: [500 * 4.05, 1000] });
}, 240_000);
afterAll(async () => {
  await app?.close();
});

/** A draft plan for one lot with the world's train and no capacity typed on either stage. */
async function planFor(lotId: string): Promise<PlanDto> {
  const plan = await createPlan(owner, world.lineId);
  const planLotId = (await addPlanLot(owner, plan.id, lotId, 6000)).lots[0].id;
  const body = trainBody(world);
  for (const s of body.stages) delete (s as { capacityLPerM2?: number }).capacityLPerM2;
  return addTrain(owner, plan.id, planLotId, body);
}

describe('capacity from the winery’s closed runs of similar wines', () => {
  it('a stage with nothing typed takes the median L/m² of the similar runs and names them (common practice, no source)', async () => {
    const lot = await createLot(owner, { style: 'white', volumeL: 6000 });
    await createLabResult(owner, lot.id, { t200s: 30, t400s: 72 }); // CI 12
    const detail = await planFor(lot.id);
    expect(detail.lots[0].lot.cloggingIndexS).toBe(12);
    // Every white run's stages, none of the red
    expect(new Set(detail.lots[0].lot.pastRuns.map((o) => o.runId))).toEqual(new Set(runIds));
    const [pre, mem] = detail.lots[0].trains[0].sizing!.stages;
    expect(pre.capacitySource).toBe('past-runs');
    expect(pre.capacityLPerM2).toBeCloseTo(1000, 6);
    expect(pre.capacityPastRuns).toMatchObject({ runs: 3, style: 'white', nearestBy: 'clogging-index', lowLPerM2: expect.closeTo(500, 6), highLPerM2: expect.closeTo(1500, 6) });
    expect(mem.capacitySource).toBe('past-runs');
    expect(mem.capacityLPerM2).toBeCloseTo(1000, 6);
    expect(mem.capacityL).toBeCloseTo(1000 * MEM_M2, 6);
    expect(mem.capacityPastRuns).toMatchObject({ runs: 3, lowLPerM2: expect.closeTo(800, 6), highLPerM2: expect.closeTo(1200, 6) });
    // nearest by clogging index: 10 and 14 first, then 40
    expect(mem.capacityPastRuns!.runIds.slice(2)).toEqual([runIds[2]]);
    expect(PRE_M2).toBeCloseTo(4.05, 9);
  });

  it('a lot’s Vmax disc test still wins for the membrane; the prefilter keeps the past runs', async () => {
    const lot = await createLot(owner, { style: 'white', volumeL: 6000 });
    await createLabResult(owner, lot.id, { discDiameterMm: 47, discPressureBar: 2, discPoints: discPoints(2.4, 5000, 10) });
    const [pre, mem] = (await planFor(lot.id)).lots[0].trains[0].sizing!.stages;
    expect(mem.capacitySource).toBe('vmax');
    expect(mem.capacityPastRuns).toBeUndefined();
    expect(pre.capacitySource).toBe('past-runs');
  });

  it('a typed capacity overrides the past runs', async () => {
    const lot = await createLot(owner, { style: 'white', volumeL: 6000 });
    const plan = await createPlan(owner, world.lineId);
    const planLotId = (await addPlanLot(owner, plan.id, lot.id, 6000)).lots[0].id;
    const detail = await addTrain(owner, plan.id, planLotId, trainBody(world));
    expect(detail.lots[0].trains[0].sizing!.stages.map((s) => [s.capacitySource, s.capacityLPerM2])).toEqual([
      ['stage', 3000],
      ['stage', 2000],
    ]);
  });

  it('a style with a single past run has no learned capacity (two runs at least), and another winery sees none of these runs', async () => {
    const red = await createLot(owner, { style: 'red', volumeL: 6000 });
    const [pre] = (await planFor(red.id)).lots[0].trains[0].sizing!.stages;
    expect(pre.capacitySource).toBeNull();

    const other = (await signUp(app.baseUrl, { wineryName: 'Other Capacity Winery' })).client;
    const otherWorld = await createRecordWorld(other);
    const lot = await createLot(other, { style: 'white', volumeL: 6000 });
    const plan = await createPlan(other, otherWorld.lineId);
    const planLotId = (await addPlanLot(other, plan.id, lot.id, 6000)).lots[0].id;
    const body = trainBody(otherWorld);
    for (const s of body.stages) delete (s as { capacityLPerM2?: number }).capacityLPerM2;
    const detail = await addTrain(other, plan.id, planLotId, body);
    expect(detail.lots[0].lot.pastRuns).toEqual([]);
    expect(detail.lots[0].trains[0].sizing!.stages.map((s) => s.capacitySource)).toEqual([null, null]);
  });

  it('reads a run as corrected: a corrected reading moves the learned capacity (the original is kept in the run)', async () => {
    // The third white run's membrane reached terminal at 5,040 L (800 L/m²); corrected to 8,190 L (1,300 L/m²).
    await correctReadingVolume(owner, runIds[2], 1, 5040, 8190, { flowLh: 2500, tempC: 12 });
    const lot = await createLot(owner, { style: 'white', volumeL: 6000 });
    await createLabResult(owner, lot.id, { t200s: 30, t400s: 72 });
    const mem = (await planFor(lot.id)).lots[0].trains[0].sizing!.stages[1];
    expect(mem.capacityPastRuns).toMatchObject({ runs: 3, lowLPerM2: expect.closeTo(1000, 6), highLPerM2: expect.closeTo(1300, 6) });
    expect(mem.capacityLPerM2).toBeCloseTo(1200, 6);
  });
});
