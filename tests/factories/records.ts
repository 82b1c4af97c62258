// A bottled lot with a full record, made through the API as a cellar team would: cartridges
// registered and installed, sanitised and tested, a plan approved, a run with readings, the
// membranes tested after, the run closed with notes.
import { randomUUID } from 'node:crypto';
import type { Client } from '../support/test-app';
import { createLabResult, createLot } from './cellar';
import { addPlanLot, addTrain, createPlan, createPlanWorld, trainBody, type PlanWorld } from './plans';

let n = 0;
const serialBase = () => `R${Date.now().toString(36).toUpperCase()}${process.pid.toString(36).toUpperCase()}${(n += 1)}`;

async function ok<T = any>(res: { status: number; body: unknown; text: string }, status: number, what: string): Promise<T> {
  if (res.status !== status) throw new Error(`${what} failed: ${res.status} ${res.text}`);
  return res.body as T;
}

export type BottledWorld = PlanWorld & {
  preSerials: string[];
  memSerials: string[];
  preIds: string[];
  memIds: string[];
  batch: string;
};

/** Equipment and cartridges (3 prefilters, 3 membranes, installed) for records. */
export async function createRecordWorld(owner: Client, opts: { batch?: string } = {}): Promise<BottledWorld> {
  const world = await createPlanWorld(owner);
  const base = serialBase();
  const batch = opts.batch ?? `B-${base}`;
  const preSerials = [1, 2, 3].map((i) => `${base}-P${i}`);
  const memSerials = [1, 2, 3].map((i) => `${base}-M${i}`);
  const register = async (serial: string, typeId: string, housingId: string, position: number, b: string) => {
    const c = await ok<{ id: string }>(await owner.post('/api/cartridges', { serial, batch: b, typeId, lengthIn: 30 }), 201, `registering ${serial}`);
    await ok(await owner.post(`/api/cartridges/${c.id}/install`, { housingId, position }), 200, `installing ${serial}`);
    return c.id;
  };
  const preIds: string[] = [];
  const memIds: string[] = [];
  for (const [i, s] of preSerials.entries()) preIds.push(await register(s, world.prefilterTypeId, world.prefilterHousingId, i + 1, `PRE-${base}`));
  for (const [i, s] of memSerials.entries()) memIds.push(await register(s, world.membraneTypeId, world.membraneHousingId, i + 1, batch));
  return { ...world, preSerials, memSerials, preIds, memIds, batch };
}

/** Hot-water sanitation of every installed cartridge, and a bubble-point test of each membrane. */
export async function sanitiseAndTest(client: Client, w: BottledWorld, opts: { bubblePointBar?: number } = {}) {
  for (const id of [...w.preIds, ...w.memIds]) {
    await ok(await client.post(`/api/cartridges/${id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20 }), 201, 'logging sanitation');
  }
  await testMembranes(client, w, opts.bubblePointBar ?? 3.6);
}

export async function testMembranes(client: Client, w: BottledWorld, bubblePointBar: number) {
  for (const id of w.memIds) {
    await ok(await client.post(`/api/cartridges/${id}/integrity-tests`, { test: 'bubble-point', bubblePointBar, wettingFluid: 'water' }), 201, 'recording a test');
  }
}

/** Plans, approves and starts a run of `lotId`; returns the run id. */
export async function startRunOf(owner: Client, w: BottledWorld, lotId: string, volumeL: number, starter: Client = owner) {
  const plan = await createPlan(owner, w.lineId, { name: `Record day ${serialBase()}` });
  const planLotId = (await addPlanLot(owner, plan.id, lotId, volumeL)).lots[0].id;
  const trainId = (await addTrain(owner, plan.id, planLotId, trainBody(w))).lots[0].trains[0].id;
  await ok(await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId }), 200, 'choosing the train');
  await ok(await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' }), 200, 'approving');
  const run = await ok<{ id: string }>(await starter.post('/api/runs', { planLotId }), 201, 'starting the run');
  return { runId: run.id, planId: plan.id, planName: plan.name };
}

/** Four readings per stage with ΔP rising as the cartridges load. */
export async function logReadings(client: Client, runId: string, volumes = [1000, 2000, 3000, 4000]) {
  for (const stageIndex of [0, 1]) {
    for (const [i, volumeL] of volumes.entries()) {
      const dp = stageIndex === 0 ? 0.2 + 0.08 * i + 0.01 * i * i : 0.15 + 0.05 * i + 0.02 * i * i;
      await ok(
        await client.post(`/api/runs/${runId}/readings`, { clientKey: randomUUID(), stageIndex, volumeL, upstreamBar: 2 + dp, downstreamBar: 2, flowLh: 2400, tempC: 12 }),
        201,
        'logging a reading',
      );
    }
  }
}

/**
 * A lot bottled through a closed run with a full record: lab result, sanitation, tests before and
 * after (passing unless told), readings, closing notes.
 */
export async function createBottledLot(
  owner: Client,
  opts: { world?: BottledWorld; lot?: Record<string, unknown>; notes?: string; testAfter?: boolean; runner?: Client } = {},
) {
  const w = opts.world ?? (await createRecordWorld(owner));
  const lot = await createLot(owner, { volumeL: 6000, name: 'Record test white', ...opts.lot });
  await createLabResult(owner, lot.id, { sampledAt: new Date(Date.now() - 86_400_000).toISOString(), turbidityNtu: 0.6, t200s: 28, t400s: 66 });
  await sanitiseAndTest(owner, w);
  const runner = opts.runner ?? owner;
  const { runId, planName } = await startRunOf(owner, w, lot.id, 4000, runner);
  await logReadings(runner, runId);
  if (opts.testAfter !== false) await testMembranes(runner, w, 3.5);
  await ok(await runner.post(`/api/runs/${runId}/close`, { notes: opts.notes ?? 'Bottled without incident.' }), 200, 'closing the run');
  return { world: w, lotId: lot.id, lotCode: lot.code, runId, planName };
}
