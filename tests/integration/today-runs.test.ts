// @vitest-environment node
// Today lists the runs in progress: each stage's latest ΔP, the forecast and the alarm, the same
// figures as the run page (corrections and voids applied), one winery's runs only, closed runs gone.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunInProgressDto } from '../../shared/types/runs';
import { addPlanLot, addTrain, createPlan, createPlanWorld, fillTrainHousings, trainBody } from '../factories/plans';
import { addMember, Client, signUp, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;
let owner: Client;
let tech: Client;
let other: Client;
const runIds: string[] = [];
let lotCode = '';
let planName = '';

/** A started run of the world's lot through its two-stage train, with `volumeL` to bottle. */
async function startedRun(volumeL: number) {
  const w = await createPlanWorld(owner);
  await fillTrainHousings(owner, w);
  const plan = await createPlan(owner, w.lineId, { plannedDate: '2031-05-05' });
  const withLot = await addPlanLot(owner, plan.id, w.lotId, volumeL);
  const planLotId = withLot.lots[0].id;
  const t = await addTrain(owner, plan.id, planLotId, trainBody(w));
  expect((await owner.patch(`/api/plans/${plan.id}/lots/${planLotId}`, { chosenTrainId: t.lots[0].trains[0].id })).status).toBe(200);
  expect((await owner.post(`/api/plans/${plan.id}/approve`, { reason: 'Test day: stock counted separately.' })).status).toBe(200);
  const run = await tech.post('/api/runs', { planLotId });
  expect(run.status).toBe(201);
  return { runId: run.body.id as string, plan, lotCode: withLot.lots[0].lot.code as string };
}

const log = (runId: string, stageIndex: number, volumeL: number, dpBar: number) =>
  tech.post(`/api/runs/${runId}/readings`, { clientKey: `${runId}-${stageIndex}-${volumeL}`, stageIndex, volumeL, upstreamBar: 2 + dpBar, downstreamBar: 2, flowLh: 2400 });
const todayRuns = async (c: Client) => {
  const res = await c.get('/api/today');
  expect(res.status).toBe(200);
  return res.body.runsInProgress as RunInProgressDto[];
};

beforeAll(async () => {
  app = await startTestApp();
  const a = await signUp(app.baseUrl, { wineryName: 'Running Creek Winery' });
  owner = a.client;
  tech = (await addMember(app, owner, 'technician')).client;
  other = (await signUp(app.baseUrl, { wineryName: 'Quiet Valley Cellars' })).client;
  const first = await startedRun(6000);
  runIds.push(first.runId);
  lotCode = first.lotCode;
  planName = first.plan.name;
  // Stage 1 climbs fast towards its 1.5 bar terminal ΔP; stage 2 has one reading only.
  for (const [v, dp] of [[500, 0.2], [1000, 0.5], [1500, 0.85], [2000, 1.2]] as const) expect((await log(first.runId, 0, v, dp)).status).toBe(201);
  expect((await log(first.runId, 1, 500, 0.3)).status).toBe(201);
  const second = await startedRun(3000);
  runIds.push(second.runId);
});
afterAll(async () => {
  await app?.close();
});

describe('Today’s runs in progress', () => {
  it('lists each open run with its lot, plan and day, and each stage’s ΔP, forecast and alarm — the run page’s own figures', async () => {
    const runs = await todayRuns(tech);
    expect(runs.map((r) => r.id)).toEqual(runIds);
    const [r] = runs;
    expect(r).toMatchObject({ lot: { code: lotCode }, plan: { name: planName, plannedDate: '2031-05-05' }, volumeL: 6000, currentVolumeL: 2000 });
    const detail = (await owner.get(`/api/runs/${r.id}`)).body;
    const [s0, s1] = r.stages;
    expect(s0).toMatchObject({ index: 0, name: 'Prefilter', readingCount: 4, terminalDpBar: detail.stages[0].terminalDpBar });
    expect(s0.dpBar).toBeCloseTo(1.2, 9);
    expect(s0.forecast).not.toBeNull();
    expect(s0.forecast!.volumeLeftL).toBeCloseTo(detail.stages[0].forecast.volumeLeftL, 6);
    expect(s0.forecast!.timeLeft).toEqual(detail.stages[0].forecast.timeLeft);
    expect(Number.isFinite(s0.forecast!.hoursLeft)).toBe(true);
    expect(s0.alarm).toEqual(detail.stages[0].alarm);
    expect(s0.alarm!.level).toBe('alarm');
    // One reading is not enough for a forecast: the stage says so in words.
    expect(s1).toMatchObject({ readingCount: 1, forecast: null, alarm: null });
    expect(s1.dpBar).toBeCloseTo(0.3, 9);
    expect(s1.note).toMatch(/Log 2 more readings/);
    // The second run has no readings yet.
    expect(runs[1].stages.every((s) => s.dpBar === null && s.forecast === null && s.readingCount === 0)).toBe(true);
  });

  it('applies corrections and voids as the run page does', async () => {
    const runId = runIds[0];
    const detail = (await owner.get(`/api/runs/${runId}`)).body;
    const last = detail.stages[0].readings.find((x: { volumeL: number }) => x.volumeL === 2000);
    expect((await tech.post(`/api/runs/${runId}/readings/${last.id}/void`, { reason: 'Gauge was being swapped.' })).status).toBe(201);
    const [r] = await todayRuns(owner);
    const after = (await owner.get(`/api/runs/${runId}`)).body;
    expect(r.stages[0].readingCount).toBe(3);
    expect(r.stages[0].dpBar).toBeCloseTo(0.85, 9);
    expect(r.stages[0].forecast?.volumeLeftL ?? null).toEqual(after.stages[0].forecast?.volumeLeftL ?? null);
  });

  it('another winery sees none of them; a closed run leaves the list', async () => {
    expect(await todayRuns(other)).toEqual([]);
    expect((await tech.post(`/api/runs/${runIds[1]}/close`, {})).status).toBe(200);
    expect((await todayRuns(owner)).map((r) => r.id)).toEqual([runIds[0]]);
  });
});
