// @vitest-environment node
// Speed at scale (issue: fast at a winery's scale): what each closed run's stage tells the
// capacity learning is stored (run_stage_learnings) so a plan page does not read and fit every
// reading of sixty past runs on each visit. The stored path must give the very same plan as a
// computation from nothing, after every change the learning reads: a plan read twice, the
// stage's cartridge type's terminal ΔP edited, a reading of a closed run corrected.
import { sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { PlanDto } from '../../shared/types/plans';
import { createLabResult, createLot } from '../factories/cellar';
import { correctReadingVolume, createClosedRunReaching } from '../factories/past-runs';
import { addPlanLot, addTrain, createPlan, trainBody } from '../factories/plans';
import { createRecordWorld, type BottledWorld } from '../factories/records';
import { signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
let world: BottledWorld;
let planId: string;
const runIds: string[] = [];

beforeAll(async () => {
  // Without the kept answers (server/middleware/answer-cache.ts): each read here works the page out.
  app = await startTestApp({ config: { answerCacheBytes: 0 } });
  owner = (await signUp(app.baseUrl, { wineryName: 'Stored Learning Winery' })).client;
  world = await createRecordWorld(owner);
  for (const [reach, t400s] of [
    [[4050, 6300], 70],
    [[6075, 7560], 74],
    [[2025, 5040], 100],
  ] as const) {
    runIds.push((await createClosedRunReaching(owner, world, { style: 'white', reachL: [...reach], t200s: 30, t400s })).runId);
  }
  const lot = await createLot(owner, { style: 'white', volumeL: 6000 });
  await createLabResult(owner, lot.id, { t200s: 30, t400s: 72 });
  const plan = await createPlan(owner, world.lineId);
  const planLotId = (await addPlanLot(owner, plan.id, lot.id, 6000)).lots[0].id;
  const body = trainBody(world);
  for (const s of body.stages) delete (s as { capacityLPerM2?: number }).capacityLPerM2;
  await addTrain(owner, plan.id, planLotId, body);
  planId = plan.id;
}, 240_000);
afterAll(async () => {
  await app?.close();
});

async function plan(): Promise<PlanDto> {
  const res = await owner.get(`/api/plans/${planId}`);
  expect(res.status, res.text).toBe(200);
  return res.body as PlanDto;
}

async function storedRows() {
  const r = await app.db.execute(sql`select run_id, stage_index, inputs, litres from run_stage_learnings where run_id = any(${sql.param(runIds)}::uuid[]) order by run_id, stage_index`);
  return r.rows as { run_id: string; stage_index: number; inputs: string; litres: number | null }[];
}

/** The plan as read now (stored path), then with every stored learning removed (from nothing): they must be the same. */
async function expectStoredEqualsFresh() {
  const stored = await plan();
  await app.db.execute(sql`delete from run_stage_learnings where run_id = any(${sql.param(runIds)}::uuid[])`);
  const fresh = await plan();
  expect(stored).toEqual(fresh);
  return fresh;
}

describe('stored learnings of closed runs (plan capacity from past runs)', () => {
  it('are stored on the first read, one row per run and stage, and the plan read from them is the plan worked out from nothing', async () => {
    const first = await plan();
    expect(first.lots[0].trains[0].sizing!.stages[0].capacitySource).toBe('past-runs');
    const rows = await storedRows();
    expect(rows).toHaveLength(runIds.length * 2);
    expect(rows.every((r) => r.litres !== null && r.litres > 0)).toBe(true);
    const again = await plan();
    expect(again).toEqual(first);
    expect(await expectStoredEqualsFresh()).toEqual(first);
  });

  it('a stage type’s terminal ΔP edited: the stored learnings are worked out again (same as from nothing)', async () => {
    await plan();
    const before = (await storedRows()).map((r) => r.inputs);
    const res = await owner.patch(`/api/cartridge-types/${world.membraneTypeId}`, { terminalDpBar: 1.2 });
    expect(res.status, res.text).toBe(200);
    const after = await plan();
    expect((await storedRows()).map((r) => r.inputs)).not.toEqual(before);
    expect(await expectStoredEqualsFresh()).toEqual(after);
    await owner.patch(`/api/cartridge-types/${world.membraneTypeId}`, { terminalDpBar: 1.5 });
  });

  it('a reading of a closed run corrected: its learning is worked out again (same as from nothing)', async () => {
    const before = await plan();
    await correctReadingVolume(owner, runIds[2], 1, 5040, 8190);
    const after = await plan();
    expect(after.lots[0].trains[0].sizing!.stages[1].capacityPastRuns).not.toEqual(before.lots[0].trains[0].sizing!.stages[1].capacityPastRuns);
    expect(await expectStoredEqualsFresh()).toEqual(after);
  });
});
