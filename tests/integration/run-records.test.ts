// @vitest-environment node
// Runs bound to the physical cartridges, and records that never vanish.
import { randomUUID } from 'node:crypto';
import { eq, sql } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { forecastRunFromReadings, requiredFlowLh } from '../../shared/engine';
import type { Role } from '../../shared/permissions';
import { cartridgesTable, planTrainsTable, runReadingsTable } from '../../server/db/schema';
import { createCartridgeType } from '../factories/equipment';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, installCartridges, trainBody, type PlanWorld } from '../factories/plans';
import { addMember, signUp, startTestApp, type Client, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
const members = {} as Record<Exclude<Role, 'owner'>, Client>;

beforeAll(async () => {
  app = await startTestApp();
  owner = (await signUp(app.baseUrl, { wineryName: 'Run Records Winery', name: 'Olga Owner' })).client;
  for (const role of ['cellar-master', 'winemaker', 'technician', 'auditor'] as const) {
    members[role] = (await addMember(app, owner, role)).client;
  }
});
afterAll(async () => {
  await app?.close();
});

/** An approved plan with one lot and the world's two-stage train (or the given stages). */
async function plannedLot(w: PlanWorld, stages?: unknown[]) {
  const plan = await createPlan(owner, w.lineId);
  const planLotId = (await addPlanLot(owner, plan.id, w.lotId, 6000)).lots[0].id;
  const trainId = (await addTrain(owner, plan.id, planLotId, trainBody(w, stages ? { stages } : {}))).lots[0].trains[0].id;
  expect((await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);
  expect((await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' })).status).toBe(200);
  return { planId: plan.id, planLotId };
}

const reading = (over: Record<string, unknown> = {}) => ({ clientKey: randomUUID(), stageIndex: 0, volumeL: 500, upstreamBar: 2.2, downstreamBar: 2.0, ...over });
type Reason = { stageIndex: number; code: string; message: string };
const codes = (res: { body: { error: { reasons?: Reason[] } } }) => (res.body.error.reasons ?? []).map((r) => `${String(r.stageIndex)}:${r.code}`).sort();

async function wineryId() {
  return (await owner.get('/api/me')).body.activeWineryId as string;
}

describe('starting a run checks the cartridges physically in the train', () => {
  it('refuses empty housings, for every role, and no override lifts it', async () => {
    const w = await createPlanWorld(owner);
    const { planLotId } = await plannedLot(w);
    const check = await members.technician.get(`/api/runs/start-check?planLotId=${planLotId}`);
    expect(check.status).toBe(200);
    expect(check.body.reasons.map((r: Reason) => r.code)).toEqual(['housing_empty', 'housing_empty']);
    const res = await members.technician.post('/api/runs', { planLotId });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('run_blocked');
    expect(codes(res)).toEqual(['0:housing_empty', '1:housing_empty']);
    expect(res.body.error.reasons[0].message).toMatch(/holds no cartridge\. Install 3 ×/);
    const overridden = await owner.post('/api/runs', { planLotId, override: { reason: 'We know better.' } });
    expect(overridden.status).toBe(409);
    expect(codes(overridden)).toEqual(['0:housing_empty', '1:housing_empty']);
  });

  it('a partly filled housing: refused; a technician cannot override; a cellar master starts with a reason kept on the run', async () => {
    const w = await createPlanWorld(owner);
    await installCartridges(owner, w.prefilterTypeId, w.prefilterHousingId, 2);
    await installCartridges(owner, w.membraneTypeId, w.membraneHousingId, 3);
    const { planLotId } = await plannedLot(w);
    const refused = await members.technician.post('/api/runs', { planLotId });
    expect(refused.status).toBe(409);
    expect(codes(refused)).toEqual(['0:housing_partial']);
    expect(refused.body.error.reasons[0].message).toMatch(/holds 2 of 3 cartridges/);
    expect((await members.technician.post('/api/runs', { planLotId, override: { reason: 'Only two in stock.' } })).status).toBe(403);
    expect((await members.winemaker.post('/api/runs', { planLotId, override: { reason: 'Only two in stock.' } })).status).toBe(403);
    const bad = await members['cellar-master'].post('/api/runs', { planLotId, override: { reason: '' } });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty(['override.reason']);
    const started = await members['cellar-master'].post('/api/runs', { planLotId, override: { reason: 'Only two in stock; third round blanked.' } });
    expect(started.status).toBe(201);
    expect(started.body.override).toMatchObject({ reason: 'Only two in stock; third round blanked.' });
    expect(started.body.override.checks.map((c: Reason) => c.code)).toEqual(['housing_partial']);
    expect(started.body.stages[0].cartridges).toHaveLength(2);
    expect(started.body.stages[1].cartridges).toHaveLength(3);
  });

  it('a type mismatch: refused with both ways out; "plan with what is installed" updates the train and the run starts', async () => {
    const w = await createPlanWorld(owner);
    // membranes sit in the prefilter housing
    await installCartridges(owner, w.membraneTypeId, w.prefilterHousingId, 3);
    await installCartridges(owner, w.membraneTypeId, w.membraneHousingId, 3);
    const { planLotId } = await plannedLot(w);
    const refused = await members.technician.post('/api/runs', { planLotId });
    expect(refused.status).toBe(409);
    expect(codes(refused)).toEqual(['0:type_mismatch']);
    expect(refused.body.error.reasons[0].message).toMatch(/plan with what is installed/);
    expect((await members.technician.post('/api/runs/plan-with-installed', { planLotId, stageIndex: 0 })).status).toBe(403);
    const planned = await members['cellar-master'].post('/api/runs/plan-with-installed', { planLotId, stageIndex: 0 });
    expect(planned.status).toBe(200);
    expect(planned.body.reasons).toEqual([]);
    expect(planned.body.stages[0].plannedTypeId).toBe(w.membraneTypeId);
    const started = await members.technician.post('/api/runs', { planLotId });
    expect(started.status).toBe(201);
    expect(started.body.override).toBeNull();
    expect(started.body.stages[0].cartridgeTypeId).toBe(w.membraneTypeId);
  });

  it('a type mismatch may be overridden by the owner with a reason', async () => {
    const w = await createPlanWorld(owner);
    await installCartridges(owner, w.membraneTypeId, w.prefilterHousingId, 3);
    await installCartridges(owner, w.membraneTypeId, w.membraneHousingId, 3);
    const { planLotId } = await plannedLot(w);
    const started = await owner.post('/api/runs', { planLotId, override: { reason: 'Double membrane by choice for this lot.' } });
    expect(started.status).toBe(201);
    expect(started.body.override.checks.map((c: Reason) => c.code)).toEqual(['type_mismatch']);
    // the snapshot is what is physically there, not the plan
    expect(started.body.stages[0].cartridges.every((c: { typeId: string }) => c.typeId === w.membraneTypeId)).toBe(true);
  });

  it('the same housing serving two stages is refused, and cannot be overridden', async () => {
    const w = await createPlanWorld(owner);
    await installCartridges(owner, w.prefilterTypeId, w.prefilterHousingId, 3);
    const stages = [
      { name: 'Prefilter', cartridgeTypeId: w.prefilterTypeId, housingId: w.prefilterHousingId, housingCount: 1, capacityLPerM2: 3000 },
      { name: 'Polish', cartridgeTypeId: w.prefilterTypeId, housingId: w.membraneHousingId, housingCount: 1, capacityLPerM2: 3000 },
    ];
    const { planLotId } = await plannedLot(w, stages);
    // Approval refuses one housing in two stages, so such a train can only come from an older
    // record or a hand edit: the run's own check still stops it.
    await app.db
      .update(planTrainsTable)
      .set({ stages: stages.map((st) => ({ ...st, housingId: w.prefilterHousingId })) })
      .where(eq(planTrainsTable.planLotId, planLotId));
    const refused = await owner.post('/api/runs', { planLotId, override: { reason: 'Try anyway.' } });
    expect(refused.status).toBe(409);
    expect(codes(refused)).toEqual(['1:housing_shared']);
  });

  it('a retired cartridge still in a housing and a spent one are refused; spent may be overridden, retired not', async () => {
    const w = await createPlanWorld(owner);
    const pre = await installCartridges(owner, w.prefilterTypeId, w.prefilterHousingId, 3);
    // a membrane type rated for one hot-water cycle: after one, it is spent
    const shortLived = await createCartridgeType(owner, { ratedHotWaterCycles: 1, ratedSteamCycles: 1, ratedChemicalCycles: 1 });
    const mem = await installCartridges(owner, shortLived.id, w.membraneHousingId, 3);
    expect((await members.technician.post(`/api/cartridges/${mem[0].id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20 })).status).toBe(201);
    const { planLotId } = await plannedLot(w, [
      { name: 'Prefilter', cartridgeTypeId: w.prefilterTypeId, housingId: w.prefilterHousingId, housingCount: 1, capacityLPerM2: 3000 },
      { name: 'Membrane', cartridgeTypeId: shortLived.id, housingId: w.membraneHousingId, housingCount: 1, capacityLPerM2: 2000 },
    ]);
    const spent = await members.technician.post('/api/runs', { planLotId });
    expect(spent.status).toBe(409);
    expect(codes(spent)).toEqual(['1:cartridge_spent']);
    expect(spent.body.error.reasons[0].message).toContain(mem[0].serial);

    // a cartridge marked retired but left in its round (as an old import could leave it)
    await app.db.update(cartridgesTable).set({ status: 'retired' }).where(eq(cartridgesTable.id, pre[0].id));
    const retired = await owner.post('/api/runs', { planLotId, override: { reason: 'Try anyway.' } });
    expect(retired.status).toBe(409);
    expect(codes(retired)).toContain('0:cartridge_retired');
    await app.db.update(cartridgesTable).set({ status: 'installed' }).where(eq(cartridgesTable.id, pre[0].id));

    const started = await members['cellar-master'].post('/api/runs', { planLotId, override: { reason: 'Last run before the new delivery.' } });
    expect(started.status).toBe(201);
    expect(started.body.override.checks.map((c: Reason) => c.code)).toEqual(['cartridge_spent']);
  });

  it('a membrane whose latest integrity test failed can never be overridden; a passing re-test clears it', async () => {
    const w = await createPlanWorld(owner);
    await installCartridges(owner, w.prefilterTypeId, w.prefilterHousingId, 3);
    const mem = await installCartridges(owner, w.membraneTypeId, w.membraneHousingId, 3);
    expect((await members.technician.post(`/api/cartridges/${mem[1].id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 1.1 })).status).toBe(201);
    const { planLotId } = await plannedLot(w);
    for (const c of [owner, members['cellar-master']]) {
      const res = await c.post('/api/runs', { planLotId, override: { reason: 'It was probably not wetted.' } });
      expect(res.status).toBe(409);
      expect(codes(res)).toEqual(['1:integrity_failed']);
      expect(res.body.error.reasons[0].message).toMatch(/re-test/);
    }
    const check = await owner.get(`/api/runs/start-check?planLotId=${planLotId}`);
    expect(check.body.reasons[0]).toMatchObject({ code: 'integrity_failed', overridable: false });
    expect((await members.technician.post(`/api/cartridges/${mem[1].id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3.6 })).status).toBe(201);
    expect((await members.technician.post('/api/runs', { planLotId })).status).toBe(201);
  });
});

describe('changes during a run and closing', () => {
  it('snapshots the cartridges at start and allocates to each exactly the litres it carried across a mid-run change and a regeneration', async () => {
    const w = await createPlanWorld(owner);
    const { prefilters, membranes } = await fillTrainHousings(owner, w);
    const fresh: { id: string; serial: string }[] = [];
    for (let i = 0; i < 3; i += 1) {
      const serial = `NEW${randomUUID().slice(0, 8).toUpperCase()}`;
      const reg = await owner.post('/api/cartridges', { serial, batch: 'B-NEW', typeId: w.prefilterTypeId, lengthIn: 30 });
      expect(reg.status).toBe(201);
      fresh.push({ id: reg.body.id, serial });
    }
    const { planLotId } = await plannedLot(w);
    const run = (await members.technician.post('/api/runs', { planLotId })).body;
    expect(run.stages[0].cartridges.map((c: { serial: string }) => c.serial).sort()).toEqual(prefilters.map((p) => p.serial).sort());
    expect(run.stages[0].cartridges[0]).toMatchObject({ batch: 'B-FIX', ratingUm: 1, lengthIn: 30, litresAtStart: 0, cyclesAtStart: 0, installedAtVolumeL: 0, removedAtVolumeL: null });
    expect(run.stages[0].cartridges[0].housingName).toMatch(/Housing/);

    const tech = members.technician;
    expect((await tech.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 1000, upstreamBar: 3.4 }))).status).toBe(201);
    // the prefilters reach terminal ΔP at 1,000 L: all three changed
    const change = await tech.post(`/api/runs/${run.id}/changes`, {
      stageIndex: 0,
      atVolumeL: 1000,
      removedCartridgeIds: prefilters.map((p) => p.id),
      installedCartridgeIds: fresh.map((p) => p.id),
      kind: 'change',
    });
    expect(change.status).toBe(201);
    expect(change.body.changes).toHaveLength(1);
    expect(change.body.changes[0]).toMatchObject({ kind: 'change', atVolumeL: 1000, stageIndex: 0 });
    expect(change.body.stages[0].cartridges).toHaveLength(6);
    // physically moved, in each cartridge's own history
    const out = (await owner.get(`/api/cartridges/${prefilters[0].id}`)).body;
    expect(out.status).toBe('in-stock');
    expect(out.events[0].kind).toBe('removed');
    expect((await owner.get(`/api/cartridges/${fresh[0].id}`)).body).toMatchObject({ status: 'installed', housingId: w.prefilterHousingId });

    // litres cannot go back before the last change; cartridges not in the stage are refused
    const back = await tech.post(`/api/runs/${run.id}/changes`, { stageIndex: 0, atVolumeL: 900, removedCartridgeIds: [fresh[0].id], kind: 'regeneration' });
    expect(back.status).toBe(400);
    expect(back.body.error.fields).toHaveProperty('atVolumeL');
    const stranger = await tech.post(`/api/runs/${run.id}/changes`, { stageIndex: 0, atVolumeL: 1200, removedCartridgeIds: [prefilters[0].id], installedCartridgeIds: [], kind: 'change' });
    expect(stranger.status).toBe(400);

    // the membranes are regenerated in place at 1,800 L
    const regen = await tech.post(`/api/runs/${run.id}/changes`, { stageIndex: 1, atVolumeL: 1800, removedCartridgeIds: membranes.map((m) => m.id), installedCartridgeIds: [], kind: 'regeneration', cycleKind: 'hot-water' });
    expect(regen.status).toBe(201);
    const memStints = regen.body.stages[1].cartridges as { cartridgeId: string; cyclesAtStart: number; installedAtVolumeL: number; litresAtStart: number }[];
    expect(memStints).toHaveLength(6);
    const second = memStints.find((s) => s.cartridgeId === membranes[0].id && s.installedAtVolumeL === 1800)!;
    expect(second).toMatchObject({ cyclesAtStart: 1, litresAtStart: 1800 });
    expect((await owner.get(`/api/cartridges/${membranes[0].id}`)).body).toMatchObject({ status: 'installed', hotWaterCycles: 1 });

    expect((await tech.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 2500 }))).status).toBe(201);
    const closed = await tech.post(`/api/runs/${run.id}/close`, { notes: 'Prefilters changed at 1,000 L.' });
    expect(closed.status).toBe(200);
    expect(closed.body.notes).toBe('Prefilters changed at 1,000 L.');
    expect(closed.body.closedByName).toBeTruthy();

    const litres = async (id: string) => (await owner.get(`/api/cartridges/${id}`)).body.litresFiltered as number;
    for (const p of prefilters) expect(await litres(p.id)).toBe(1000);
    for (const p of fresh) expect(await litres(p.id)).toBe(1500);
    for (const m of membranes) expect(await litres(m.id)).toBe(2500);
    const stints = closed.body.stages[0].cartridges as { cartridgeId: string; litresCarried: number }[];
    expect(stints.find((s) => s.cartridgeId === prefilters[0].id)!.litresCarried).toBe(1000);
    expect(stints.find((s) => s.cartridgeId === fresh[0].id)!.litresCarried).toBe(1500);
    const runEvents = (await owner.get(`/api/cartridges/${fresh[1].id}`)).body.events.filter((e: { kind: string }) => e.kind === 'run');
    expect(runEvents).toHaveLength(1);
    expect(runEvents[0].details).toMatchObject({ litres: 1500, runId: run.id });

    expect((await tech.post(`/api/runs/${run.id}/changes`, { stageIndex: 0, atVolumeL: 3000, removedCartridgeIds: [fresh[0].id], kind: 'regeneration' })).status).toBe(409);
  });
});

describe('a correction after the run closed re-allocates the litres', () => {
  type Ev = { id: string; kind: string; at: string; actorName: string | null; details: Record<string, unknown> };
  const cartridge = async (id: string) => (await owner.get(`/api/cartridges/${id}`)).body as { litresFiltered: number; events: Ev[] };

  it('correcting the last reading down: each cartridge carries the new figure, as a correction event beside the original run event, in the change log', async () => {
    const w = await createPlanWorld(owner);
    const { prefilters, membranes } = await fillTrainHousings(owner, w);
    const fresh: string[] = [];
    for (let i = 0; i < 3; i += 1) {
      const reg = await owner.post('/api/cartridges', { serial: `RA${randomUUID().slice(0, 8).toUpperCase()}`, batch: 'B-RA', typeId: w.prefilterTypeId, lengthIn: 30 });
      expect(reg.status).toBe(201);
      fresh.push(reg.body.id);
    }
    const { planLotId } = await plannedLot(w);
    const tech = members.technician;
    const run = (await tech.post('/api/runs', { planLotId })).body;
    expect((await tech.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 1000, upstreamBar: 2.3 }))).status).toBe(201);
    // the prefilters are changed at 1,000 L
    const change = await tech.post(`/api/runs/${run.id}/changes`, { stageIndex: 0, atVolumeL: 1000, removedCartridgeIds: prefilters.map((p) => p.id), installedCartridgeIds: fresh, kind: 'change' });
    expect(change.status).toBe(201);
    expect((await tech.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 2000, upstreamBar: 2.4 }))).status).toBe(201);
    const last = await tech.post(`/api/runs/${run.id}/readings`, reading({ stageIndex: 1, volumeL: 2600, upstreamBar: 2.0, downstreamBar: 1.8 }));
    expect(last.status).toBe(201);
    expect((await tech.post(`/api/runs/${run.id}/close`, {})).status).toBe(200);
    for (const m of membranes) expect((await cartridge(m.id)).litresFiltered).toBe(2600);
    for (const id of fresh) expect((await cartridge(id)).litresFiltered).toBe(1600);
    for (const p of prefilters) expect((await cartridge(p.id)).litresFiltered).toBe(1000);

    // 2,600 was typed for 2,300
    const corrected = await members['cellar-master'].post(`/api/runs/${run.id}/readings/${last.body.id}/correct`, {
      volumeL: 2300,
      upstreamBar: 2.0,
      downstreamBar: 1.8,
      reason: 'Meter read 2,300 L; 2,600 was a typing slip.',
    });
    expect(corrected.status).toBe(201);
    for (const m of membranes) expect((await cartridge(m.id)).litresFiltered).toBe(2300);
    for (const id of fresh) expect((await cartridge(id)).litresFiltered).toBe(1300);
    // the prefilters taken out at 1,000 L are not touched: no correction event for them
    for (const p of prefilters) {
      const c = await cartridge(p.id);
      expect(c.litresFiltered).toBe(1000);
      expect(c.events.filter((e) => e.kind === 'run-correction')).toHaveLength(0);
    }
    // the stints of the run carry the corrected litres
    const stints = [...corrected.body.stages[0].cartridges, ...corrected.body.stages[1].cartridges] as { cartridgeId: string; litresCarried: number }[];
    expect(stints.find((s) => s.cartridgeId === membranes[0].id)!.litresCarried).toBe(2300);
    expect(stints.find((s) => s.cartridgeId === fresh[0])!.litresCarried).toBe(1300);
    expect(stints.find((s) => s.cartridgeId === prefilters[0].id)!.litresCarried).toBe(1000);

    // the original run event is still there, unchanged; the correction is an event of its own, with who and why
    const mem = await cartridge(membranes[0].id);
    const runEvents = mem.events.filter((e) => e.kind === 'run' && e.details.runId === run.id);
    expect(runEvents).toHaveLength(1);
    expect(runEvents[0].details.litres).toBe(2600);
    const fixes = mem.events.filter((e) => e.kind === 'run-correction');
    expect(fixes).toHaveLength(1);
    expect(fixes[0].details).toMatchObject({ runId: run.id, litres: -300, litresBefore: 2600, litresAfter: 2300, correction: 'correct', readingId: last.body.id, reason: 'Meter read 2,300 L; 2,600 was a typing slip.' });
    expect(fixes[0].actorName).toBeTruthy();

    // the change log names the cartridge, the action and the litres from → to
    const log = (await owner.get(`/api/audit?kind=cartridge&recordId=${membranes[0].id}&action=correct`)).body.items as { userName: string; changes: Record<string, { before: unknown; after: unknown }> | null }[];
    expect(log).toHaveLength(1);
    expect(log[0].userName).toBeTruthy();
    expect(log[0].changes?.litresFiltered).toMatchObject({ before: 2600, after: 2300 });

    // a void of that reading: the end of the run falls back to the highest counted reading (2,000 L)
    const voided = await owner.post(`/api/runs/${run.id}/readings/${last.body.id}/void`, { reason: 'That reading was of the next lot.' });
    expect(voided.status).toBe(201);
    for (const m of membranes) expect((await cartridge(m.id)).litresFiltered).toBe(2000);
    for (const id of fresh) expect((await cartridge(id)).litresFiltered).toBe(1000);
    const after = await cartridge(membranes[0].id);
    expect(after.events.filter((e) => e.kind === 'run')).toHaveLength(1);
    expect(after.events.filter((e) => e.kind === 'run-correction').map((e) => e.details.litres).sort()).toEqual([-300, -300]);
    // the events of the run add up to what the cartridge carried
    const sum = after.events.filter((e) => e.details.runId === run.id && (e.kind === 'run' || e.kind === 'run-correction')).reduce((t, e) => t + Number(e.details.litres), 0);
    expect(sum).toBe(2000);

    // a correction that changes no litres writes no correction event
    const still = await owner.post(`/api/runs/${run.id}/readings/${last.body.id}/void`, { reason: 'Voided again, to be sure.' });
    expect(still.status).toBe(201);
    expect((await cartridge(membranes[0].id)).events.filter((e) => e.kind === 'run-correction')).toHaveLength(2);

    // the filtration record shows the corrected litres per cartridge
    const record = (await owner.get(`/api/records/lots/${w.lotId}`)).body;
    const rr = record.runs.find((x: { id: string }) => x.id === run.id);
    expect(rr.volumeFilteredL).toBe(2000);
    const recMem = rr.stages[1].cartridges.find((c: { cartridgeId: string }) => c.cartridgeId === membranes[0].id);
    expect(recMem.litresCarried).toBe(2000);
  });

  it('a correction while the run is open credits nothing until close', async () => {
    const w = await createPlanWorld(owner);
    const { membranes } = await fillTrainHousings(owner, w);
    const { planLotId } = await plannedLot(w);
    const run = (await members.technician.post('/api/runs', { planLotId })).body;
    const r1 = await members.technician.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 900 }));
    expect((await members.technician.post(`/api/runs/${run.id}/readings/${r1.body.id}/correct`, { volumeL: 800, upstreamBar: 2.2, downstreamBar: 2.0, reason: 'Typo.' })).status).toBe(201);
    expect((await cartridge(membranes[0].id)).litresFiltered).toBe(0);
    expect((await members.technician.post(`/api/runs/${run.id}/close`, {})).status).toBe(200);
    const c = await cartridge(membranes[0].id);
    expect(c.litresFiltered).toBe(800);
    expect(c.events.filter((e) => e.kind === 'run-correction')).toHaveLength(0);
  });
});

describe('records never vanish', () => {
  it('a lot, plan, cartridge, housing or type in a run cannot be deleted (409 in_record, nothing deleted); archive hides it from lists only', async () => {
    const w = await createPlanWorld(owner);
    const { prefilters } = await fillTrainHousings(owner, w);
    const { planId, planLotId } = await plannedLot(w);
    const run = (await members.technician.post('/api/runs', { planLotId })).body;
    await members.technician.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 800 }));

    for (const path of [
      `/api/lots/${w.lotId}`,
      `/api/plans/${planId}`,
      `/api/cartridges/${prefilters[0].id}`,
      `/api/housings/${w.prefilterHousingId}`,
      `/api/cartridge-types/${w.prefilterTypeId}`,
    ]) {
      const res = await owner.delete(path);
      expect(res.status, path).toBe(409);
      expect(res.body.error.code, path).toBe('in_record');
      expect(res.body.error.record, path).toMatchObject({ kind: 'run', id: run.id });
      expect(res.body.error.canArchive, path).toBe(true);
      expect(res.body.error.message, path).toMatch(/Archive it instead/);
    }
    expect((await owner.get(`/api/lots/${w.lotId}`)).status).toBe(200);
    expect((await owner.get(`/api/plans/${planId}`)).status).toBe(200);
    expect((await owner.get(`/api/runs/${run.id}`)).body.readingCount).toBe(1);

    // a manual SQL delete cannot cascade either
    await expect(app.db.execute(sql`delete from plans where id = ${planId}`)).rejects.toThrow();
    await expect(app.db.execute(sql`delete from lots where id = ${w.lotId}`)).rejects.toThrow();
    await expect(app.db.execute(sql`delete from runs where id = ${run.id}`)).rejects.toThrow();
    await expect(app.db.execute(sql`delete from cartridges where id = ${prefilters[0].id}`)).rejects.toThrow();
    expect((await app.db.select().from(runReadingsTable).where(eq(runReadingsTable.runId, run.id))).length).toBe(1);

    // archive: hidden from lists, shown with ?archived=true, still in the run
    const lotCode = (await owner.get(`/api/lots/${w.lotId}`)).body.code as string;
    expect((await members.auditor.post(`/api/lots/${w.lotId}/archive`)).status).toBe(403);
    const archived = await members.winemaker.post(`/api/lots/${w.lotId}/archive`);
    expect(archived.status).toBe(200);
    expect(archived.body.archived).toBe(true);
    expect((await owner.get(`/api/lots?q=${encodeURIComponent(lotCode)}`)).body.items).toEqual([]);
    const shown = (await owner.get(`/api/lots?q=${encodeURIComponent(lotCode)}&archived=true`)).body.items;
    expect(shown).toHaveLength(1);
    expect(shown[0].archivedAt).not.toBeNull();
    expect((await owner.get(`/api/runs/${run.id}`)).body.lotCode).toBe(lotCode);
    expect((await members.winemaker.post(`/api/lots/${w.lotId}/unarchive`)).status).toBe(200);
    expect((await owner.get(`/api/lots?q=${encodeURIComponent(lotCode)}`)).body.items).toHaveLength(1);

    const serial = prefilters[0].serial;
    expect((await owner.post(`/api/cartridges/${prefilters[0].id}/archive`)).status).toBe(200);
    expect((await owner.get(`/api/cartridges?q=${serial}`)).body.items).toEqual([]);
    expect((await owner.get(`/api/cartridges?q=${serial}&archived=true`)).body.items).toHaveLength(1);
    for (const [kind, id] of [
      ['plans', planId],
      ['housings', w.prefilterHousingId],
      ['cartridge-types', w.prefilterTypeId],
    ]) {
      expect((await owner.post(`/api/${kind}/${id}/archive`)).status, kind).toBe(200);
      expect((await owner.post(`/api/${kind}/${id}/unarchive`)).status, kind).toBe(200);
    }
  });

  it('a cartridge registered by mistake can still be deleted; one with care history cannot', async () => {
    const type = await createCartridgeType(owner);
    const bare = await owner.post('/api/cartridges', { serial: `BARE${randomUUID().slice(0, 6)}`, batch: 'X', typeId: type.id, lengthIn: 30 });
    expect((await members['cellar-master'].delete(`/api/cartridges/${bare.body.id}`)).status).toBe(403);
    expect((await owner.delete(`/api/cartridges/${bare.body.id}`)).status).toBe(204);
    expect((await owner.get(`/api/cartridges/${bare.body.id}`)).status).toBe(404);
    const cared = await owner.post('/api/cartridges', { serial: `CARE${randomUUID().slice(0, 6)}`, batch: 'X', typeId: type.id, lengthIn: 30 });
    expect((await members.technician.post(`/api/cartridges/${cared.body.id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 20 })).status).toBe(201);
    const refused = await owner.delete(`/api/cartridges/${cared.body.id}`);
    expect(refused.status).toBe(409);
    expect(refused.body.error).toMatchObject({ code: 'in_record', record: { kind: 'cartridge-history' } });
  });

  it('a plan cannot be reopened while a lot of it runs; after the run closed, reopening makes a new revision and keeps the approved one', async () => {
    const w = await createPlanWorld(owner);
    await fillTrainHousings(owner, w);
    const { planId, planLotId } = await plannedLot(w);
    const run = (await members.technician.post('/api/runs', { planLotId })).body;
    const refused = await members['cellar-master'].post(`/api/plans/${planId}/reopen`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('run_open');
    expect((await owner.patch(`/api/plans/${planId}`, { notes: 'edit' })).status).toBe(409);
    expect((await owner.delete(`/api/plans/${planId}`)).status).toBe(409);

    expect((await members.technician.post(`/api/runs/${run.id}/close`, {})).status).toBe(200);
    const reopened = await members['cellar-master'].post(`/api/plans/${planId}/reopen`);
    expect(reopened.status).toBe(200);
    expect(reopened.body.id).not.toBe(planId);
    expect(reopened.body).toMatchObject({ status: 'draft', revision: 2, previousPlanId: planId });
    expect(reopened.body.lots).toHaveLength(1);
    expect(reopened.body.lots[0].chosenTrainId).not.toBeNull();
    const kept = (await owner.get(`/api/plans/${planId}`)).body;
    expect(kept).toMatchObject({ status: 'approved', revision: 1 });
    expect(kept.approvedBy).toBeTruthy();
    expect((await owner.get(`/api/runs/${run.id}`)).body.planId).toBe(planId);
    // the approved plan was continued: a second reopen points to the revision
    expect((await members['cellar-master'].post(`/api/plans/${planId}/reopen`)).body.error.code).toBe('plan_revised');
    // the superseded plan's lot is no longer offered for a run
    const options = (await members.technician.get('/api/runs/start-options')).body.items as { planLotId: string }[];
    expect(options.some((o) => o.planLotId === planLotId)).toBe(false);
  });

  it('corrections keep the original, change the fit input, and a void leaves the fits', async () => {
    const w = await createPlanWorld(owner);
    await fillTrainHousings(owner, w);
    const { planLotId } = await plannedLot(w);
    const run = (await members.technician.post('/api/runs', { planLotId })).body;
    const tech = members.technician;
    const typed = [
      { volumeL: 500, dp: 0.2 },
      { volumeL: 1000, dp: 0.26 },
      { volumeL: 1500, dp: 3.4 }, // typed wrong: 0.34
      { volumeL: 2000, dp: 0.45 },
    ];
    const ids: string[] = [];
    for (const p of typed) {
      const res = await tech.post(`/api/runs/${run.id}/readings`, reading({ volumeL: p.volumeL, upstreamBar: 2 + p.dp, downstreamBar: 2 }));
      ids.push(res.body.id);
    }
    const before = (await owner.get(`/api/runs/${run.id}`)).body.stages[0];

    const bad = await tech.post(`/api/runs/${run.id}/readings/${ids[2]}/correct`, { volumeL: 1500, upstreamBar: 2.34, downstreamBar: 2 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('reason');
    const corrected = await tech.post(`/api/runs/${run.id}/readings/${ids[2]}/correct`, { volumeL: 1500, upstreamBar: 2.34, downstreamBar: 2, reason: 'Typed 3.4 for 0.34.' });
    expect(corrected.status).toBe(201);
    const stage = corrected.body.stages[0];
    const r = stage.readings.find((x: { id: string }) => x.id === ids[2]);
    expect(r.dpBar).toBeCloseTo(0.34, 9);
    expect(r.original).toMatchObject({ upstreamBar: 5.4, downstreamBar: 2 });
    expect(r.corrections[0]).toMatchObject({ kind: 'correct', reason: 'Typed 3.4 for 0.34.' });
    expect(r.corrections[0].byName).toBeTruthy();
    // the stored reading row is never changed
    const [row] = await app.db.select().from(runReadingsTable).where(eq(runReadingsTable.id, ids[2]));
    expect(row.upstreamBar).toBe(5.4);
    // the fit now uses the corrected value, as the engine does on the corrected points
    expect(stage.forecast.volumeLeftL).not.toBeCloseTo(before.forecast?.volumeLeftL ?? -1, 3);
    const flowLh = requiredFlowLh({ bottlesPerHour: 3000, bottleMl: 750 });
    const engine = forecastRunFromReadings({
      points: [
        { volumeL: 500, dpBar: 0.2 },
        { volumeL: 1000, dpBar: 0.26 },
        { volumeL: 1500, dpBar: 0.34 },
        { volumeL: 2000, dpBar: 0.45 },
      ].map((p) => ({ volumeL: p.volumeL, dpBar: 2 + p.dpBar - 2 })),
      terminalDpBar: stage.terminalDpBar,
      flowLh,
      currentVolumeL: 2000,
    });
    expect(stage.forecast.volumeLeftL).toBeCloseTo(engine.forecast.volumeLeftL, 4);

    const voided = await tech.post(`/api/runs/${run.id}/readings/${ids[3]}/void`, { reason: 'Gauge was being swapped.' });
    expect(voided.status).toBe(201);
    const after = voided.body.stages[0];
    expect(after.readings).toHaveLength(4);
    expect(after.readings.find((x: { id: string }) => x.id === ids[3]).voided).toBe(true);
    // three counted readings remain, the minimum for a fit
    expect(after.fit).not.toBeNull();
    expect((await members.auditor.post(`/api/runs/${run.id}/readings/${ids[1]}/void`, { reason: 'No.' })).status).toBe(403);
    expect((await tech.post(`/api/runs/${run.id}/readings/${randomUUID()}/void`, { reason: 'Missing one.' })).status).toBe(404);
  });

  it('every new route: roles and another winery (404)', async () => {
    const w = await createPlanWorld(owner);
    const { prefilters } = await fillTrainHousings(owner, w);
    const { planLotId } = await plannedLot(w);
    const run = (await members.technician.post('/api/runs', { planLotId })).body;
    const readingId = (await members.technician.post(`/api/runs/${run.id}/readings`, reading())).body.id as string;
    const change = { stageIndex: 0, atVolumeL: 600, removedCartridgeIds: [prefilters[0].id], kind: 'regeneration' };

    const auditor = members.auditor;
    expect((await auditor.get(`/api/runs/start-check?planLotId=${planLotId}`)).status).toBe(200);
    expect((await auditor.post(`/api/runs/${run.id}/changes`, change)).status).toBe(403);
    expect((await auditor.post(`/api/runs/${run.id}/readings/${readingId}/correct`, { volumeL: 1, upstreamBar: 2, downstreamBar: 1, reason: 'Nope.' })).status).toBe(403);
    expect((await auditor.post('/api/runs/plan-with-installed', { planLotId, stageIndex: 0 })).status).toBe(403);
    expect((await members.technician.post(`/api/housings/${w.prefilterHousingId}/archive`)).status).toBe(403);
    expect((await members.technician.post(`/api/plans/${randomUUID()}/archive`)).status).toBe(403);

    const other = (await signUp(app.baseUrl, { wineryName: 'Other Records Winery' })).client;
    expect((await other.get(`/api/runs/start-check?planLotId=${planLotId}`)).status).toBe(404);
    expect((await other.post('/api/runs/plan-with-installed', { planLotId, stageIndex: 0 })).status).toBe(404);
    expect((await other.post('/api/runs', { planLotId, override: { reason: 'Not mine.' } })).status).toBe(404);
    expect((await other.post(`/api/runs/${run.id}/changes`, change)).status).toBe(404);
    expect((await other.post(`/api/runs/${run.id}/readings/${readingId}/correct`, { volumeL: 1, upstreamBar: 2, downstreamBar: 1, reason: 'Not mine.' })).status).toBe(404);
    expect((await other.post(`/api/runs/${run.id}/readings/${readingId}/void`, { reason: 'Not mine.' })).status).toBe(404);
    expect((await other.delete(`/api/cartridges/${prefilters[0].id}`)).status).toBe(404);
    for (const [kind, id] of [
      ['lots', w.lotId],
      ['plans', run.planId],
      ['cartridges', prefilters[0].id],
      ['housings', w.prefilterHousingId],
      ['cartridge-types', w.prefilterTypeId],
    ]) {
      expect((await other.post(`/api/${kind}/${id}/archive`)).status, kind).toBe(404);
      expect((await other.post(`/api/${kind}/${id}/unarchive`)).status, kind).toBe(404);
    }
    // nothing of theirs changed
    expect((await owner.get(`/api/cartridges/${prefilters[0].id}`)).body.archivedAt).toBeNull();
    expect((await owner.get(`/api/runs/${run.id}`)).body.changes).toEqual([]);
    expect(await wineryId()).toBeTruthy();
  });
});
