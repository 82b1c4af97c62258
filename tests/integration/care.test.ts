// @vitest-environment node
import { and, eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { cartridgeEventsTable } from '../../server/db/schema';
import { insertCartridgeType, insertHousing, serialPrefix } from '../factories/cartridges';
import { setupApiApp } from '../support/api-app';
import type { Client } from '../support/test-app';

const app = setupApiApp({ wineryName: 'Care Test Winery', otherWineryName: 'Other Care Winery', members: ['technician', 'winemaker', 'auditor'] });
let owner: Client;
let technician: Client;
let winemaker: Client;
let auditor: Client;
let other: Client;
let membrane: { id: string; name: string };
let noLimits: { id: string; name: string };
let housing: { id: string; name: string };
let otherCartridge: { id: string };
let wineryId: string;

const prefix = serialPrefix();
let seq = 0;

async function registered(client: Client, typeId: string, lengthIn = 30) {
  const res = await client.post('/api/cartridges', { serial: `${prefix}-${String(++seq).padStart(4, '0')}`, batch: 'B24-200', typeId, lengthIn, receivedAt: '2024-11-05' });
  expect(res.status).toBe(201);
  return res.body as { id: string; serial: string };
}

beforeAll(async () => {
  ({ owner, other, wineryId } = app);
  ({ technician, winemaker, auditor } = app.members);
  membrane = await insertCartridgeType(app.db, wineryId, { name: 'PES 0.45 care', maxTempC: 85, bubblePointMinBar: 3.2, diffusionMaxMlMinPer10in: 15 });
  noLimits = await insertCartridgeType(app.db, wineryId, { name: 'PP 1.0 care', kind: 'prefilter', media: 'polypropylene', ratingUm: 1, bubblePointMinBar: null, diffusionMaxMlMinPer10in: null });
  housing = await insertHousing(app.db, wineryId, { name: 'Care membrane housing', rounds: 3, lengthIn: 30, maxTempC: 135, upstreamGasVolumeL: 5 });
  const otherType = await insertCartridgeType(app.db, app.otherWineryId, { name: 'Other PES' });
  otherCartridge = await registered(other, otherType.id);
});

describe('POST /api/cartridges/:id/cycles', () => {
  it('a technician logs a hot-water cycle: the counter and the life forecast change', async () => {
    const c = await registered(owner, membrane.id);
    const before = await owner.get(`/api/cartridges/${c.id}`);
    expect(before.body.hotWaterCycles).toBe(0);
    const res = await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 82, durationMin: 30, waterFlowBeforeLh: 3000, waterFlowAfterLh: 4200 });
    expect(res.status).toBe(201);
    expect(res.body.hotWaterCycles).toBe(1);
    expect(res.body.event).toMatchObject({ kind: 'cycle', serial: c.serial, typeName: membrane.name, details: { kind: 'hot-water', tempC: 82, durationMin: 30, waterFlowBeforeLh: 3000, waterFlowAfterLh: 4200 } });
    expect(res.body.event.actorName).toBeTruthy();
    expect(res.body.life.budgets.find((b: { factor: string }) => b.factor === 'hot-water cycles')).toMatchObject({ used: 1, rated: 100 });
    expect(res.body.life.budgets.find((b: { factor: string }) => b.factor === 'hot-water cycles').used).toBeGreaterThan(
      before.body.life.budgets.find((b: { factor: string }) => b.factor === 'hot-water cycles').used ?? 0,
    );
    const after = await owner.get(`/api/cartridges/${c.id}`);
    expect(after.body.hotWaterCycles).toBe(1);
    expect(after.body.events[0]).toMatchObject({ kind: 'cycle', details: { kind: 'hot-water' } });
  });

  it('counts steam and chemical on their own counters; backflush on none', async () => {
    const c = await registered(owner, membrane.id);
    expect((await winemaker.post(`/api/cartridges/${c.id}/cycles`, { kind: 'chemical', tempC: 50, durationMin: 20, agent: 'Caustic soda', concentrationPct: 1 })).body.chemicalCycles).toBe(1);
    const bf = await winemaker.post(`/api/cartridges/${c.id}/cycles`, { kind: 'backflush' });
    expect(bf.status).toBe(201);
    expect(bf.body).toMatchObject({ steamCycles: 0, hotWaterCycles: 0, chemicalCycles: 1 });
  });

  it('an auditor gets 403', async () => {
    const c = await registered(owner, membrane.id);
    expect((await auditor.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 80 })).status).toBe(403);
    expect((await auditor.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3.5 })).status).toBe(403);
    expect((await auditor.get('/api/care/recent')).status).toBe(200);
  });

  it("another winery's cartridge is a 404 on every route", async () => {
    expect((await technician.post(`/api/cartridges/${otherCartridge.id}/cycles`, { kind: 'hot-water', tempC: 80 })).status).toBe(404);
    expect((await technician.post(`/api/cartridges/${otherCartridge.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3.5 })).status).toBe(404);
    expect((await technician.get(`/api/care/cartridges/${otherCartridge.id}`)).status).toBe(404);
    expect((await technician.post('/api/cartridges/not-an-id/cycles', { kind: 'hot-water' })).status).toBe(404);
    const mine = await owner.get('/api/care/recent');
    expect(mine.body.items.every((e: { cartridgeId: string }) => e.cartridgeId !== otherCartridge.id)).toBe(true);
  });

  it("a cycle above the type's maximum temperature is a 400 on tempC stating the limit", async () => {
    const c = await registered(owner, membrane.id);
    const res = await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'steam', tempC: 121, durationMin: 30 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.tempC).toMatch(/85 °C/);
    expect((await owner.get(`/api/cartridges/${c.id}`)).body.steamCycles).toBe(0);
  });

  it('a retired cartridge is a 409', async () => {
    const c = await registered(owner, membrane.id);
    expect((await owner.post(`/api/cartridges/${c.id}/retire`, { reason: 'Flow no longer recovered.' })).status).toBe(200);
    const res = await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 80 });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/retired/);
  });

  it('bad input is a 400 with fields', async () => {
    const c = await registered(owner, membrane.id);
    const res = await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'boil', tempC: 'hot', durationMin: -3, waterFlowAfterLh: -1, at: '2999-01-01T00:00:00Z' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(expect.arrayContaining(['kind', 'tempC', 'durationMin', 'waterFlowAfterLh', 'at']));
    const future = await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', at: new Date(Date.now() + 86_400_000).toISOString() });
    expect(future.body.error.fields.at).toMatch(/future/);
    const chem = await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'chemical' });
    expect(chem.body.error.fields.agent).toBeTruthy();
  });

  it('an Idempotency-Key makes one event', async () => {
    const c = await registered(owner, membrane.id);
    const key = `care-${prefix}-idem`;
    const body = { kind: 'hot-water', tempC: 82, durationMin: 30 };
    const first = await technician.request('POST', `/api/cartridges/${c.id}/cycles`, body, { 'idempotency-key': key });
    const retry = await technician.request('POST', `/api/cartridges/${c.id}/cycles`, body, { 'idempotency-key': key });
    expect(first.status).toBe(201);
    expect(retry.status).toBe(201);
    expect(retry.body.event.id).toBe(first.body.event.id);
    const rows = await app.db.select().from(cartridgeEventsTable).where(and(eq(cartridgeEventsTable.cartridgeId, c.id), eq(cartridgeEventsTable.kind, 'cycle')));
    expect(rows).toHaveLength(1);
    expect((await owner.get(`/api/cartridges/${c.id}`)).body.hotWaterCycles).toBe(1);
  });
});

describe('POST /api/cartridges/:id/integrity-tests', () => {
  it("a bubble point below the type's minimum fails with the reason; one above passes", async () => {
    const c = await registered(owner, membrane.id);
    const fail = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 2.9, wettingFluid: 'water' });
    expect(fail.status).toBe(201);
    expect(fail.body).toMatchObject({ pass: false, test: 'bubble-point' });
    expect(fail.body.reason).toMatch(/2\.9 bar is below the minimum 3\.2 bar/);
    expect(fail.body.event.details).toMatchObject({ pass: false, test: 'bubble-point', measuredBar: 2.9, minBar: 3.2 });
    expect(fail.body.life.integrity.latestPass).toBe(false);
    const pass = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3.5 });
    expect(pass.body).toMatchObject({ pass: true });
    expect(pass.body.reason).toMatch(/meets the minimum/);
    expect(pass.body.life.integrity.latestPass).toBe(true);
  });

  it('pressure hold is judged against the decay allowed by the housing upstream volume', async () => {
    const c = await registered(owner, membrane.id);
    // Not installed: the upstream volume is unknown.
    const loose = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'pressure-hold', decayMbar: 20, testMin: 10 });
    expect(loose.status).toBe(400);
    expect(loose.body.error.message).toMatch(/upstream gas volume/);
    expect((await technician.post(`/api/cartridges/${c.id}/install`, { housingId: housing.id })).status).toBe(200);
    // 15 mL/min per 10" × 3 = 45 mL/min; 45 × 10 min × 1.01325 bar / 5 L = 91.19 mbar.
    const ok = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'pressure-hold', decayMbar: 80, testMin: 10 });
    expect(ok.status).toBe(201);
    expect(ok.body.pass).toBe(true);
    expect(ok.body.event.details.maxDecayMbar).toBeCloseTo(91.19, 1);
    expect(ok.body.event.details.upstreamGasVolumeL).toBe(5);
    const bad = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'pressure-hold', decayMbar: 95, testMin: 10 });
    expect(bad.body.pass).toBe(false);
    expect(bad.body.reason).toMatch(/above the maximum/);
    const diffusion = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'diffusion', diffusionMlMin: 40 });
    expect(diffusion.body).toMatchObject({ pass: true });
    expect(diffusion.body.event.details.maxMlMin).toBe(45);
  });

  it('a type without the needed limit is a 400 with a plain message; missing readings are 400 with fields', async () => {
    const c = await registered(owner, noLimits.id);
    const res = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3 });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/no minimum bubble point/);
    const missing = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'pressure-hold' });
    expect(missing.status).toBe(400);
    expect(Object.keys(missing.body.error.fields)).toEqual(expect.arrayContaining(['decayMbar', 'testMin']));
    const wrong = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'squeeze' });
    expect(wrong.body.error.fields.test).toBeTruthy();
  });
});

describe('GET /api/care/recent', () => {
  it('lists the latest care events with serial, type, who and when', async () => {
    const c = await registered(owner, membrane.id);
    await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 25 });
    await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 3.4 });
    const res = await auditor.get('/api/care/recent');
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeLessThanOrEqual(30);
    const [latest, previous] = res.body.items;
    expect(latest).toMatchObject({ kind: 'integrity', serial: c.serial, typeName: membrane.name, details: { pass: true } });
    expect(previous).toMatchObject({ kind: 'cycle', serial: c.serial });
    expect(latest.actorName).toBeTruthy();
    expect(Date.parse(latest.at)).toBeGreaterThanOrEqual(Date.parse(previous.at));
    const target = await technician.get(`/api/care/cartridges/${c.id}`);
    expect(target.body).toMatchObject({ serial: c.serial, maxTempC: 85, bubblePointMinBar: 3.2, elementEquivalents: 3, hotWaterCycles: 1 });
  });
});
