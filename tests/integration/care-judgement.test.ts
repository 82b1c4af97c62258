// @vitest-environment node
import { beforeAll, describe, expect, it } from 'vitest';
import { insertCartridgeType, insertHousing, serialPrefix } from '../factories/cartridges';
import { setupApiApp } from '../support/api-app';
import type { Client } from '../support/test-app';

const app = setupApiApp({ wineryName: 'Care Judgement Winery', members: ['technician'] });
let owner: Client;
let technician: Client;
let membrane: { id: string; name: string };
let wineryId: string;

const prefix = serialPrefix();
let seq = 0;

async function registered(typeId: string, lengthIn = 30) {
  const res = await owner.post('/api/cartridges', { serial: `${prefix}-J${String(++seq).padStart(4, '0')}`, batch: 'B25-010', typeId, lengthIn, receivedAt: '2025-01-05' });
  expect(res.status).toBe(201);
  return res.body as { id: string; serial: string };
}

beforeAll(async () => {
  ({ owner, wineryId } = app);
  technician = app.members.technician;
  membrane = await insertCartridgeType(app.db, wineryId, { name: 'PES 0.45 judged', maxTempC: 80, bubblePointMinBar: 2.5, diffusionMaxMlMinPer10in: 12 });
});

describe('a pressure hold covers the whole housing (PDA Technical Report No. 26)', () => {
  it('3 × 30-inch, 12 mL/min per 10-inch, 27 L upstream, 10 min → limit 40.5 mbar; 33.8 mbar passes', async () => {
    const housing = await insertHousing(app.db, wineryId, { name: 'Three-round membrane housing', rounds: 3, lengthIn: 30, upstreamGasVolumeL: 27 });
    const ids: string[] = [];
    for (let i = 0; i < 3; i++) {
      const c = await registered(membrane.id);
      expect((await technician.post(`/api/cartridges/${c.id}/install`, { housingId: housing.id })).status).toBe(200);
      ids.push(c.id);
    }
    const target = await technician.get(`/api/care/cartridges/${ids[0]}`);
    expect(target.body).toMatchObject({ elementEquivalents: 3, housingElementEquivalents: 9 });
    const res = await technician.post(`/api/cartridges/${ids[0]}/integrity-tests`, { test: 'pressure-hold', decayMbar: 33.8, testMin: 10 });
    expect(res.status).toBe(201);
    // 9 × 12 = 108 mL/min; 108 × 10 × 1.01325 / 27 = 40.53 mbar (hand calculation)
    expect(res.body.pass).toBe(true);
    expect(res.body.event.details.maxDecayMbar).toBeCloseTo(40.53, 1);
    expect(res.body.event.details).toMatchObject({ elementEquivalents: 9, limitBasis: 'housing', maxMlMin: 108 });
    expect(res.body.life.integrity.latestPass).toBe(true);
    const diffusion = await technician.post(`/api/cartridges/${ids[1]}/integrity-tests`, { test: 'diffusion', diffusionMlMin: 100 });
    expect(diffusion.body).toMatchObject({ pass: true });
  });
});

describe('a bubble point judged for its wetting liquid (Young–Laplace; Vázquez et al. 1995 surface tensions)', () => {
  it('wine-wet at 12 % vol: the 2.50 bar water minimum becomes ≈ 1.70 bar', async () => {
    const c = await registered(membrane.id);
    const res = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 1.85, wettingFluid: 'wine', ethanolPctVol: 12, tempC: 20 });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ pass: true, retest: false });
    expect(res.body.event.details.minBar).toBeGreaterThan(1.65);
    expect(res.body.event.details.minBar).toBeLessThan(1.75);
    expect(res.body.event.details).toMatchObject({ wettingFluid: 'wine', ethanolPctVol: 12 });
  });

  it('a wine-wet fail is not final: re-flush with water and re-test; the life does not end', async () => {
    const c = await registered(membrane.id);
    const res = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 1.4, wettingFluid: 'wine', ethanolPctVol: 12.5 });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ pass: false, retest: true });
    expect(res.body.reason).toMatch(/re-flush with water and re-test/);
    expect(res.body.event.details.retest).toBe(true);
    expect(res.body.life.integrity.latestPass).not.toBe(false);
  });

  it('a product-wet test needs its strength (400 with the field)', async () => {
    const c = await registered(membrane.id);
    const res = await technician.post(`/api/cartridges/${c.id}/integrity-tests`, { test: 'bubble-point', bubblePointBar: 1.9, wettingFluid: 'ethanol-water' });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.ethanolPctVol).toMatch(/strength/);
  });
});

describe('flow recovery on its basis (Darcy with IAPWS R12-08 water viscosity; engineering reference §5)', () => {
  it('a clean cartridge measured in 10 °C water reads ≈ 100 % of the type’s spec, not 76.7 %', async () => {
    const type = await insertCartridgeType(app.db, wineryId, { name: 'PES flow judged', maxTempC: 85, waterFlowLhPer10in: 1000 });
    const c = await registered(type.id, 30);
    const target = await technician.get(`/api/care/cartridges/${c.id}`);
    expect(target.body.flowBasis).toEqual({ kind: 'spec', flowLh: 3000 });
    // 3 000 L/h at 20 °C flows 3 000 × 1.0016/1.3059 = 2 301 L/h in 10 °C water
    const res = await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 80, durationMin: 30, waterFlowAfterLh: 2301, waterTempC: 10 });
    expect(res.status).toBe(201);
    expect(res.body.life.recovery.latestPct).toBeCloseTo(100, 0);
  });

  it('a housing’s flow is shared among its cartridges', async () => {
    const type = await insertCartridgeType(app.db, wineryId, { name: 'PES housing flow', maxTempC: 85, waterFlowLhPer10in: 1000 });
    const housing = await insertHousing(app.db, wineryId, { name: 'Flow housing', rounds: 3, lengthIn: 30, upstreamGasVolumeL: 20 });
    const ids: string[] = [];
    for (let i = 0; i < 3; i++) {
      const c = await registered(type.id);
      expect((await technician.post(`/api/cartridges/${c.id}/install`, { housingId: housing.id })).status).toBe(200);
      ids.push(c.id);
    }
    // 8 100 L/h through 9 equivalents → 2 700 L/h for one 30-inch cartridge = 90 % of 3 000
    const res = await technician.post(`/api/cartridges/${ids[0]}/cycles`, { kind: 'hot-water', tempC: 80, waterFlowAfterLh: 8100, flowBasis: 'housing' });
    expect(res.status).toBe(201);
    expect(res.body.life.recovery.latestPct).toBeCloseTo(90, 6);
  });
});

describe('a cycle above the rating (common practice, no source)', () => {
  it('is refused without confirmation, then recorded, flagged and counted', async () => {
    const c = await registered(membrane.id);
    const refused = await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 95, durationMin: 20 });
    expect(refused.status).toBe(400);
    expect(refused.body.error.fields.tempC).toMatch(/80 °C.*confirm/);
    const res = await technician.post(`/api/cartridges/${c.id}/cycles`, { kind: 'hot-water', tempC: 95, durationMin: 20, aboveRatingConfirmed: true });
    expect(res.status).toBe(201);
    expect(res.body.hotWaterCycles).toBe(1);
    expect(res.body.event.details).toMatchObject({ aboveRating: true, ratedMaxC: 80, tempC: 95 });
    expect(res.body.life.counts.aboveRating).toBe(1);
    expect(res.body.life.missing.join(' ')).toMatch(/above the temperature rating/);
  });
});
