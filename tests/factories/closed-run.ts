// A run through the world's two-stage train, with readings, a regeneration of the prefilters in
// place and a close: the prefilter's last set reaches terminal ΔP, the membrane's does not.
import { randomUUID } from 'node:crypto';
import type { RunDetailDto } from '../../shared/types/runs';
import type { Client } from '../support/test-app';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody, type PlanWorld } from './plans';

async function ok<T>(res: { status: number; body: unknown; text: string }, status: number, what: string): Promise<T> {
  if (res.status !== status) throw new Error(`${what} failed: ${res.status} ${res.text}`);
  return res.body as T;
}

/** Readings (litres through the train, ΔP in bar) per stage; upstream is 2 bar above the ΔP's foot. */
export const CLOSED_RUN_READINGS = {
  prefilterBefore: [
    { volumeL: 500, dpBar: 0.2 },
    { volumeL: 1000, dpBar: 0.26 },
    { volumeL: 1500, dpBar: 0.34 },
    { volumeL: 2000, dpBar: 0.45 },
  ],
  /** After the regeneration at 2,000 L; 1.6 bar is above the factory type's 1.5 bar terminal ΔP. */
  prefilterAfter: [
    { volumeL: 2500, dpBar: 0.5 },
    { volumeL: 3000, dpBar: 1.6 },
  ],
  membrane: [
    { volumeL: 1000, dpBar: 0.1 },
    { volumeL: 2000, dpBar: 0.2 },
    { volumeL: 3000, dpBar: 0.3 },
  ],
  regeneratedAtL: 2000,
};

/** Starts a run (6,000 L lot), logs the readings, regenerates the prefilters at 2,000 L; closes it unless told. */
export async function closedRun(owner: Client, opts: { close?: boolean; world?: PlanWorld } = {}) {
  const world = opts.world ?? (await createPlanWorld(owner));
  const { prefilters } = await fillTrainHousings(owner, world);
  const plan = await createPlan(owner, world.lineId);
  const planLotId = (await addPlanLot(owner, plan.id, world.lotId, 6000)).lots[0].id;
  const trainId = (await addTrain(owner, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
  await ok(await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId }), 200, 'choosing the train');
  await ok(await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test run.' }), 200, 'approving');
  const run = await ok<RunDetailDto>(await owner.post('/api/runs', { planLotId }), 201, 'starting the run');
  const log = async (stageIndex: number, p: { volumeL: number; dpBar: number }) =>
    ok(await owner.post(`/api/runs/${run.id}/readings`, { clientKey: randomUUID(), stageIndex, volumeL: p.volumeL, upstreamBar: 2 + p.dpBar, downstreamBar: 2 }), 201, 'logging a reading');
  const r = CLOSED_RUN_READINGS;
  for (const p of r.prefilterBefore) await log(0, p);
  for (const p of r.membrane.slice(0, 2)) await log(1, p);
  await ok(
    await owner.post(`/api/runs/${run.id}/changes`, { stageIndex: 0, atVolumeL: r.regeneratedAtL, kind: 'regeneration', removedCartridgeIds: prefilters.map((c) => c.id), installedCartridgeIds: [] }),
    201,
    'regenerating the prefilters',
  );
  for (const p of r.prefilterAfter) await log(0, p);
  await log(1, r.membrane[2]);
  const running = await ok<RunDetailDto>(await owner.get(`/api/runs/${run.id}`), 200, 'reading the run');
  if (opts.close === false) return { runId: run.id, running, closed: null };
  await ok(await owner.post(`/api/runs/${run.id}/close`, { notes: 'Prefilters regenerated at 2,000 L.' }), 200, 'closing the run');
  const closed = await ok<RunDetailDto>(await owner.get(`/api/runs/${run.id}`), 200, 'reading the closed run');
  return { runId: run.id, running, closed };
}
