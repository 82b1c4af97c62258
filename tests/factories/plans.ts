// Valid request bodies for plans, and a small set of equipment and lots a plan stands on.
import type { PlanDto } from '../../shared/types/plans';
import { createLot } from './cellar';
import { createCartridgeType, createHousing, createLine } from './equipment';
import type { Client } from '../support/test-app';

let n = 0;
const unique = (prefix: string) => `${prefix} ${Date.now().toString(36)}-${process.pid}-${(n += 1)}`;

export const planBody = (lineId: string, over: Record<string, unknown> = {}) => ({
  name: unique('Bottling day'),
  plannedDate: '2025-06-12',
  lineId,
  startTime: '07:00',
  sanitationKind: 'hot-water',
  notes: '',
  ...over,
});

/** A two-stage train: a polypropylene prefilter then a membrane, one housing each unless told. */
export const trainBody = (w: PlanWorld, over: Record<string, unknown> = {}, counts: [number, number] = [1, 1]) => ({
  name: 'Option A',
  stages: [
    { name: 'Prefilter', cartridgeTypeId: w.prefilterTypeId, housingId: w.prefilterHousingId, housingCount: counts[0], capacityLPerM2: 3000 },
    { name: 'Membrane', cartridgeTypeId: w.membraneTypeId, housingId: w.membraneHousingId, housingCount: counts[1], capacityLPerM2: 2000 },
  ],
  ...over,
});

/** The plan world's prefilter: 1 µm polypropylene depth cartridge, no integrity-test limits. */
export const prefilterTypeFields = {
  kind: 'prefilter',
  media: 'polypropylene',
  ratingUm: 1,
  areaM2Per10in: 0.45,
  waterFlowLhPer10in: 900,
  waterDpBar: 0.15,
  designFluxLhPer10in: 500,
  bubblePointMinBar: null,
  diffusionMaxMlMinPer10in: null,
  pricePer10in: 16,
};

export type PlanWorld = {
  lineId: string;
  lotId: string;
  secondLotId: string;
  prefilterTypeId: string;
  membraneTypeId: string;
  prefilterHousingId: string;
  membraneHousingId: string;
  /** A housing rated for 1 bar only: any train through it breaks the rating. */
  weakHousingId: string;
};

/** A line (3,000 × 750 mL), two lots, a prefilter and a membrane type and their housings. */
export async function createPlanWorld(client: Client): Promise<PlanWorld> {
  const line = await createLine(client, { bottlesPerHour: 3000, bottleMl: 750 });
  const lot = await createLot(client, { volumeL: 6000, tempC: 12, ethanolPctVol: 12.5, sugarGPerL: 2 });
  const second = await createLot(client, { volumeL: 3000, tempC: 14, ethanolPctVol: 13.5, sugarGPerL: 1 });
  const pre = await createCartridgeType(client, prefilterTypeFields);
  const mem = await createCartridgeType(client, { pricePer10in: 95 });
  const preHousing = await createHousing(client, { rounds: 3, lengthIn: 30, maxPressureBar: 8 });
  const memHousing = await createHousing(client, { rounds: 3, lengthIn: 30, maxPressureBar: 10 });
  const weak = await createHousing(client, { rounds: 3, lengthIn: 30, maxPressureBar: 1 });
  return {
    lineId: line.id,
    lotId: lot.id,
    secondLotId: second.id,
    prefilterTypeId: pre.id,
    membraneTypeId: mem.id,
    prefilterHousingId: preHousing.id,
    membraneHousingId: memHousing.id,
    weakHousingId: weak.id,
  };
}

async function ok<T>(res: { status: number; body: unknown; text: string }, status: number, what: string): Promise<T> {
  if (res.status !== status) throw new Error(`${what} failed: ${res.status} ${res.text}`);
  return res.body as T;
}

export const createPlan = async (client: Client, lineId: string, over: Record<string, unknown> = {}) =>
  ok<PlanDto>(await client.post('/api/plans', planBody(lineId, over)), 201, 'creating a plan');

export const addPlanLot = async (client: Client, planId: string, lotId: string, volumeL?: number) =>
  ok<PlanDto>(await client.post(`/api/plans/${planId}/lots`, { lotId, volumeL }), 201, 'adding a lot');

export const addTrain = async (client: Client, planId: string, planLotId: string, body: unknown) =>
  ok<PlanDto>(await client.post(`/api/plans/${planId}/lots/${planLotId}/trains`, body), 201, 'adding a train');

let serialCounter = 0;

/** Registers `count` cartridges of a type and installs them in a housing; answers their ids and serials. */
export async function installCartridges(client: Client, typeId: string, housingId: string, count = 3, lengthIn = 30) {
  const out: { id: string; serial: string }[] = [];
  for (let i = 0; i < count; i += 1) {
    serialCounter += 1;
    const serial = `F${Date.now().toString(36).toUpperCase()}${process.pid}N${serialCounter}`;
    const reg = await ok<{ id: string }>(await client.post('/api/cartridges', { serial, batch: 'B-FIX', typeId, lengthIn, receivedAt: '2024-11-05' }), 201, 'registering a cartridge');
    await ok(await client.post(`/api/cartridges/${reg.id}/install`, { housingId }), 200, 'installing a cartridge');
    out.push({ id: reg.id, serial });
  }
  return out;
}

/** Fills the world's prefilter and membrane housings (3 rounds each) with cartridges of the planned types, so runs can start. */
export async function fillTrainHousings(client: Client, w: PlanWorld) {
  const prefilters = await installCartridges(client, w.prefilterTypeId, w.prefilterHousingId);
  const membranes = await installCartridges(client, w.membraneTypeId, w.membraneHousingId);
  return { prefilters, membranes };
}

let serials = 0;
/** Registers `howMany` 30-inch cartridges of each of the world's two types (through the API), so a plan is not short of stock. */
export async function stockPlanWorld(client: Client, w: PlanWorld, howMany = 12): Promise<void> {
  for (const typeId of [w.prefilterTypeId, w.membraneTypeId]) {
    for (let i = 0; i < howMany; i++) {
      serials += 1;
      await ok(await client.post('/api/cartridges', { serial: `PW-${Date.now().toString(36)}-${process.pid}-${serials}`, typeId, lengthIn: 30 }), 201, 'Register cartridge');
    }
  }
}

export type ReadyLot = { world: PlanWorld; plan: PlanDto; planLotId: string; trainId: string };

/**
 * A lot ready for a run: a plan on the world's first lot (6,000 L) with one two-stage train,
 * chosen and approved. The world's housings are filled with the planned cartridges first
 * unless `fill: false` (or a `world` set up by the caller is given with `fill: false`).
 */
export async function approvedPlanLot(
  owner: Client,
  opts: { world?: PlanWorld; fill?: boolean; name?: string; reason?: string } = {},
): Promise<ReadyLot> {
  const world = opts.world ?? (await createPlanWorld(owner));
  if (opts.fill !== false) await fillTrainHousings(owner, world);
  const plan = await createPlan(owner, world.lineId, { name: opts.name ?? 'Run day' });
  const planLotId = (await addPlanLot(owner, plan.id, world.lotId, 6000)).lots[0].id;
  const trainId = (await addTrain(owner, plan.id, planLotId, trainBody(world))).lots[0].trains[0].id;
  await ok(await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId }), 200, 'choosing the train');
  await ok(await owner.post(`/api/plans/${plan.id}/approve`, { reason: opts.reason ?? 'Test day: stock counted separately.' }), 200, 'approving the plan');
  return { world, plan, planLotId, trainId };
}

/** Starts the run of an approved plan lot as `client`; answers the run's id. */
export const startRun = async (client: Client, planLotId: string) => ok<{ id: string }>(await client.post('/api/runs', { planLotId }), 201, 'starting a run');

/**
 * A run on a new approved plan of a world whose housings are already filled
 * (`fillTrainHousings`); started by `as`, the owner unless told. Answers the run's id.
 */
export async function startedRunOn(owner: Client, world: PlanWorld, as: Client = owner) {
  const { planLotId } = await approvedPlanLot(owner, { world, fill: false });
  return startRun(as, planLotId);
}

/** A draft plan named `name` on a new world's first lot (6,000 L), no train yet. */
export async function draftPlanLot(client: Client, name: string) {
  const world = await createPlanWorld(client);
  const plan = await createPlan(client, world.lineId, { name });
  const planLotId = (await addPlanLot(client, plan.id, world.lotId, 6000)).lots[0].id;
  return { world, plan, planLotId };
}
