// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { sizeTrain, type TrainSizingInput } from '../../shared/engine';
import type { PlanDto } from '../../shared/types/plans';
import { cartridgesTable } from '../../server/db/schema';
import { createLot } from '../factories/cellar';
import { createCartridgeType, createHousing, createLine } from '../factories/equipment';
import { addPlanLot, addTrain, createPlan, createPlanWorld, planBody, trainBody } from '../factories/plans';
import { setupApiApp } from '../support/api-app';
import { signUp, type Client } from '../support/test-app';

const app = setupApiApp({ wineryName: 'Plans Test Winery', members: true, world: 'bare' });

/** A draft with one lot and one train (not chosen yet). */
async function draftWithTrain(client: Client = app.owner, counts: [number, number] = [1, 1]) {
  const plan = await createPlan(client, app.world.lineId);
  const withLot = await addPlanLot(client, plan.id, app.world.lotId);
  const planLotId = withLot.lots[0].id;
  const withTrain = await addTrain(client, plan.id, planLotId, trainBody(app.world, {}, counts));
  return { plan: withTrain, planLotId, trainId: withTrain.lots[0].trains[0].id };
}

/** Cartridge rows straight into the database, in the owner's winery unless told. */
async function insertCartridges(typeId: string, lengthIn: number, status: 'in-stock' | 'installed' | 'regenerating', howMany: number, wineryId = app.wineryId) {
  await app.db.insert(cartridgesTable).values(
    Array.from({ length: howMany }, (_, i) => ({
      wineryId,
      serial: `PL-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}-${i}`,
      typeId,
      lengthIn,
      status,
    })),
  );
}

describe('plans: create, read, edit, delete', () => {
  it('an owner creates a plan, adds lots, trains, reorders and deletes the draft', async () => {
    const created = await app.owner.post('/api/plans', planBody(app.world.lineId, { name: 'June whites', startTime: '06:30', sanitationKind: 'steam' }));
    expect(created.status).toBe(201);
    const plan = created.body as PlanDto;
    expect(plan).toMatchObject({ name: 'June whites', status: 'draft', startTime: '06:30', sanitationKind: 'steam', lots: [], needs: [] });
    expect(plan.line?.id).toBe(app.world.lineId);
    expect(plan.requiredFlowLh).toBeCloseTo(3000 * 0.75 * 1.1, 6);
    expect(plan.createdBy).toBe('Test Owner');
    expect(plan.approvalBlockers).toEqual(['Add at least one lot to bottle.']);
    expect(plan.catalogue.cartridgeTypes.map((t) => t.id)).toEqual(expect.arrayContaining([app.world.prefilterTypeId, app.world.membraneTypeId]));

    // A lot defaults to its whole volume; a second one goes after it.
    const one = await addPlanLot(app.owner, plan.id, app.world.lotId);
    expect(one.lots).toHaveLength(1);
    expect(one.lots[0]).toMatchObject({ position: 1, volumeL: 6000, chosenTrainId: null, lot: { id: app.world.lotId, tempC: 12 } });
    const two = await addPlanLot(app.owner, plan.id, app.world.secondLotId, 2500);
    expect(two.lots.map((l) => [l.lot.id, l.position, l.volumeL])).toEqual([
      [app.world.lotId, 1, 6000],
      [app.world.secondLotId, 2, 2500],
    ]);
    const dup = await app.owner.post(`/api/plans/${plan.id}/lots`, { lotId: app.world.lotId });
    expect(dup.status).toBe(409);
    expect(dup.body.error.fields.lotId).toMatch(/already in the plan/);

    // Move the second lot up; change the volume.
    const second = two.lots[1].id;
    const moved = await app.owner.patch(`/api/plans/${plan.id}/lots/${second}`, { position: 1, volumeL: 2800 });
    expect(moved.status).toBe(200);
    expect(moved.body.lots.map((l: { id: string; position: number; volumeL: number }) => [l.id, l.position, l.volumeL])).toEqual([
      [second, 1, 2800],
      [two.lots[0].id, 2, 6000],
    ]);

    // Two trains for one lot; choose one.
    const a = await addTrain(app.owner, plan.id, second, trainBody(app.world));
    const b = await addTrain(app.owner, plan.id, second, trainBody(app.world, { name: 'Option B' }, [1, 2]));
    const lot = b.lots[0];
    expect(lot.trains.map((t) => t.name)).toEqual(['Option A', 'Option B']);
    const [trainA, trainB] = lot.trains;
    expect(trainA.sizing).not.toBeNull();
    expect(trainB.sizing!.stages[1].fluxLhPer10in).toBeCloseTo(trainA.sizing!.stages[1].fluxLhPer10in / 2, 9);
    expect(a.lots[0].trains).toHaveLength(1);
    const chosen = await app.owner.patch(`/api/plans/${plan.id}/lots/${second}`, { chosenTrainId: trainB.id });
    expect(chosen.body.lots[0].chosenTrainId).toBe(trainB.id);

    // Rename and restage a train; delete the chosen one and the lot has none chosen.
    const renamed = await app.owner.patch(`/api/plans/${plan.id}/lots/${second}/trains/${trainA.id}`, { name: 'Option A (wide)', stages: trainBody(app.world, {}, [2, 2]).stages });
    expect(renamed.status).toBe(200);
    const renamedTrain = renamed.body.lots[0].trains.find((t: { id: string }) => t.id === trainA.id);
    expect(renamedTrain.name).toBe('Option A (wide)');
    expect(renamedTrain.stages.map((s: { housingCount: number }) => s.housingCount)).toEqual([2, 2]);
    const afterDelete = await app.owner.delete(`/api/plans/${plan.id}/lots/${second}/trains/${trainB.id}`);
    expect(afterDelete.status).toBe(200);
    expect(afterDelete.body.lots[0].chosenTrainId).toBeNull();

    // Remove a lot: the rest close up.
    const removed = await app.owner.delete(`/api/plans/${plan.id}/lots/${second}`);
    expect(removed.body.lots.map((l: { position: number; lot: { id: string } }) => [l.lot.id, l.position])).toEqual([[app.world.lotId, 1]]);

    const patched = await app.owner.patch(`/api/plans/${plan.id}`, { name: 'June whites, revised', notes: 'Bring spare gaskets.' });
    expect(patched.status).toBe(200);
    expect(patched.body).toMatchObject({ name: 'June whites, revised', notes: 'Bring spare gaskets.' });

    expect((await app.owner.delete(`/api/plans/${plan.id}`)).status).toBe(204);
    expect((await app.owner.get(`/api/plans/${plan.id}`)).status).toBe(404);
  });

  it('cellar masters and winemakers draft and edit; technicians and auditors read only', async () => {
    for (const role of ['cellar-master', 'winemaker'] as const) {
      const c = app.members[role];
      const { plan, planLotId, trainId } = await draftWithTrain(c);
      expect((await c.patch(`/api/plans/${plan.id}`, { notes: `by ${role}` })).status).toBe(200);
      expect((await c.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);
      expect((await c.patch(`/api/plans/${plan.id}/lots/${planLotId}/trains/${trainId}`, { name: 'Mine' })).status).toBe(200);
      expect((await c.delete(`/api/plans/${plan.id}`)).status).toBe(204);
    }
    const { plan, planLotId, trainId } = await draftWithTrain();
    for (const role of ['technician', 'auditor'] as const) {
      const c = app.members[role];
      expect((await c.get('/api/plans')).status).toBe(200);
      const read = await c.get(`/api/plans/${plan.id}`);
      expect(read.status).toBe(200);
      expect(read.body.lots[0].trains[0].sizing).not.toBeNull();
      const writes = [
        await c.post('/api/plans', planBody(app.world.lineId)),
        await c.patch(`/api/plans/${plan.id}`, { notes: 'x' }),
        await c.delete(`/api/plans/${plan.id}`),
        await c.post(`/api/plans/${plan.id}/lots`, { lotId: app.world.secondLotId }),
        await c.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { volumeL: 100 }),
        await c.delete(`/api/plans/${plan.id}/lots/${planLotId}`),
        await c.post(`/api/plans/${plan.id}/lots/${planLotId}/trains`, trainBody(app.world)),
        await c.patch(`/api/plans/${plan.id}/lots/${planLotId}/trains/${trainId}`, { name: 'x' }),
        await c.delete(`/api/plans/${plan.id}/lots/${planLotId}/trains/${trainId}`),
        await c.post(`/api/plans/${plan.id}/approve`, { reason: 'Cartridges arrive the day before.' }),
        await c.post(`/api/plans/${plan.id}/reopen`),
        await c.post(`/api/plans/${plan.id}/done`),
      ];
      expect(writes.map((w) => w.status)).toEqual(writes.map(() => 403));
    }
    // A winemaker drafts but does not approve.
    await app.owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId });
    expect((await app.members.winemaker.post(`/api/plans/${plan.id}/approve`)).status).toBe(403);
    expect((await app.members['cellar-master'].post(`/api/plans/${plan.id}/approve`, { reason: 'Cartridges arrive the day before.' })).status).toBe(200);
  });

  it('lists with search, status filter, sorting and pages', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'List Winery' });
    const line = await createLine(client);
    for (const [name, date] of [
      ['Rosé day', '2025-05-02'],
      ['Reds day', '2025-04-10'],
      ['Whites day', '2025-06-20'],
    ]) {
      await createPlan(client, line.id, { name, plannedDate: date });
    }
    const lot = await createLot(client, { volumeL: 1234 });
    const list0 = (await client.get('/api/plans')).body;
    expect(list0.total).toBe(3);
    expect(list0.items.map((p: { name: string }) => p.name)).toEqual(['Reds day', 'Rosé day', 'Whites day']);
    const rose = list0.items[1];
    await addPlanLot(client, rose.id, lot.id);
    const desc = (await client.get('/api/plans?sort=name&order=desc&pageSize=2')).body;
    expect(desc.total).toBe(3);
    expect(desc.items.map((p: { name: string }) => p.name)).toEqual(['Whites day', 'Rosé day']);
    expect(desc.items[1]).toMatchObject({ lotCount: 1, volumeL: 1234, status: 'draft', line: { id: line.id } });
    const page2 = (await client.get('/api/plans?sort=name&order=desc&pageSize=2&page=2')).body;
    expect(page2.items.map((p: { name: string }) => p.name)).toEqual(['Reds day']);
    const q = (await client.get('/api/plans?q=ros')).body;
    expect(q.items.map((p: { name: string }) => p.name)).toEqual(['Rosé day']);
    expect((await client.get('/api/plans?status=approved')).body).toEqual({ items: [], total: 0 });
    const bad = await client.get('/api/plans?sort=colour&status=maybe&pageSize=0');
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.fields).sort()).toEqual(['pageSize', 'sort', 'status']);
  });
});

describe('plans: bad input and other wineries', () => {
  it('refuses bad input with a message per field', async () => {
    const empty = await app.owner.post('/api/plans', {});
    expect(empty.status).toBe(400);
    expect(Object.keys(empty.body.error.fields).sort()).toEqual(['lineId', 'name', 'plannedDate']);
    const wrong = await app.owner.post('/api/plans', planBody(app.world.lineId, { plannedDate: '2025-02-30', startTime: '25:00', sanitationKind: 'bleach' }));
    expect(wrong.status).toBe(400);
    expect(Object.keys(wrong.body.error.fields).sort()).toEqual(['plannedDate', 'sanitationKind', 'startTime']);
    expect(wrong.body.error.fields.startTime).toMatch(/HH:MM/);

    const { plan, planLotId, trainId } = await draftWithTrain();
    const noChange = await app.owner.patch(`/api/plans/${plan.id}`, {});
    expect(noChange.status).toBe(400);
    const badLot = await app.owner.post(`/api/plans/${plan.id}/lots`, { lotId: 'nope', volumeL: -4 });
    expect(badLot.status).toBe(400);
    expect(Object.keys(badLot.body.error.fields).sort()).toEqual(['lotId', 'volumeL']);
    const badPatch = await app.owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { volumeL: 0, position: 0 });
    expect(Object.keys(badPatch.body.error.fields).sort()).toEqual(['position', 'volumeL']);
    const badTrain = await app.owner.post(`/api/plans/${plan.id}/lots/${planLotId}/trains`, {
      name: '',
      stages: [{ cartridgeTypeId: app.world.membraneTypeId, housingId: app.world.membraneHousingId, housingCount: 0, capacityLPerM2: -1 }],
    });
    expect(badTrain.status).toBe(400);
    expect(Object.keys(badTrain.body.error.fields).sort()).toEqual(['name', 'stages.0.capacityLPerM2', 'stages.0.housingCount']);
    const noStages = await app.owner.patch(`/api/plans/${plan.id}/lots/${planLotId}/trains/${trainId}`, { stages: [] });
    expect(noStages.body.error.fields.stages).toBe('Add at least one stage.');
    // A train of another lot of the same plan cannot be chosen.
    const other = await addPlanLot(app.owner, plan.id, app.world.secondLotId);
    const wrongTrain = await app.owner.patch(`/api/plans/${plan.id}/lots/${other.lots[1].id}`, { chosenTrainId: trainId });
    expect(wrongTrain.status).toBe(400);
    expect(wrongTrain.body.error.fields.chosenTrainId).toMatch(/this lot/);
  });

  it('another winery’s plan is not found on every route, and its ids are refused as references', async () => {
    const { plan, planLotId, trainId } = await draftWithTrain();
    const { client: stranger } = await signUp(app.baseUrl, { wineryName: 'Other Winery' });
    const p = `/api/plans/${plan.id}`;
    const l = `${p}/lots/${planLotId}`;
    const t = `${l}/trains/${trainId}`;
    const answers = [
      await stranger.get(p),
      await stranger.patch(p, { notes: 'mine now' }),
      await stranger.delete(p),
      await stranger.post(`${p}/lots`, { lotId: app.world.lotId }),
      await stranger.patch(l, { volumeL: 10 }),
      await stranger.delete(l),
      await stranger.post(`${l}/trains`, trainBody(app.world)),
      await stranger.patch(t, { name: 'x' }),
      await stranger.delete(t),
      await stranger.post(`${p}/approve`),
      await stranger.post(`${p}/reopen`),
      await stranger.post(`${p}/done`),
    ];
    expect(answers.map((a) => a.status)).toEqual(answers.map(() => 404));
    expect((await stranger.get('/api/plans')).body.items.map((x: { id: string }) => x.id)).not.toContain(plan.id);
    expect((await app.owner.get(p)).body.notes).toBe('');
    // Not a uuid: also 404.
    expect((await app.owner.get('/api/plans/not-an-id')).status).toBe(404);
    expect((await app.owner.patch(`${p}/lots/xyz`, { volumeL: 1 })).status).toBe(404);

    // The stranger's own plan may not point at this winery's line, lot, types or housings.
    const theirLine = await createLine(stranger);
    expect((await stranger.post('/api/plans', planBody(app.world.lineId))).body.error.fields).toEqual({ lineId: expect.any(String) });
    const theirs = await createPlan(stranger, theirLine.id);
    expect((await stranger.patch(`/api/plans/${theirs.id}`, { lineId: app.world.lineId })).status).toBe(400);
    const foreignLot = await stranger.post(`/api/plans/${theirs.id}/lots`, { lotId: app.world.lotId });
    expect(foreignLot.status).toBe(400);
    expect(foreignLot.body.error.fields).toEqual({ lotId: expect.any(String) });
    const ownLot = await createLot(stranger);
    const withLot = await addPlanLot(stranger, theirs.id, ownLot.id);
    const foreignTrain = await stranger.post(`/api/plans/${theirs.id}/lots/${withLot.lots[0].id}/trains`, trainBody(app.world));
    expect(foreignTrain.status).toBe(400);
    expect(Object.keys(foreignTrain.body.error.fields).sort()).toEqual([
      'stages.0.cartridgeTypeId',
      'stages.0.housingId',
      'stages.1.cartridgeTypeId',
      'stages.1.housingId',
    ]);
    // The catalogue the stranger sees is their own.
    expect((await stranger.get(`/api/plans/${theirs.id}`)).body.catalogue.cartridgeTypes).toEqual([]);
  });
});

describe('plans: approval and status', () => {
  it('refuses approval without chosen trains or with a broken rating, then approves, locks, reopens and marks done', async () => {
    const { plan, planLotId, trainId } = await draftWithTrain();
    const code = plan.lots[0].lot.code;
    const refused = await app.owner.post(`/api/plans/${plan.id}/approve`);
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('plan_not_ready');
    expect(Object.values(refused.body.error.fields)).toEqual([`${code}: choose the train to use.`]);

    // A train through a housing rated 1 bar breaks its rating: refused with the reason.
    const weak = await addTrain(app.owner, plan.id, planLotId, {
      name: 'Weak',
      stages: [
        { cartridgeTypeId: app.world.prefilterTypeId, housingId: app.world.prefilterHousingId, housingCount: 1 },
        { cartridgeTypeId: app.world.membraneTypeId, housingId: app.world.weakHousingId, housingCount: 1 },
      ],
    });
    const weakTrain = weak.lots[0].trains.find((t) => t.name === 'Weak')!;
    expect(weakTrain.blockingReasons[0]).toMatch(/above the housing's 1\.00 bar rating/);
    await app.owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: weakTrain.id });
    const blocked = await app.owner.post(`/api/plans/${plan.id}/approve`);
    expect(blocked.status).toBe(409);
    expect(Object.values(blocked.body.error.fields).join(' ')).toMatch(/Weak.*housing's 1\.00 bar rating/);

    await app.owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId });
    const approved = await app.members['cellar-master'].post(`/api/plans/${plan.id}/approve`, { reason: 'Cartridges arrive the day before.' });
    expect(approved.status).toBe(200);
    expect(approved.body).toMatchObject({ status: 'approved', approvedBy: 'Test cellar-master', approvalBlockers: [] });
    expect(approved.body.approvedAt).toEqual(expect.any(String));

    // Read-only now.
    const p = `/api/plans/${plan.id}`;
    const edits = [
      await app.owner.patch(p, { notes: 'late change' }),
      await app.owner.delete(p),
      await app.owner.post(`${p}/lots`, { lotId: app.world.secondLotId }),
      await app.owner.patch(`${p}/lots/${planLotId}`, { volumeL: 10 }),
      await app.owner.delete(`${p}/lots/${planLotId}`),
      await app.owner.post(`${p}/lots/${planLotId}/trains`, trainBody(app.world)),
      await app.owner.patch(`${p}/lots/${planLotId}/trains/${trainId}`, { name: 'x' }),
      await app.owner.delete(`${p}/lots/${planLotId}/trains/${trainId}`),
      await app.owner.post(`${p}/approve`),
    ];
    expect(edits.map((e) => e.status)).toEqual(edits.map(() => 409));
    expect(edits[0].body.error.message).toMatch(/reopen/);

    // Reopen → draft (approval cleared), approve again, mark done: final.
    const reopened = await app.owner.post(`${p}/reopen`);
    expect(reopened.body).toMatchObject({ status: 'draft', approvedBy: null, approvedAt: null });
    expect((await app.owner.post(`${p}/done`)).status).toBe(409);
    expect((await app.owner.post(`${p}/reopen`)).status).toBe(409);
    expect((await app.owner.post(`${p}/approve`, { reason: 'Cartridges arrive the day before.' })).status).toBe(200);
    const done = await app.owner.post(`${p}/done`);
    expect(done.body.status).toBe('done');
    expect((await app.owner.post(`${p}/reopen`)).status).toBe(409);
    expect((await app.owner.post(`${p}/done`)).status).toBe(409);
    expect((await app.owner.patch(p, { notes: 'x' })).status).toBe(409);
    expect((await app.owner.delete(p)).status).toBe(409);
    expect((await app.owner.get(`/api/plans?status=done`)).body.items.map((x: { id: string }) => x.id)).toContain(plan.id);
  });
});

describe('plans: the engine’s figures', () => {
  it('each train’s sizing equals sizeTrain on the same input; the day follows the clock', async () => {
    const { plan } = await draftWithTrain(app.owner, [1, 2]);
    const dto = (await app.owner.get(`/api/plans/${plan.id}`)).body as PlanDto;
    const types = dto.catalogue.cartridgeTypes;
    const pre = types.find((t) => t.id === app.world.prefilterTypeId)!;
    const mem = types.find((t) => t.id === app.world.membraneTypeId)!;
    const asEngine = (t: typeof pre, capacityLPerM2: number) => ({
      kind: t.kind,
      ratingUm: t.ratingUm,
      areaM2Per10in: t.areaM2Per10in,
      waterFlowLhPer10in: t.waterFlowLhPer10in,
      waterDpBar: t.waterDpBar,
      maxDpForwardBar: t.maxDpForwardBar,
      maxTempC: t.maxTempC,
      terminalDpBar: t.terminalDpBar,
      designFluxLhPer10in: t.designFluxLhPer10in,
      capacityLPerM2,
      regenerable: t.maxDpReverseBar !== null,
      serviceLifeLoads: t.maxDpReverseBar !== null && t.ratedHotWaterCycles ? t.ratedHotWaterCycles + 1 : undefined,
      pricePer10in: t.pricePer10in ?? undefined,
      currency: t.currency,
    });
    const housing = { rounds: 3, lengthIn: 30 as const, holdUpL: 16, maxTempC: 140 };
    const input: TrainSizingInput = {
      wine: { tempC: 12, ethanolPctVol: 12.5, sugarGPerL: 2 },
      line: { bottlesPerHour: 3000, bottleMl: 750 },
      batchL: 6000,
      stages: [
        { name: 'Prefilter', housingId: app.world.prefilterHousingId, cartridgeType: asEngine(pre, 3000), housing: { ...housing, maxPressureBar: 8 }, housingCount: 1 },
        { name: 'Membrane', housingId: app.world.membraneHousingId, cartridgeType: asEngine(mem, 2000), housing: { ...housing, maxPressureBar: 10 }, housingCount: 2 },
      ],
      sanitation: { kind: 'hot-water' },
    };
    expect(dto.lots[0].trains[0].sizing).toEqual(JSON.parse(JSON.stringify(sizeTrain(input))));
    const s = dto.lots[0].trains[0].sizing!;
    expect(s.stages[1].elementEquivalents).toBe(18);
    expect(s.stages[1].fluxLhPer10in).toBeCloseTo(2475 / 18, 9);

    const day = dto.timeline!;
    expect(day.blocks.map((b) => [b.kind, b.start, b.end])).toEqual([
      ['sanitation', '07:00', '07:30'],
      ['sanitation', '07:30', '07:45'],
      ['integrity-before', '07:45', '08:05'],
      ['run', '08:05', expect.any(String)],
      ['push-out', expect.any(String), expect.any(String)],
      ['integrity-after', expect.any(String), day.end],
    ]);
    const run = day.blocks[3];
    expect(run.minutes).toBeCloseTo((6000 / 2475) * 60, 6);
    expect(run.planLotId).toBe(dto.lots[0].id);

    // Steam and a later start move every block.
    const steam = await app.owner.patch(`/api/plans/${plan.id}`, { sanitationKind: 'steam', startTime: '22:30' });
    const blocks = steam.body.timeline.blocks;
    expect(blocks[0]).toMatchObject({ label: 'Steam sanitation', start: '22:30', end: '23:15', startDayOffset: 0 });
    expect(steam.body.timeline.endDayOffset).toBe(1);
  });

  it('lists the cartridges the chosen trains need against stock and installed, with the shortfall', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Stock Winery' });
    const w = await createPlanWorld(client);
    const plan = await createPlan(client, w.lineId);
    const withLot = await addPlanLot(client, plan.id, w.lotId);
    const planLotId = withLot.lots[0].id;
    // Prefilter: 1 housing × 3 rounds; membrane: 2 housings × 3 rounds = 6 cartridges of 30 in.
    const t = await addTrain(client, plan.id, planLotId, trainBody(w, {}, [1, 2]));
    expect(t.needs).toEqual([]); // nothing chosen yet
    const trainId = t.lots[0].trains[0].id;
    const sizing = t.lots[0].trains[0].sizing!;
    const me = (await client.get('/api/me')).body;
    const winery = me.activeWineryId as string;
    const add = async (typeId: string, lengthIn: number, status: 'in-stock' | 'installed' | 'regenerating', howMany: number) =>
      insertCartridges(typeId, lengthIn, status, howMany, winery);
    await add(w.membraneTypeId, 30, 'in-stock', 2);
    await add(w.membraneTypeId, 30, 'installed', 1);
    await add(w.membraneTypeId, 30, 'regenerating', 4); // not counted as available
    await add(w.membraneTypeId, 20, 'in-stock', 9); // wrong length: not counted
    await add(w.prefilterTypeId, 30, 'in-stock', 5);

    const chosen = (await client.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).body as PlanDto;
    const pre = chosen.needs.find((n) => n.cartridgeTypeId === w.prefilterTypeId)!;
    const mem = chosen.needs.find((n) => n.cartridgeTypeId === w.membraneTypeId)!;
    expect(chosen.needs.map((n) => n.kind)).toEqual(['prefilter', 'membrane']);
    const preSets = sizing.stages[0].setsUsed;
    const memSets = sizing.stages[1].setsUsed;
    expect(pre).toMatchObject({ lengthIn: 30, cartridgesNeeded: 3 * preSets, elementEquivalentsNeeded: 9 * preSets, inStock: 5, installed: 0, cartridgesAvailable: 5 });
    expect(pre.shortfall).toBe(Math.max(0, 3 * preSets - 5));
    expect(mem).toMatchObject({
      lengthIn: 30,
      cartridgesNeeded: 6 * memSets,
      elementEquivalentsNeeded: 18 * memSets,
      inStock: 2,
      installed: 1,
      cartridgesAvailable: 3,
      elementEquivalentsAvailable: 9,
      shortfall: 6 * memSets - 3,
      verdict: 'short',
      lotCodes: [chosen.lots[0].lot.code],
    });
    // Stock does not stop approval; it is shown beside it.
    expect(chosen.approvalBlockers).toEqual([]);
  });
});

describe('plans: engine edge cases stay answers, not failures', () => {
  it('a train whose catalogue entry is gone shows why it cannot be sized', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Edge Winery' });
    const w = await createPlanWorld(client);
    const spare = await createCartridgeType(client, { name: 'Spare membrane' });
    const spareHousing = await createHousing(client);
    const plan = await createPlan(client, w.lineId);
    const withLot = await addPlanLot(client, plan.id, w.lotId);
    const planLotId = withLot.lots[0].id;
    const t = await addTrain(client, plan.id, planLotId, {
      name: 'Soon gone',
      stages: [{ cartridgeTypeId: spare.id, housingId: spareHousing.id, housingCount: 1 }],
    });
    expect(t.lots[0].trains[0].sizing).not.toBeNull();
    expect((await client.delete(`/api/cartridge-types/${spare.id}`)).status).toBe(204);
    const after = (await client.get(`/api/plans/${plan.id}`)).body as PlanDto;
    expect(after.lots[0].trains[0]).toMatchObject({ sizing: null, sizingError: expect.stringMatching(/choose a cartridge type/) });
    await client.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: t.lots[0].trains[0].id });
    const refused = await client.post(`/api/plans/${plan.id}/approve`);
    expect(refused.status).toBe(409);
    // Deleting the line leaves the plan asking for one.
    expect((await client.delete(`/api/lines/${w.lineId}`)).status).toBe(204);
    const noLine = (await client.get(`/api/plans/${plan.id}`)).body as PlanDto;
    expect(noLine.line).toBeNull();
    expect(noLine.timeline).toBeNull();
    expect(noLine.approvalBlockers[0]).toMatch(/bottling line/);
  });
});
