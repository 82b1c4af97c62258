// @vitest-environment node
import { randomUUID } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { startedRunOn } from '../factories/plans';
import { setupApiApp } from '../support/api-app';

const app = setupApiApp({ wineryName: 'Forecast Test Winery', world: 'filled' });

const startedRun = () => startedRunOn(app.owner, app.world);

function allFinite(x: unknown): boolean {
  if (typeof x === 'number') return Number.isFinite(x);
  if (x === null || typeof x !== 'object') return true;
  return Object.values(x).every(allFinite);
}

describe('a stage whose ΔP does not rise (common practice, no source)', () => {
  it('warns of a bypass or gauge fault and gives no litres', async () => {
    const run = await startedRun();
    for (const v of [400, 800, 1200, 1600, 2000]) {
      const r = await app.owner.post(`/api/runs/${run.id}/readings`, { clientKey: randomUUID(), stageIndex: 0, volumeL: v, upstreamBar: 2.05, downstreamBar: 2.0, flowLh: 2400 });
      expect(r.status).toBe(201);
    }
    const res = await app.owner.get(`/api/runs/${run.id}`);
    expect(res.status).toBe(200);
    const stage = res.body.stages[0];
    expect(stage.flatWarning).toBe('ΔP not rising: possible bypass or gauge fault.');
    expect(stage.forecast).toBeNull();
    expect(stage.alarm).toBeNull();
    expect(stage.note).toMatch(/bypass/);
    expect(res.body.stages[1].flatWarning).toBeNull();
  });

  it('a rising stage with flows gets a finite forecast and no warning', async () => {
    const run = await startedRun();
    // cake law ΔP = 0.2(1 + 2e-4·V) at 2 400 L/h (generated here)
    for (const v of [0, 500, 1000, 1500, 2000, 2500]) {
      const dp = 0.2 * (1 + 2e-4 * v);
      const r = await app.owner.post(`/api/runs/${run.id}/readings`, { clientKey: randomUUID(), stageIndex: 0, volumeL: v, upstreamBar: 2 + dp, downstreamBar: 2, flowLh: 2400, tempC: 15 });
      expect(r.status).toBe(201);
    }
    const stage = (await app.owner.get(`/api/runs/${run.id}`)).body.stages[0];
    expect(stage.flatWarning).toBeNull();
    expect(stage.forecast).not.toBeNull();
    // terminal 1.5 bar: V = (1.5/0.2 − 1)/2e-4 = 32 500 L → beyond 3 × 2 500 L seen (hand calculation)
    expect(stage.forecast.volumeAtTerminalL).toBeCloseTo(32500, -1);
    expect(stage.forecast.beyondReadings).toBe(true);
    expect(allFinite(stage)).toBe(true);
  });
});

describe('POST /api/calc/fit-run on flat readings', () => {
  it('names no best law and no forecast, and says why', async () => {
    const points = [0, 800, 1600, 2400].map((v) => ({ volumeL: v, dpBar: 0.05 }));
    const res = await app.owner.post('/api/calc/fit-run', { points, terminalDpBar: 1, flowLh: 2400, volumeToBottleL: 5000, nowMs: 0 });
    expect(res.status).toBe(200);
    expect(res.body.best).toBeNull();
    expect(res.body.forecast).toBeNull();
    expect(res.body.alarm).toBeNull();
    expect(res.body.note).toMatch(/bypass/);
  });

  it('refuses a reading temperature outside liquid water', async () => {
    const points = [0, 800, 1600].map((v) => ({ volumeL: v, dpBar: 0.05, tempC: 120 }));
    const res = await app.owner.post('/api/calc/fit-run', { points });
    expect(res.status).toBe(400);
  });
});

describe('the winery’s gauge resolution (a setting; default 0.02 bar, common practice, no source)', () => {
  it('a coarser gauge makes a small ΔP rise "not rising" instead of a forecast', async () => {
    const log = async (runId: string) => {
      // ΔP rises 0.10 → 0.16 bar over 2,500 L (cake-like, generated here): fouling for a 0.02 bar gauge.
      for (const v of [0, 500, 1000, 1500, 2000, 2500]) {
        const dp = 0.1 * (1 + 2.4e-4 * v);
        expect((await app.owner.post(`/api/runs/${runId}/readings`, { clientKey: randomUUID(), stageIndex: 0, volumeL: v, upstreamBar: 2 + dp, downstreamBar: 2, flowLh: 2400, tempC: 15 })).status).toBe(201);
      }
      return (await app.owner.get(`/api/runs/${runId}`)).body.stages[0];
    };
    expect((await app.owner.get('/api/settings/winery')).body.gaugeResolutionBar).toBe(0.02);
    const fine = await log((await startedRun()).id);
    expect(fine.forecast).not.toBeNull();
    expect((await app.owner.put('/api/settings/winery', { gaugeResolutionBar: 0.1 })).status).toBe(200);
    const coarse = await log((await startedRun()).id);
    expect(coarse.forecast).toBeNull();
    expect(coarse.flatWarning).toBe('ΔP not rising: possible bypass or gauge fault.');
    const bad = await app.owner.put('/api/settings/winery', { gaugeResolutionBar: 5 });
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields.gaugeResolutionBar).toMatch(/At most/);
    expect((await app.owner.put('/api/settings/winery', { gaugeResolutionBar: 0.02 })).status).toBe(200);
  });
});
