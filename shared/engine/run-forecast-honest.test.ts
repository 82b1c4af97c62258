/**
 * The forecast says what it knows: the cases of a field review (flat, one tick, three
 * readings, two volumes, regenerated mid-run, slowed line) and a Monte Carlo check of the
 * band's coverage. Laws: Hermia, Trans. IChemE 60 (1982) 183–187 (constant-flux forms);
 * model averaging: Burnham & Anderson, Model Selection and Multimodel Inference (2002);
 * t quantiles: NIST/SEMATECH e-Handbook table 1.3.6.7.2; water viscosity ratio: IAPWS R12-08.
 */
import { describe, expect, it } from 'vitest';
import { seededNormals } from '../../tests/support/seeded-random';
import fc from 'fast-check';
import type { BlockingLaw } from './blocking';
import { waterViscosity } from './fluids';
import { DP_NOT_RISING_MESSAGE, detectFlatDp, fittedDpBar, forecastRunFromReadings, runAlarm } from './run-forecast';

const LAWS: BlockingLaw[] = ['complete', 'standard', 'intermediate', 'cake'];

/** K that makes ΔP reach r·ΔP0 at volume v (inverse of each constant-flux law; hand algebra). */
function kFor(law: BlockingLaw, r: number, v: number): number {
  switch (law) {
    case 'complete':
      return (1 - 1 / r) / v;
    case 'standard':
      return (1 - 1 / Math.sqrt(r)) / v;
    case 'intermediate':
      return Math.log(r) / v;
    case 'cake':
      return (r - 1) / v;
  }
}

describe('flat ΔP is never fouling (common practice, no source)', () => {
  it('four flat membrane readings (0.05 bar at 0, 800, 1 600, 2 400 L) give no litres, only words', () => {
    const points = [0, 800, 1600, 2400].map((v) => ({ volumeL: v, dpBar: 0.05 }));
    expect(() => forecastRunFromReadings({ points, terminalDpBar: 1.0, flowLh: 2400, nowMs: 0 })).toThrow(DP_NOT_RISING_MESSAGE);
    expect(DP_NOT_RISING_MESSAGE).toMatch(/bypass/);
    expect(DP_NOT_RISING_MESSAGE).toMatch(/gauge/);
  });

  it('three flat readings with a clock throw instead of giving an end time', () => {
    const points = [0, 500, 1000].map((v) => ({ volumeL: v, dpBar: 0.2 }));
    expect(() => forecastRunFromReadings({ points, terminalDpBar: 1.0, flowLh: 2400, nowMs: Date.UTC(2026, 0, 1) })).toThrow(RangeError);
  });

  it('a noisy flat log (0.15 ± 0.005 bar) is not fouling', () => {
    const noise = [0.004, -0.005, 0.001, 0.003, -0.002, 0.005, -0.004, 0, 0.002, -0.003, 0.005, 0.004];
    const points = noise.map((e, i) => ({ volumeL: i * 400, dpBar: 0.15 + e }));
    expect(() => forecastRunFromReadings({ points, terminalDpBar: 1.0, flowLh: 2400 })).toThrow(RangeError);
    expect(detectFlatDp(points)).toEqual({ flat: true, reason: 'ΔP not rising: possible bypass or gauge fault.' });
  });

  it('a gauge moving one 0.02 bar tick is within the resolution, not 316 000 L of fouling', () => {
    // least-squares straight-line rise across 0–2 000 L = 0.016 bar (hand calculation) ≤ 0.02
    const points = [0.15, 0.15, 0.15, 0.15, 0.17].map((d, i) => ({ volumeL: i * 500, dpBar: d }));
    expect(() => forecastRunFromReadings({ points, terminalDpBar: 1.0, flowLh: 2400 })).toThrow(DP_NOT_RISING_MESSAGE);
    expect(detectFlatDp(points).flat).toBe(true);
  });

  it('detectFlatDp needs five readings and rising litres; a rising stage is not flat', () => {
    const four = [0, 800, 1600, 2400].map((v) => ({ volumeL: v, dpBar: 0.05 }));
    expect(detectFlatDp(four).flat).toBe(false);
    expect(detectFlatDp([...four, { volumeL: 3200, dpBar: 0.05 }]).flat).toBe(true);
    expect(detectFlatDp([0, 0, 0, 0, 0].map(() => ({ volumeL: 100, dpBar: 0.05 }))).flat).toBe(false);
    const rising = [0, 500, 1000, 1500, 2000].map((v) => ({ volumeL: v, dpBar: 0.15 + v * 2e-5 }));
    expect(detectFlatDp(rising)).toEqual({ flat: false, reason: 'ΔP is rising.' });
    expect(detectFlatDp(rising, { resolutionBar: 0.05 }).flat).toBe(true);
  });

  it('property: readings that stay within the gauge resolution never yield a litres-left figure', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.03, max: 2, noNaN: true }),
        fc.array(fc.double({ min: -0.004, max: 0.004, noNaN: true }), { minLength: 3, maxLength: 30 }),
        fc.double({ min: 10, max: 5000, noNaN: true }),
        (base, noise, step) => {
          const points = noise.map((e, i) => ({ volumeL: i * step, dpBar: base + e }));
          expect(() => forecastRunFromReadings({ points, terminalDpBar: base * 5, flowLh: 2000 })).toThrow(RangeError);
        },
      ),
    );
  });
});

describe('small samples widen the band (Student t, NIST table 1.3.6.7.2)', () => {
  it('three readings get t(0.975; 1) = 12.706, not 2', () => {
    const points = [
      { volumeL: 0, dpBar: 0.2 },
      { volumeL: 1000, dpBar: 0.3 },
      { volumeL: 2000, dpBar: 0.41 },
    ];
    const { forecast } = forecastRunFromReadings({ points, terminalDpBar: 0.6, flowLh: 2000 });
    expect(forecast.dof).toBe(1);
    expect(forecast.tValue).toBeCloseTo(12.706, 3);
    const half = forecast.tValue * forecast.volumeSeL;
    expect(forecast.high - forecast.volumeLeftL).toBeCloseTo(half, 6);
  });

  it('four readings at two volumes give no band of zero width: they are refused', () => {
    const points = [
      { volumeL: 0, dpBar: 0.2 },
      { volumeL: 0, dpBar: 0.2 },
      { volumeL: 1000, dpBar: 0.3 },
      { volumeL: 1000, dpBar: 0.3 },
    ];
    expect(() => forecastRunFromReadings({ points, terminalDpBar: 0.6, flowLh: 2000 })).toThrow(/3 or more different volumes/);
  });
});

describe('a run regenerated mid-way restarts its volumes (hand calculation, cake law)', () => {
  // Segment 1: ΔP = 0.15(1 + 5e-4·V), readings 0–5 500 L (0.56 bar), heading for 0.60 bar; regenerated at
  // 6 000 L (a reading at exactly the restart volume is the first of the new segment).
  // Segment 2 fouls the same way from 0.15 bar: terminal 0.8 bar at V' = (0.8/0.15 − 1)/5e-4 = 8 666.7 L
  // after the restart, i.e. at 14 666.7 L of the run.
  const seg1 = Array.from({ length: 12 }, (_, i) => ({ volumeL: i * 500, dpBar: 0.15 * (1 + 5e-4 * i * 500) }));

  it('three readings after the restart fit on their own', () => {
    const seg2 = [0, 400, 800].map((v) => ({ volumeL: 6000 + v, dpBar: 0.15 * (1 + 5e-4 * v) }));
    const { forecast } = forecastRunFromReadings({ points: [...seg1, ...seg2], terminalDpBar: 0.8, flowLh: 2400, restartsAtL: [6000] });
    expect(forecast.segmentStartL).toBe(6000);
    expect(forecast.volumeAtTerminalL).toBeCloseTo(6000 + 8666.67, 0);
    expect(forecast.volumeLeftL).toBeCloseTo(14666.67 - 6800, 0);
    expect(forecast.beyondReadings).toBe(true); // 8 667 L against 800 L seen since the restart
    // without the restart the drop from 0.60 to 0.15 bar hides the fouling
    expect(() => forecastRunFromReadings({ points: [...seg1, ...seg2], terminalDpBar: 0.8, flowLh: 2400 })).toThrow(RangeError);
  });

  it('one reading after the restart uses the previous segment’s K as a prior, and alarms when short', () => {
    const seg2 = [{ volumeL: 6000, dpBar: 0.15 }];
    const { forecast } = forecastRunFromReadings({ points: [...seg1, ...seg2], terminalDpBar: 0.8, flowLh: 2400, restartsAtL: [6000] });
    expect(forecast.basis).toBe('previous-segment');
    expect(forecast.law).toBe('cake');
    expect(forecast.volumeLeftL).toBeCloseTo(8666.67, 0);
    expect(forecast.low).toBeLessThanOrEqual(8667);
    expect(forecast.high).toBeGreaterThanOrEqual(8666);
    expect(runAlarm({ forecast, volumeToBottleL: 12000 }).level).toBe('alarm');
  });
});

describe('readings carry flow and temperature (Darcy: ΔP ∝ μ·Q; hand calculation)', () => {
  // Resistance fouls as R = R0(1 + 3e-4·V). ΔP0 = 0.15 bar at 2 475 L/h; the line slows to 1 500 L/h
  // at 6 000 L. At 1 500 L/h ΔP0 = 0.15·1500/2475 = 0.090909 bar; terminal 0.8 bar is reached at
  // V = (0.8/0.090909 − 1)/3e-4 = 26 000 L; at 12 000 L now, 14 000 L are left.
  const points = Array.from({ length: 25 }, (_, i) => {
    const v = i * 500;
    const q = v <= 6000 ? 2475 : 1500;
    return { volumeL: v, dpBar: 0.15 * (q / 2475) * (1 + 3e-4 * v), flowLh: q };
  });

  it('forecasts at the current flow', () => {
    const { forecast } = forecastRunFromReadings({ points, terminalDpBar: 0.8, flowLh: 1500 });
    expect(forecast.volumeLeftL).toBeCloseTo(14000, -1);
    expect(forecast.hoursLeft).toBeCloseTo(14000 / 1500, 1);
  });

  it('without the flows the same readings mislead', () => {
    const bare = points.map((q) => ({ volumeL: q.volumeL, dpBar: q.dpBar }));
    let left: number | null = null;
    try {
      left = forecastRunFromReadings({ points: bare, terminalDpBar: 0.8, flowLh: 1500 }).forecast.volumeLeftL;
    } catch {
      left = null;
    }
    expect(left === null || Math.abs(left - 14000) > 1400).toBe(true);
  });

  it('readings at 10 °C are brought to 20 °C with the IAPWS viscosity ratio', () => {
    const mu10 = waterViscosity(10);
    const mu20 = waterViscosity(20);
    expect(mu10 / mu20).toBeCloseTo(1.3059 / 1.0016, 3); // IAPWS R12-08 / IAPWS-95 tables: 1.3059 and 1.0016 mPa·s
    const cold = Array.from({ length: 10 }, (_, i) => ({ volumeL: i * 500, dpBar: 0.15 * (mu10 / mu20) * (1 + 3e-4 * i * 500), tempC: 10 }));
    const { forecast } = forecastRunFromReadings({ points: cold, terminalDpBar: 0.8, flowLh: 2000, tempC: 20 });
    // at 20 °C: (0.8/0.15 − 1)/3e-4 = 14 444.4 L at terminal
    expect(forecast.volumeAtTerminalL).toBeCloseTo(14444.4, 0);
  });
});

describe('Monte Carlo coverage of the ≈95 % band (200 noisy runs per law; Burnham & Anderson 2002 averaging)', () => {
  // ΔP0 = 0.15 bar, terminal 1.0 bar reached at 10 000 L for every law; readings every 500 L with
  // gauge noise σ = 0.005 bar; the line at 2 400 L/h. Fictional, generated here.
  const VT = 10000;
  function coverage(law: BlockingLaw, fraction: number, seed: number) {
    const K = kFor(law, 1.0 / 0.15, VT);
    const noise = seededNormals(seed);
    let held = 0;
    let beyond = 0;
    let refused = 0;
    for (let run = 0; run < 200; run++) {
      const points = [];
      for (let v = 0; v <= fraction * VT + 1e-9; v += 500) {
        points.push({ volumeL: v, dpBar: fittedDpBar({ law, dp0Bar: 0.15, kPerL: K }, v) + 0.005 * noise() });
      }
      const cur = points[points.length - 1].volumeL;
      const truth = VT - cur;
      try {
        const { forecast } = forecastRunFromReadings({ points, terminalDpBar: 1.0, flowLh: 2400 });
        if (forecast.beyondReadings) beyond++;
        else if (forecast.low <= truth && truth <= forecast.high) held++;
      } catch {
        refused++;
      }
    }
    return { held, beyond, refused };
  }

  it.each(LAWS)('%s law, readings to 60 % of the run: the band holds the truth ≥ 90 % of the time', (law) => {
    const c = coverage(law, 0.6, 1234 + LAWS.indexOf(law));
    expect(c.held / 200).toBeGreaterThanOrEqual(0.9);
  });

  it.each(LAWS)('%s law, readings to 30 %: the band holds the truth ≥ 90 % or says "beyond the readings"', (law) => {
    const c = coverage(law, 0.3, 4321 + LAWS.indexOf(law));
    expect(c.held / 200 >= 0.9 || (c.held + c.beyond) / 200 >= 0.9).toBe(true);
  });
});

describe('no non-finite figure ever leaves the forecast (property)', () => {
  it('every number is finite and the band is ordered', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ v: fc.double({ min: 0, max: 1e6, noNaN: true }), d: fc.double({ min: 1e-3, max: 10, noNaN: true }) }), { minLength: 3, maxLength: 20 }),
        fc.double({ min: 0.01, max: 20, noNaN: true }),
        fc.double({ min: 1, max: 1e5, noNaN: true }),
        (raw, terminal, flow) => {
          const points = raw.map((q) => ({ volumeL: q.v, dpBar: q.d }));
          let f;
          try {
            f = forecastRunFromReadings({ points, terminalDpBar: terminal, flowLh: flow, nowMs: 0 }).forecast;
          } catch (e) {
            expect(e).toBeInstanceOf(RangeError);
            return;
          }
          for (const [k, v] of Object.entries(f)) {
            if (typeof v === 'number') expect(Number.isFinite(v), k).toBe(true);
          }
          expect(f.low).toBeLessThanOrEqual(f.volumeLeftL + 1e-6);
          expect(f.volumeLeftL).toBeLessThanOrEqual(f.high + 1e-6);
        },
      ),
    );
  });
});
