// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { forecastRunFromReadings, requiredFlowLh, runAlarm } from '../../shared/engine';
import { addPlanLot, addTrain, createPlan, createPlanWorld, installCartridges, trainBody, type PlanWorld } from '../factories/plans';
import { setupApiApp } from '../support/api-app';
import { signUp } from '../support/test-app';

const app = setupApiApp({ wineryName: 'Runs Test Winery', members: true, world: 'filled' });

/** A plan with one lot (6,000 L) and a chosen two-stage train; approved unless told. */
async function plannedLot(opts: { approve?: boolean; w?: PlanWorld } = {}) {
  const w = opts.w ?? app.world;
  const plan = await createPlan(app.owner, w.lineId);
  const withLot = await addPlanLot(app.owner, plan.id, w.lotId, 6000);
  const planLotId = withLot.lots[0].id;
  const withTrain = await addTrain(app.owner, plan.id, planLotId, trainBody(w));
  const trainId = withTrain.lots[0].trains[0].id;
  expect((await app.owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: trainId })).status).toBe(200);
  if (opts.approve !== false) expect((await app.owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Cartridges arrive the day before.' })).status).toBe(200);
  return { planId: plan.id, planLotId };
}

async function startedRun(w?: PlanWorld) {
  const { planLotId } = await plannedLot({ w });
  const res = await app.members.technician.post('/api/runs', { planLotId });
  expect(res.status).toBe(201);
  return res.body as { id: string; stages: { index: number; terminalDpBar: number }[] };
}

const reading = (over: Record<string, unknown> = {}) => ({
  clientKey: randomUUID(),
  stageIndex: 0,
  volumeL: 500,
  upstreamBar: 2.2,
  downstreamBar: 2.0,
  ...over,
});

describe('runs', () => {
  it('starts only from an approved plan’s lot with a chosen train, one running run per lot', async () => {
    const draft = await plannedLot({ approve: false });
    const refused = await app.owner.post('/api/runs', { planLotId: draft.planLotId });
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/approved/);

    const { planLotId } = await plannedLot();
    const res = await app.members.technician.post('/api/runs', { planLotId });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ status: 'running', planLotId, volumeL: 6000, currentVolumeL: 0, readingCount: 0 });
    expect(res.body.stages.map((s: { name: string }) => s.name)).toEqual(['Prefilter', 'Membrane']);
    expect(res.body.stages[0].note).toMatch(/3 more readings/);
    expect(res.body.stages[0].fit).toBeNull();

    const again = await app.owner.post('/api/runs', { planLotId });
    expect(again.status).toBe(409);

    const options = await app.members.technician.get('/api/runs/start-options');
    expect(options.status).toBe(200);
    const mine = options.body.items.find((o: { planLotId: string }) => o.planLotId === planLotId);
    expect(mine.runningRunId).toBe(res.body.id);
    expect(options.body.items.some((o: { planLotId: string }) => o.planLotId === draft.planLotId)).toBe(false);

    const list = await app.members.auditor.get('/api/runs');
    expect(list.status).toBe(200);
    expect(list.body.items.some((r: { id: string }) => r.id === res.body.id)).toBe(true);

    const bad = await app.owner.post('/api/runs', { planLotId: 'nope' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty('planLotId');
  });

  it('technicians log readings; auditors read only; another winery gets 404 everywhere', async () => {
    const run = await startedRun();
    expect((await app.members.technician.post(`/api/runs/${run.id}/readings`, reading())).status).toBe(201);
    expect((await app.members.winemaker.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 600 }))).status).toBe(201);
    const auditor = app.members.auditor;
    expect((await auditor.get(`/api/runs/${run.id}`)).status).toBe(200);
    expect((await auditor.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 700 }))).status).toBe(403);
    expect((await auditor.post(`/api/runs/${run.id}/close`)).status).toBe(403);
    const { planLotId } = await plannedLot();
    expect((await auditor.post('/api/runs', { planLotId })).status).toBe(403);

    const other = (await signUp(app.baseUrl, { wineryName: 'Other Runs Winery' })).client;
    expect((await other.get(`/api/runs/${run.id}`)).status).toBe(404);
    expect((await other.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 800 }))).status).toBe(404);
    expect((await other.post(`/api/runs/${run.id}/close`)).status).toBe(404);
    expect((await other.post('/api/runs', { planLotId })).status).toBe(404);
    expect((await other.get('/api/runs')).body.items).toEqual([]);
    expect((await app.owner.get(`/api/runs/${randomUUID()}`)).status).toBe(404);
  });

  it('stores a resent reading once and refuses falling litres, downstream above upstream, a closed run', async () => {
    const run = await startedRun();
    const tech = app.members.technician;
    const body = reading({ volumeL: 1000 });
    const first = await tech.post(`/api/runs/${run.id}/readings`, body);
    const second = await tech.post(`/api/runs/${run.id}/readings`, body);
    expect(first.status).toBe(201);
    expect(second.status).toBe(201);
    expect(second.body.id).toBe(first.body.id);
    expect(first.body).toMatchObject({ clientKey: body.clientKey, volumeL: 1000, dpBar: expect.closeTo(0.2, 9) });
    expect((await tech.get(`/api/runs/${run.id}`)).body.readingCount).toBe(1);

    const falling = await tech.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 900 }));
    expect(falling.status).toBe(400);
    expect(falling.body.error.fields.volumeL).toMatch(/1000 L/);
    // another stage keeps its own litres
    expect((await tech.post(`/api/runs/${run.id}/readings`, reading({ stageIndex: 1, volumeL: 900 }))).status).toBe(201);

    const inverted = await tech.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 1100, upstreamBar: 1, downstreamBar: 1.5 }));
    expect(inverted.status).toBe(400);
    expect(inverted.body.error.fields).toHaveProperty('downstreamBar');

    const invalid = await tech.post(`/api/runs/${run.id}/readings`, { stageIndex: 7, volumeL: -1, upstreamBar: 'x' });
    expect(invalid.status).toBe(400);
    expect(Object.keys(invalid.body.error.fields).sort()).toEqual(['clientKey', 'downstreamBar', 'upstreamBar', 'volumeL']);
    expect((await tech.post(`/api/runs/${run.id}/readings`, reading({ stageIndex: 5, volumeL: 1200 }))).body.error.fields).toHaveProperty('stageIndex');

    expect((await tech.post(`/api/runs/${run.id}/close`)).status).toBe(200);
    expect((await tech.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 1300 }))).status).toBe(409);
    // the already stored reading still answers after the close (a late retry)
    expect((await tech.post(`/api/runs/${run.id}/readings`, body)).body.id).toBe(first.body.id);
    expect((await tech.post(`/api/runs/${run.id}/close`)).status).toBe(409);
  });

  it('fits and forecasts each stage after three readings, as the engine does on the same points', async () => {
    const run = await startedRun();
    const points = [
      { volumeL: 500, dpBar: 0.2 },
      { volumeL: 1000, dpBar: 0.26 },
      { volumeL: 1500, dpBar: 0.34 },
      { volumeL: 2000, dpBar: 0.45 },
    ];
    for (const p of points.slice(0, 2)) {
      expect((await app.members.technician.post(`/api/runs/${run.id}/readings`, reading({ volumeL: p.volumeL, upstreamBar: 2 + p.dpBar, downstreamBar: 2 }))).status).toBe(201);
    }
    const early = (await app.owner.get(`/api/runs/${run.id}`)).body;
    expect(early.stages[0].fit).toBeNull();
    expect(early.stages[0].note).toMatch(/1 more reading/);

    for (const p of points.slice(2)) {
      await app.members.technician.post(`/api/runs/${run.id}/readings`, reading({ volumeL: p.volumeL, upstreamBar: 2 + p.dpBar, downstreamBar: 2 }));
    }
    const detail = (await app.owner.get(`/api/runs/${run.id}`)).body;
    const stage = detail.stages[0];
    expect(stage.readings).toHaveLength(4);
    expect(stage.fit).not.toBeNull();
    expect(stage.forecast).not.toBeNull();
    expect(stage.curve.length).toBeGreaterThan(2);
    const flowLh = requiredFlowLh({ bottlesPerHour: 3000, bottleMl: 750 });
    expect(stage.flowLh).toBeCloseTo(flowLh, 9);
    const stored = stage.readings.map((r: { volumeL: number; dpBar: number }) => ({ volumeL: r.volumeL, dpBar: r.dpBar }));
    const engine = forecastRunFromReadings({ points: stored, terminalDpBar: stage.terminalDpBar, flowLh, currentVolumeL: 2000 });
    expect(stage.forecast.law).toBe(engine.forecast.law);
    expect(stage.forecast.volumeLeftL).toBeCloseTo(engine.forecast.volumeLeftL, 6);
    expect(stage.forecast.low).toBeCloseTo(engine.forecast.low, 6);
    expect(stage.forecast.high).toBeCloseTo(engine.forecast.high, 6);
    expect(stage.fit.dp0Bar).toBeCloseTo(engine.fits.find((f) => f.law === engine.forecast.law)!.dp0Bar, 9);
    expect(detail.volumeToBottleL).toBe(4000);
    expect(stage.alarm).toEqual(runAlarm({ forecast: engine.forecast, volumeToBottleL: 4000 }));
    // the membrane stage has no readings yet
    expect(detail.stages[1].fit).toBeNull();
  });

  it('closing adds the run’s litres to each cartridge installed in the train’s housings, with a run event', async () => {
    // a world of its own, whose prefilter housing holds this test's cartridge
    const own = await createPlanWorld(app.owner);
    const serial = `RUN${Date.now().toString(36).toUpperCase()}`;
    const reg = await app.owner.post('/api/cartridges', { serial, batch: 'B1', typeId: own.prefilterTypeId, lengthIn: 30, receivedAt: '2024-11-05' });
    expect(reg.status).toBe(201);
    expect((await app.members.technician.post(`/api/cartridges/${reg.body.id}/install`, { housingId: own.prefilterHousingId })).status).toBe(200);
    await installCartridges(app.owner, own.prefilterTypeId, own.prefilterHousingId, 2);
    await installCartridges(app.owner, own.membraneTypeId, own.membraneHousingId, 3);
    const run = await startedRun(own);
    const spare = await app.owner.post('/api/cartridges', { serial: `${serial}S`, batch: 'B1', typeId: own.prefilterTypeId, lengthIn: 30, receivedAt: '2024-11-05' });
    expect(spare.status).toBe(201);
    const before = (await app.owner.get(`/api/cartridges/${reg.body.id}`)).body.litresFiltered as number;

    await app.members.technician.post(`/api/runs/${run.id}/readings`, reading({ volumeL: 1200 }));
    await app.members.technician.post(`/api/runs/${run.id}/readings`, reading({ stageIndex: 1, volumeL: 1800 }));
    const closed = await app.members.technician.post(`/api/runs/${run.id}/close`, { notes: 'Done at noon.' });
    expect(closed.status).toBe(200);
    expect(closed.body).toMatchObject({ status: 'closed', notes: 'Done at noon.' });
    expect(closed.body.closedAt).not.toBeNull();

    const after = (await app.owner.get(`/api/cartridges/${reg.body.id}`)).body;
    expect(after.litresFiltered).toBeCloseTo(before + 1800, 9);
    const runEvents = (after.events as { kind: string; housingId: string | null; details: Record<string, unknown> }[]).filter((e) => e.kind === 'run');
    expect(runEvents).toHaveLength(1);
    expect(runEvents[0].housingId).toBe(own.prefilterHousingId);
    expect(runEvents[0].details).toMatchObject({ litres: 1800, runId: run.id });
    expect(typeof runEvents[0].details.lotCode).toBe('string');
    // a cartridge in stock (not installed) is left alone
    expect((await app.owner.get(`/api/cartridges/${spare.body.id}`)).body.litresFiltered).toBe(0);
  });
});
