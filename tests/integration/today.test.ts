// @vitest-environment node
import { describe, expect, it } from 'vitest';
import { cartridgeEventsTable, cartridgesTable } from '../../server/db/schema';
import type { PlanDto } from '../../shared/types/plans';
import type { TodayDto } from '../../shared/types/today';
import { insertCartridgeType, insertHousing, serialPrefix } from '../factories/cartridges';
import { createLabResult, createLot, createTank } from '../factories/cellar';
import { addPlanLot, addTrain, createPlan, createPlanWorld, trainBody } from '../factories/plans';
import { setupApiApp } from '../support/api-app';
import { addMember, Client, signUp } from '../support/test-app';

const app = setupApiApp();

const prefix = serialPrefix();
let seq = 0;
const nextSerial = () => `${prefix}-${String(++seq).padStart(3, '0')}`;

async function today(client: Client) {
  const res = await client.get('/api/today');
  expect(res.status).toBe(200);
  return res.body as TodayDto;
}

async function register(client: Client, typeId: string) {
  const res = await client.post('/api/cartridges', { serial: nextSerial(), batch: 'B25-001', typeId, lengthIn: 30, receivedAt: '2025-01-10' });
  if (res.status !== 201) throw new Error(`register failed: ${res.status} ${res.text}`);
  return res.body as { id: string; serial: string };
}

async function install(client: Client, id: string, housingId: string) {
  const res = await client.post(`/api/cartridges/${id}/install`, { housingId });
  if (res.status !== 200) throw new Error(`install failed: ${res.status} ${res.text}`);
}

const day = (n: number) => new Date(Date.UTC(2025, 10, n, 9, 0, 0));

/** A winery with a cellar and cartridges: a not-ready, a borderline-free ready and an untested lot; a failed and a nearly spent cartridge. */
async function stockedWinery(name: string) {
  const { client, me } = await signUp(app.baseUrl, { wineryName: name });
  const wineryId = me.activeWineryId!;
  const tank = await createTank(client);
  const notReady = await createLot(client, { name: 'Cloudy white', style: 'white', tankId: tank.id });
  await createLabResult(client, notReady.id, { turbidityNtu: 6, t200s: 30, t400s: 110 });
  const ready = await createLot(client, { name: 'Bright white', style: 'white' });
  await createLabResult(client, ready.id, { turbidityNtu: 0.4, t200s: 28, t400s: 62 });
  const untested = await createLot(client, { name: 'New red', style: 'red' });

  const membrane = await insertCartridgeType(app.db, wineryId, { name: `PES 0.45 µm ${name}`, ratedHotWaterCycles: 5, ratedSteamCycles: 50, ratedChemicalCycles: 20 });
  const unstocked = await insertCartridgeType(app.db, wineryId, { name: `PP 1 µm ${name}`, kind: 'prefilter', media: 'polypropylene', ratingUm: 1 });
  const housing = await insertHousing(app.db, wineryId, { name: `Membrane housing ${name}`, rounds: 4, lengthIn: 30 });
  await insertHousing(app.db, wineryId, { name: `Spare housing ${name}`, rounds: 2, lengthIn: 30 });

  const failed = await register(client, membrane.id);
  const nearLimit = await register(client, membrane.id);
  const healthy = await register(client, membrane.id);
  const shelf = await register(client, membrane.id);
  for (const c of [failed, nearLimit, healthy]) await install(client, c.id, housing.id);
  await app.db.insert(cartridgeEventsTable).values([
    { wineryId, cartridgeId: failed.id, kind: 'integrity', at: day(10), details: { pass: true } },
    { wineryId, cartridgeId: failed.id, kind: 'integrity', at: day(20), details: { pass: false } },
    ...[1, 8, 15].map((d) => ({ wineryId, cartridgeId: nearLimit.id, kind: 'cycle' as const, at: day(d), details: { kind: 'hot-water', tempC: 85, durationMin: 30 } })),
  ]);
  return { client, wineryId, lots: { notReady, ready, untested }, cartridges: { failed, nearLimit, healthy, shelf }, types: { membrane, unstocked }, housing };
}

describe('GET /api/today', () => {
  it('gives a new winery zeros and empty lists', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Empty Today Winery' });
    const body = await today(client);
    expect(body.counts).toEqual({ lots: 0, tanks: 0, housings: 0, housingsWithFreeRounds: 0, cartridgeTypes: 0, cartridges: 0, cartridgesInstalled: 0 });
    expect(body.lots).toEqual({ byVerdict: { ready: 0, borderline: 0, 'not-ready': 0, unknown: 0 }, attention: [], attentionTotal: 0 });
    expect(body.cartridges).toEqual({ attention: [], attentionTotal: 0 });
    expect(body.stock).toEqual({ types: [], shortfalls: 0 });
    expect(body.upcomingPlans).toEqual([]);
  });

  it('shows the lots and cartridges that need a look, and the stock shortfalls', async () => {
    const w = await stockedWinery('Today Test Cellars');
    const body = await today(w.client);

    expect(body.counts).toEqual({ lots: 3, tanks: 1, housings: 2, housingsWithFreeRounds: 2, cartridgeTypes: 2, cartridges: 4, cartridgesInstalled: 3 });

    // Lots: the not-ready one first with the reason that fails, then the untested one; the ready one is left out.
    expect(body.lots.byVerdict).toEqual({ ready: 1, borderline: 0, 'not-ready': 1, unknown: 1 });
    expect(body.lots.attentionTotal).toBe(2);
    expect(body.lots.attention.map((l) => l.id)).toEqual([w.lots.notReady.id, w.lots.untested.id]);
    const [cloudy, untested] = body.lots.attention;
    expect(cloudy).toMatchObject({ code: w.lots.notReady.code, name: 'Cloudy white', style: 'white', volumeL: 5000, verdict: 'not-ready' });
    expect(cloudy.reason).toMatch(/^Turbidity 6(\.0)? NTU is above/);
    expect(cloudy.sampledAt).not.toBeNull();
    expect(untested).toMatchObject({ verdict: 'unknown', reason: 'No lab result yet.', sampledAt: null });

    // Cartridges: the failed integrity test first, then the one near its hot-water limit; the healthy and shelf ones are not listed.
    expect(body.cartridges.attentionTotal).toBe(2);
    const [failed, nearLimit] = body.cartridges.attention;
    expect(failed).toMatchObject({
      id: w.cartridges.failed.id,
      serial: w.cartridges.failed.serial,
      typeName: w.types.membrane.name,
      status: 'installed',
      housing: { id: w.housing.id, name: w.housing.name },
      reason: 'Latest integrity test failed',
      figure: { kind: 'integrity-failed', at: day(20).toISOString() },
    });
    expect(failed.position).toBeGreaterThanOrEqual(1);
    expect(nearLimit).toMatchObject({
      id: w.cartridges.nearLimit.id,
      reason: 'Near the end of its life',
      figure: { kind: 'cycles-left', cyclesLeft: 2, factor: 'hot-water cycles' },
    });

    // Stock: the type with nothing on the shelf is a shortfall.
    expect(body.stock.shortfalls).toBe(1);
    const membrane = body.stock.types.find((t) => t.typeId === w.types.membrane.id)!;
    expect(membrane).toMatchObject({ shortfall: false, inStock: { count: 1, elementEquivalents: 3 }, installed: { count: 3, elementEquivalents: 9 } });
    expect(body.stock.types.find((t) => t.typeId === w.types.unstocked.id)).toMatchObject({ shortfall: true, inStock: { count: 0, elementEquivalents: 0 } });
  });

  it('flags a rated budget mostly used, an ended life and a used cartridge back on the shelf', async () => {
    const { client, me } = await signUp(app.baseUrl, { wineryName: 'Budget Today Winery' });
    const wineryId = me.activeWineryId!;
    const type = await insertCartridgeType(app.db, wineryId, { ratedSteamCycles: 10, ratedHotWaterCycles: 100, ratedChemicalCycles: 100 });
    const spent = await register(client, type.id);
    const worn = await register(client, type.id);
    const fresh = await register(client, type.id);
    const steam = (cartridgeId: string, n: number) =>
      Array.from({ length: n }, (_, i) => ({ wineryId, cartridgeId, kind: 'cycle' as const, at: day(i + 1), details: { kind: 'steam', tempC: 121, durationMin: 30 } }));
    // Both have been used and are back in stock; the fresh one has only its registration.
    await app.db.insert(cartridgeEventsTable).values([...steam(spent.id, 10), ...steam(worn.id, 8)]);
    const body = await today(client);
    expect(body.cartridges.attention.map((c) => c.id)).toEqual([spent.id, worn.id]);
    expect(body.cartridges.attention[0]).toMatchObject({ status: 'in-stock', housing: null, reason: 'Life forecast has ended', figure: { kind: 'life-ended' } });
    // 8 of 10 steam cycles: 2 left, so "near the end" leads and the budget is also noted.
    expect(body.cartridges.attention[1]).toMatchObject({ reason: 'Near the end of its life', figure: { kind: 'cycles-left', cyclesLeft: 2, factor: 'steam cycles' } });
    expect(body.cartridges.attention[1].alsoNoted).toContain('80 % of rated steam cycles used.');
    expect(body.cartridges.attention.some((c) => c.id === fresh.id)).toBe(false);
  });

  it('leads with the reason that fails, not one that passes', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Reason Today Winery' });
    const lot = await createLot(client, { style: 'white' });
    // Clear enough, but the clogging index is far too high.
    await createLabResult(client, lot.id, { turbidityNtu: 0.4, t200s: 30, t400s: 140 });
    const [only] = (await today(client)).lots.attention;
    expect(only.verdict).toBe('not-ready');
    expect(only.reason).toMatch(/^Clogging index 80 s is above/);
  });

  it('lists at most 8 lots, most urgent first, with the total', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Many Lots Winery' });
    for (let i = 0; i < 6; i++) await createLot(client, { code: `U-${i}-${prefix}` });
    for (let i = 0; i < 4; i++) {
      const lot = await createLot(client, { code: `N-${i}-${prefix}` });
      await createLabResult(client, lot.id, { turbidityNtu: 8 });
    }
    const body = await today(client);
    expect(body.lots.attentionTotal).toBe(10);
    expect(body.lots.attention).toHaveLength(8);
    expect(body.lots.attention.slice(0, 4).every((l) => l.verdict === 'not-ready')).toBe(true);
    expect(body.lots.attention.slice(4).every((l) => l.verdict === 'unknown')).toBe(true);
  });

  it('may be read by every role, and not without signing in', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Roles Today Winery' });
    await createLot(owner, { name: 'Role check lot' });
    for (const role of ['cellar-master', 'winemaker', 'technician', 'auditor'] as const) {
      const { client } = await addMember(app, owner, role);
      const body = await today(client);
      expect(body.counts.lots, role).toBe(1);
    }
    expect((await new Client(app.baseUrl).get('/api/today')).status).toBe(401);
  });

  it("never shows another winery's records", async () => {
    const a = await stockedWinery('Today Winery A');
    const b = await stockedWinery('Today Winery B');
    const [bodyA, bodyB] = await Promise.all([today(a.client), today(b.client)]);
    const ids = (body: TodayDto) => [
      ...body.lots.attention.map((l) => l.id),
      ...body.cartridges.attention.map((c) => c.id),
      ...body.cartridges.attention.flatMap((c) => (c.housing ? [c.housing.id] : [])),
      ...body.stock.types.map((t) => t.typeId),
    ];
    const idsOfA = Object.values(a.lots).map((l) => l.id).concat(Object.values(a.cartridges).map((c) => c.id), [a.types.membrane.id, a.types.unstocked.id, a.housing.id]);
    const idsOfB = Object.values(b.lots).map((l) => l.id).concat(Object.values(b.cartridges).map((c) => c.id), [b.types.membrane.id, b.types.unstocked.id, b.housing.id]);
    expect(ids(bodyA).length).toBeGreaterThan(0);
    expect(ids(bodyA).every((id) => idsOfA.includes(id))).toBe(true);
    expect(ids(bodyB).every((id) => idsOfB.includes(id))).toBe(true);
    expect(ids(bodyA).some((id) => idsOfB.includes(id))).toBe(false);
    expect(bodyA.counts).toEqual(bodyB.counts);
  });
});

/** A UTC date string `offset` days from now, as the server compares them. */
const isoDay = (offset: number) => new Date(Date.now() + offset * 86_400_000).toISOString().slice(0, 10);

async function ok(res: { status: number; text: string; body: unknown }, what: string) {
  if (res.status !== 200) throw new Error(`${what} failed: ${res.status} ${res.text}`);
  return res.body as PlanDto;
}

/**
 * A winery with a line, two lots, a prefilter and a membrane type, one prefilter cartridge on
 * the shelf and no membranes; and plans: a draft ahead with a chosen train (short of cartridges)
 * and a lot still to choose, an approved one sooner, one today, one past and one done.
 */
async function plannedWinery(name: string) {
  const { client, me } = await signUp(app.baseUrl, { wineryName: name });
  const wineryId = me.activeWineryId!;
  const w = await createPlanWorld(client);
  await app.db.insert(cartridgesTable).values({ wineryId, serial: nextSerial(), typeId: w.prefilterTypeId, lengthIn: 30, status: 'in-stock' });

  const withTrain = async (planId: string, lotId: string, volumeL?: number) => {
    const withLot = await addPlanLot(client, planId, lotId, volumeL);
    const planLot = withLot.lots.find((l) => l.lot.id === lotId)!;
    const trained = await addTrain(client, planId, planLot.id, trainBody(w));
    const trainId = trained.lots.find((l) => l.id === planLot.id)!.trains[0].id;
    return ok(await client.patch(`/api/plans/${planId}/lots/${planLot.id}`, { chosenTrainId: trainId }), 'choosing a train');
  };

  const ahead = await createPlan(client, w.lineId, { name: `Whites ahead ${name}`, plannedDate: isoDay(10) });
  await withTrain(ahead.id, w.lotId, 4000);
  await addPlanLot(client, ahead.id, w.secondLotId, 1500);
  const aheadDetail = await ok(await client.get(`/api/plans/${ahead.id}`), 'reading the plan');

  const sooner = await createPlan(client, w.lineId, { name: `Rosé sooner ${name}`, plannedDate: isoDay(3) });
  await withTrain(sooner.id, w.secondLotId);
  await ok(await client.post(`/api/plans/${sooner.id}/approve`, { reason: 'Cartridges arrive the day before.' }), 'approving');

  const todays = await createPlan(client, w.lineId, { name: `Empty today ${name}`, plannedDate: isoDay(0) });

  const past = await createPlan(client, w.lineId, { name: `Past ${name}`, plannedDate: isoDay(-2) });
  const done = await createPlan(client, w.lineId, { name: `Done ${name}`, plannedDate: isoDay(5) });
  await withTrain(done.id, w.lotId);
  await ok(await client.post(`/api/plans/${done.id}/approve`, { reason: 'Cartridges arrive the day before.' }), 'approving');
  await ok(await client.post(`/api/plans/${done.id}/done`), 'marking done');

  return { client, world: w, plans: { ahead: aheadDetail, sooner, todays, past, done } };
}

describe('GET /api/today: the next bottling days', () => {
  it('lists draft and approved plans from today on, soonest first, with the cartridge shortfalls', async () => {
    const p = await plannedWinery('Planned Today Winery');
    const body = await today(p.client);
    const names = body.upcomingPlans.map((x) => x.name);
    expect(body.upcomingPlans.map((x) => x.id)).toEqual([p.plans.todays.id, p.plans.sooner.id, p.plans.ahead.id]);
    // A past plan and a done plan are left out.
    expect(names.some((n) => n.startsWith('Past ') || n.startsWith('Done '))).toBe(false);

    const [todays, sooner, ahead] = body.upcomingPlans;
    expect(todays).toMatchObject({ plannedDate: isoDay(0), status: 'draft', lotCount: 0, volumeL: 0, trainsChosen: false, lotsWithoutTrain: 0, shortfalls: [] });
    expect(sooner).toMatchObject({ plannedDate: isoDay(3), status: 'approved', lotCount: 1, volumeL: 3000, trainsChosen: true, lotsWithoutTrain: 0 });
    expect(ahead).toMatchObject({
      id: p.plans.ahead.id,
      name: p.plans.ahead.name,
      plannedDate: isoDay(10),
      status: 'draft',
      line: { id: p.world.lineId, name: p.plans.ahead.line!.name },
      lotCount: 2,
      volumeL: 5500,
      trainsChosen: false,
      lotsWithoutTrain: 1,
    });

    // The shortfalls are the plan's own cartridges-needed figures: the prefilter set needs more
    // than the one cartridge on the shelf, and there are no membranes at all.
    const short = p.plans.ahead.needs.filter((n) => n.verdict === 'short');
    expect(short.map((n) => n.cartridgeTypeId)).toEqual([p.world.prefilterTypeId, p.world.membraneTypeId]);
    expect(ahead.shortfalls).toEqual(short.map((n) => ({ cartridgeTypeId: n.cartridgeTypeId, typeName: n.typeName, kind: n.kind, lengthIn: 30, short: n.shortfall })));
    const [pre, mem] = ahead.shortfalls;
    expect(pre.short).toBe(short[0].cartridgesNeeded - 1);
    expect(mem.short).toBe(short[1].cartridgesNeeded);
    expect(mem.short).toBeGreaterThan(0);
  });

  it('shows at most 5', async () => {
    const { client } = await signUp(app.baseUrl, { wineryName: 'Busy Calendar Winery' });
    const w = await createPlanWorld(client);
    const made = [];
    for (const offset of [20, 1, 14, 7, 2, 30]) made.push({ offset, plan: await createPlan(client, w.lineId, { plannedDate: isoDay(offset) }) });
    const body = await today(client);
    const expected = [...made].sort((a, b) => a.offset - b.offset).slice(0, 5).map((m) => m.plan.id);
    expect(body.upcomingPlans.map((x) => x.id)).toEqual(expected);
  });

  it('may be read by every role', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Roles Plans Today Winery' });
    const w = await createPlanWorld(owner);
    const plan = await createPlan(owner, w.lineId, { plannedDate: isoDay(4) });
    for (const role of ['cellar-master', 'winemaker', 'technician', 'auditor'] as const) {
      const { client } = await addMember(app, owner, role);
      const body = await today(client);
      expect(body.upcomingPlans.map((x) => x.id), role).toEqual([plan.id]);
    }
  });

  it("never shows another winery's plans", async () => {
    const a = await plannedWinery('Plans Today Winery A');
    const b = await plannedWinery('Plans Today Winery B');
    const [bodyA, bodyB] = await Promise.all([today(a.client), today(b.client)]);
    const ownIds = (p: typeof a) => Object.values(p.plans).map((x) => x.id);
    expect(bodyA.upcomingPlans).toHaveLength(3);
    expect(bodyA.upcomingPlans.every((x) => ownIds(a).includes(x.id))).toBe(true);
    expect(bodyB.upcomingPlans.every((x) => ownIds(b).includes(x.id))).toBe(true);
    const typesOf = (body: TodayDto) => body.upcomingPlans.flatMap((x) => x.shortfalls.map((s) => s.cartridgeTypeId));
    expect(typesOf(bodyA).every((id) => [a.world.prefilterTypeId, a.world.membraneTypeId].includes(id))).toBe(true);
    expect(typesOf(bodyB).some((id) => [a.world.prefilterTypeId, a.world.membraneTypeId].includes(id))).toBe(false);
  });
});
