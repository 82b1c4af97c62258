// @vitest-environment node
// A closed run shows its final figures, not a live alarm (issue: plans you can approve with
// confidence). The final figures are what the readings say (common practice, no source): litres
// through each stage and through its last set, the last ΔP, and whether the last set reached
// the cartridge type's terminal ΔP.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closedRun, CLOSED_RUN_READINGS as R } from '../factories/closed-run';
import { signUp, startTestApp, type TestApp } from '../support/test-app';

let app: TestApp;

beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => {
  await app?.close();
});

describe('a closed run’s stages', () => {
  it('carry final litres, the last ΔP and whether terminal ΔP was reached, and no forecast or alarm', async () => {
    const { client: owner } = await signUp(app.baseUrl, { wineryName: 'Final Figures Test Winery' });
    const { running, closed } = await closedRun(owner);

    // While running: a forecast and no final figures.
    expect(running.status).toBe('running');
    expect(running.stages.every((s) => s.final === null)).toBe(true);
    expect(running.stages[1].forecast).not.toBeNull();
    expect(running.stages[1].alarm).not.toBeNull();

    expect(closed!.status).toBe('closed');
    const [pre, mem] = closed!.stages;
    for (const s of closed!.stages) {
      expect(s.forecast).toBeNull();
      expect(s.alarm).toBeNull();
    }
    // Why a stage has no curve is said in words of the past, never "log more readings".
    expect(mem.note).toBeNull();
    expect(pre.fit).toBeNull();
    expect(pre.note).toMatch(/last set only, after a change or regeneration/);
    const lastPre = R.prefilterAfter.at(-1)!;
    expect(pre.terminalDpBar).toBe(1.5);
    expect(pre.final).toEqual({
      litresL: 3000,
      litresLastSetL: 3000 - R.regeneratedAtL,
      changes: 0,
      regenerations: 1,
      lastDpBar: expect.closeTo(lastPre.dpBar, 9),
      maxDpBar: expect.closeTo(lastPre.dpBar, 9),
      terminalReached: true,
    });
    expect(mem.final).toEqual({
      litresL: 3000,
      litresLastSetL: 3000,
      changes: 0,
      regenerations: 0,
      lastDpBar: expect.closeTo(0.3, 9),
      maxDpBar: expect.closeTo(0.3, 9),
      terminalReached: false,
    });
    // The readings and the fitted curve stay, the curve only over the litres filtered: the record, not a forecast.
    expect(running.stages[1].curve.some((q) => q.volumeL > 3000)).toBe(true);
    expect(mem.curve.length).toBeGreaterThan(0);
    expect(mem.curve.every((q) => q.volumeL <= 3000)).toBe(true);
    expect(mem.readings).toHaveLength(R.membrane.length);
    expect(pre.readings).toHaveLength(R.prefilterBefore.length + R.prefilterAfter.length);
  });
});
