// @vitest-environment node
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Client, signUp, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;
let member: Client;
beforeAll(async () => {
  app = await startTestApp();
  member = (await signUp(app.baseUrl)).client;
});
afterAll(async () => {
  await app.close();
});

const membraneStage = {
  name: 'Membrane 0.45 µm',
  cartridgeType: {
    kind: 'membrane',
    ratingUm: 0.45,
    areaM2Per10in: 0.7,
    waterFlowLhPer10in: 1200,
    waterDpBar: 0.1,
    maxDpForwardBar: 5,
    terminalDpBar: 1.5,
    designFluxLhPer10in: 500,
    capacityLPerM2: 4000,
    pricePer10in: 120,
    currency: 'EUR',
  },
  housing: { rounds: 3, lengthIn: 30, maxPressureBar: 6, holdUpL: 12 },
};
const prefilterStage = {
  ...membraneStage,
  name: 'Prefilter 1 µm',
  cartridgeType: { ...membraneStage.cartridgeType, kind: 'prefilter', ratingUm: 1, waterFlowLhPer10in: 2000 },
};

describe('POST /api/calc/size-train', () => {
  it('sizes a two-stage train', async () => {
    const res = await member.post('/api/calc/size-train', {
      wine: { tempC: 14, ethanolPctVol: 12.5, sugarGPerL: 2 },
      line: { bottlesPerHour: 3000, bottleMl: 750 },
      batchL: 12000,
      stages: [prefilterStage, membraneStage],
    });
    expect(res.status).toBe(200);
    expect(res.body.stages).toHaveLength(2);
    // 3 rounds × 30-inch = 9 ten-inch equivalents; 3000 × 0.75 L × 1.10 = 2475 L/h → 275 L/h per 10-inch.
    expect(res.body.stages[1].elementEquivalents).toBe(9);
    expect(res.body.stages[1].fluxLhPer10in).toBeCloseTo(275, 6);
  });

  it('answers bad input with 400 and field messages', async () => {
    const res = await member.post('/api/calc/size-train', { wine: { tempC: 'cold' }, line: {}, batchL: -5, stages: [] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty('batchL');
    expect(res.body.error.fields).toHaveProperty('stages');
    expect(res.body.error.fields).toHaveProperty('wine.tempC');
  });

  it('needs a signed-in person', async () => {
    const res = await new Client(app.baseUrl).post('/api/calc/size-train', {});
    expect(res.status).toBe(401);
  });
});

describe('POST /api/calc/fit-run', () => {
  it('recovers cake filtration from its readings and forecasts the time left', async () => {
    // ΔP = 0.3 (1 + 1e-4 V): cake law at constant flow, generated here.
    const points = Array.from({ length: 30 }, (_, i) => ({ volumeL: i * 200, dpBar: 0.3 * (1 + 1e-4 * i * 200) }));
    const res = await member.post('/api/calc/fit-run', { points, terminalDpBar: 1.5, flowLh: 2400, volumeToBottleL: 20000 });
    expect(res.status).toBe(200);
    expect(res.body.best).toBe('cake');
    expect(res.body.fits[0].dp0Bar).toBeCloseTo(0.3, 6);
    // Terminal at V = (1.5/0.3 − 1)/1e-4 = 40,000 L; 5,800 L done → 34,200 L left → 14.25 h at 2,400 L/h.
    expect(res.body.forecast.volumeLeftL).toBeCloseTo(34200, 0);
    expect(res.body.forecast.hoursLeft).toBeCloseTo(14.25, 3);
    expect(res.body.alarm).toBeTruthy();
  });

  it('refuses too few readings', async () => {
    const res = await member.post('/api/calc/fit-run', { points: [{ volumeL: 0, dpBar: 0.3 }] });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.points).toMatch(/three/);
  });
});

describe('POST /api/calc/filterability', () => {
  it('computes the clogging index and its band', async () => {
    const res = await member.post('/api/calc/filterability', { t200s: 20, t400s: 50 });
    expect(res.status).toBe(200);
    expect(res.body.clogging.cloggingIndex).toBe(10); // 50 − 2 × 20
    expect(res.body.clogging.band.band).toBe('very-good');
  });

  it('fits a disc test and sizes by Vmax', async () => {
    // Standard blocking at constant pressure: t/V = 1/Q0 + t/Vmax with Q0 = 0.02 L/min, Vmax = 1 L.
    const points = [1, 2, 5, 10, 15, 20].map((tMin) => ({ timeS: tMin * 60, volumeMl: (1000 * tMin) / (1 / 0.02 + tMin / 1) }));
    const res = await member.post('/api/calc/filterability', {
      disc: { diameterMm: 47, points },
      sizing: { batchL: 10000, hours: 6, safetyFactor: 1.5, elementAreaM2: 0.7 },
    });
    expect(res.status).toBe(200);
    expect(res.body.disc.vmaxL).toBeCloseTo(1, 6);
    expect(res.body.disc.q0LPerMin).toBeCloseTo(0.02, 8);
    expect(res.body.sizing.elements).toBeGreaterThan(0);
  });

  it('asks for both times', async () => {
    const res = await member.post('/api/calc/filterability', { t200s: 20 });
    expect(res.status).toBe(400);
    expect(res.body.error.fields.t400s).toBeTruthy();
  });
});

describe('POST /api/calc/cartridge-life', () => {
  it('forecasts remaining cycles and reports a failed integrity test as the end', async () => {
    const cycles = Array.from({ length: 10 }, () => ({ kind: 'hot-water', tempC: 85, durationMin: 30 }));
    const ok = await member.post('/api/calc/cartridge-life', {
      ratings: { ratedHotWaterCycles: 50, flowRecoveryMinPct: 70 },
      history: { litresFiltered: 100000, cycles },
    });
    expect(ok.status).toBe(200);
    expect(ok.body.ended).toBe(false);
    expect(ok.body.remainingCycles).toBe(40);
    const failed = await member.post('/api/calc/cartridge-life', {
      ratings: { ratedHotWaterCycles: 50, flowRecoveryMinPct: 70 },
      history: { litresFiltered: 100000, cycles, integrity: [{ pass: false }] },
    });
    expect(failed.body.ended).toBe(true);
  });

  it('validates cycle kinds', async () => {
    const res = await member.post('/api/calc/cartridge-life', {
      ratings: { flowRecoveryMinPct: 70 },
      history: { litresFiltered: 0, cycles: [{ kind: 'boil' }] },
    });
    expect(res.status).toBe(400);
    expect(res.body.error.fields['history.cycles.0.kind']).toBeTruthy();
  });
});
