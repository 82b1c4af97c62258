import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { ConstantFlowFit } from './fit-constant-flow';
import { forecastRun, forecastRunFromReadings, runAlarm } from './run-forecast';

/** A fitted cake law built by hand: ΔP0 = 0.2 bar, K = 1e-4 /L, SE(K) = 1e-6 /L, others exact. */
function cakeFit(over: Partial<ConstantFlowFit> = {}): ConstantFlowFit {
  return {
    law: 'cake',
    dp0Bar: 0.2,
    kPerL: 1e-4,
    rss: 1e-4,
    aic: -500,
    r2: 0.99,
    n: 50,
    valid: true,
    sigmaBar: 0.0015,
    covariance: { dp0Dp0: 0, dp0K: 0, kK: 1e-12 },
    residuals: [],
    volumeMaxL: 12000,
    iterations: 1,
    ...over,
  };
}

describe('forecastRun (Hermia 1982 constant-flux cake law; hand calculation)', () => {
  // V at 0.8 bar: (r − 1)/K = (4 − 1)/1e-4 = 30 000 L; at 12 000 L done → 18 000 L left.
  // At 6000 L/h: 18 000/6000 = 3 h 00 min.
  // Delta method: ∂V/∂K = −V/K = −3e8 L²; SE = 3e8 × 1e-6 = 300 L. Band ± t(0.975; 48)·SE with
  // t(0.975; 48) = 2.0106 (NIST/SEMATECH e-Handbook table 1.3.6.7.2 interpolated; stats.test.ts).
  const f = forecastRun({ fit: cakeFit(), currentVolumeL: 12000, terminalDpBar: 0.8, flowLh: 6000, nowMs: 1_000_000 });
  const half = f.tValue * 300;

  it('uses Student t for n − 2 = 48 degrees of freedom, not 2', () => {
    expect(f.dof).toBe(48);
    expect(f.tValue).toBeCloseTo(2.0106, 4);
    expect(f.beyondReadings).toBe(false);
  });

  it.each([
    ['volumeAtTerminalL', 30000],
    ['volumeLeftL', 18000],
    ['volumeSeL', 300],
    ['low', 18000 - half],
    ['high', 18000 + half],
    ['hoursLeft', 3],
    ['hoursLeftLow', (18000 - half) / 6000],
    ['hoursLeftHigh', (18000 + half) / 6000],
    ['endMs', 1_000_000 + 3 * 3_600_000],
    ['endMsLow', 1_000_000 + ((18000 - half) / 6000) * 3_600_000],
    ['endMsHigh', 1_000_000 + ((18000 + half) / 6000) * 3_600_000],
  ] as const)('%s = %s', (key, value) => {
    expect(f[key] as number).toBeCloseTo(value, 4);
  });

  it('splits the time left into whole hours and minutes', () => {
    expect(f.timeLeft).toEqual({ hours: 3, minutes: 0 });
    // 18 000 L at 4000 L/h = 4.5 h → 4 h 30 min (hand calculation)
    const g = forecastRun({ fit: cakeFit(), currentVolumeL: 12000, terminalDpBar: 0.8, flowLh: 4000 });
    expect(g.timeLeft).toEqual({ hours: 4, minutes: 30 });
    expect(g.endMs).toBeUndefined();
  });

  it('reports a terminal ΔP already passed as 0 L left', () => {
    const g = forecastRun({ fit: cakeFit(), currentVolumeL: 31000, terminalDpBar: 0.8, flowLh: 6000 });
    expect(g.reachedTerminal).toBe(true);
    expect(g.volumeLeftL).toBe(0);
    expect(g.low).toBe(0);
    expect(g.hoursLeft).toBe(0);
  });

  it('includes the ΔP0 variance and covariance in the band (delta method)', () => {
    // cake: ∂V/∂ΔP0 = −r/(ΔP0·K) = −4/(0.2·1e-4) = −2e5 L/bar; ∂V/∂K = −3e8 L².
    // Var = (2e5)²·1e-6 + 2·(−2e5)(−3e8)·(−1e-10) + (3e8)²·1e-12 = 4e4 − 1.2e4 + 9e4 = 1.18e5 L²
    const g = forecastRun({
      fit: cakeFit({ covariance: { dp0Dp0: 1e-6, dp0K: -1e-10, kK: 1e-12 } }),
      currentVolumeL: 12000,
      terminalDpBar: 0.8,
      flowLh: 6000,
    });
    expect(g.volumeSeL).toBeCloseTo(Math.sqrt(1.18e5), 6);
  });

  it.each([
    ['an invalid fit', { fit: cakeFit({ valid: false }) }],
    ['zero flow', { flowLh: 0 }],
    ['a negative volume', { currentVolumeL: -5 }],
    ['a NaN terminal ΔP', { terminalDpBar: Number.NaN }],
    ['an infinite clock', { nowMs: Infinity }],
    ['a fit with no fouling (K = 0)', { fit: cakeFit({ kPerL: 0 }) }],
  ])('throws RangeError for %s', (_n, over) => {
    expect(() =>
      forecastRun({ fit: cakeFit(), currentVolumeL: 12000, terminalDpBar: 0.8, flowLh: 6000, ...over }),
    ).toThrow(RangeError);
  });
});

describe('forecastRunFromReadings', () => {
  it('fits a fictional standard-blocking run and forecasts from the best law', () => {
    // ΔP = 0.15/(1 − 2e-5·V)²; terminal 1.5 bar → V = (1 − √(0.1))/2e-5 = 34 188.6 L (hand calculation)
    const pts = Array.from({ length: 30 }, (_, i) => {
      const V = i * 500;
      return { volumeL: V, dpBar: 0.15 / (1 - 2e-5 * V) ** 2 };
    });
    const { forecast, fits } = forecastRunFromReadings({ points: pts, terminalDpBar: 1.5, flowLh: 5000 });
    expect(fits[0].law).toBe('standard');
    expect(forecast.law).toBe('standard');
    expect(forecast.currentVolumeL).toBe(14500);
    expect(forecast.volumeAtTerminalL).toBeCloseTo((1 - Math.sqrt(0.1)) / 2e-5, 3);
    expect(forecast.volumeLeftL).toBeCloseTo((1 - Math.sqrt(0.1)) / 2e-5 - 14500, 3);
  });

  it('refuses to forecast when ΔP is not rising', () => {
    const pts = Array.from({ length: 8 }, (_, i) => ({ volumeL: i * 100, dpBar: 0.4 - i * 0.01 }));
    expect(() => forecastRunFromReadings({ points: pts, terminalDpBar: 1.5, flowLh: 5000 })).toThrow(RangeError);
  });
});

describe('runAlarm (common practice, no source)', () => {
  const f = forecastRun({ fit: cakeFit(), currentVolumeL: 12000, terminalDpBar: 0.8, flowLh: 6000 });
  // forecast 18 000 L left, band 17 397–18 603 L (t(0.975; 48) = 2.0106)
  it.each([
    [10000, 'ok', false, 0],
    [17800, 'watch', false, 0],
    [20000, 'alarm', true, 2000],
  ] as const)('%s L still to bottle → %s', (toBottle, level, alarm, shortfall) => {
    const a = runAlarm({ forecast: f, volumeToBottleL: toBottle });
    expect(a.level).toBe(level);
    expect(a.alarm).toBe(alarm);
    expect(a.shortfallL).toBeCloseTo(shortfall, 9);
    expect(a.marginL).toBeCloseTo(18000 - toBottle, 9);
  });

  it('rejects a negative volume to bottle', () => {
    expect(() => runAlarm({ forecast: f, volumeToBottleL: -1 })).toThrow(RangeError);
  });
});

describe('forecast properties', () => {
  const lawArb = fc.constantFrom('complete', 'standard', 'intermediate', 'cake' as const);
  it('low ≤ left ≤ high, hours = litres/flow, and a higher terminal ΔP leaves more litres', () => {
    fc.assert(
      fc.property(
        lawArb,
        fc.double({ min: 1e-6, max: 1e-4, noNaN: true }),
        fc.double({ min: 1.2, max: 8, noNaN: true }),
        fc.double({ min: 0, max: 5000, noNaN: true }),
        fc.double({ min: 100, max: 20000, noNaN: true }),
        (law, K, r, cur, flow) => {
          const fit = cakeFit({ law, kPerL: K, covariance: { dp0Dp0: 1e-6, dp0K: 0, kK: (K / 50) ** 2 } });
          const a = forecastRun({ fit, currentVolumeL: cur, terminalDpBar: 0.2 * r, flowLh: flow });
          const b = forecastRun({ fit, currentVolumeL: cur, terminalDpBar: 0.2 * r * 1.1, flowLh: flow });
          expect(a.low).toBeLessThanOrEqual(a.volumeLeftL);
          expect(a.volumeLeftL).toBeLessThanOrEqual(a.high);
          expect(a.hoursLeft).toBeCloseTo(a.volumeLeftL / flow, 9);
          expect(b.volumeAtTerminalL).toBeGreaterThan(a.volumeAtTerminalL);
          expect(Number.isFinite(a.high)).toBe(true);
        },
      ),
    );
  });
});
