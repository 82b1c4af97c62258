import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  BLOCKING_LAWS,
  blockingFlux,
  blockingPressureRatio,
  blockingVolume,
  blockingVolumeAtRatio,
  type BlockingLaw,
} from './blocking';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

// Units: t in min, v in L/m², J in L m⁻² min⁻¹. J0 = 20 L m⁻² min⁻¹ throughout.
describe('blocking laws: evaluated check values (Hermia 1982 forms; hand calculation)', () => {
  it.each([
    // complete, k_b = 0.02 /min: v = (J0/k)(1 − e^(−kt)) = 1000·(1 − e^(−1.2)) = 1000·0.6988058 (hand calculation)
    ['complete', 0.02, 60, 698.8058],
    // standard, k_s = 0.01 m²/L: v = J0 t/(1 + k J0 t/2) = 1200/(1 + 6) = 171.428571 (hand calculation)
    ['standard', 0.01, 60, 1200 / 7],
  ] as const)('%s: v(%s·, t = %s min) ≈ %s L/m²', (law, k, t, v) => {
    expect(rel(blockingVolume(law, { k, j0: 20, t }), v)).toBeLessThan(1e-6);
  });

  it.each([
    // complete: J = J0 e^(−kt) = 20·e^(−1.2) = 20·0.30119421 = 6.0238842 (hand calculation)
    ['complete', 0.02, 60, 20 * Math.exp(-1.2), 6.0239],
    // standard: J = J0/(1 + k J0 t/2)² = 20/49 = 0.4081633 (hand calculation)
    ['standard', 0.01, 60, 20 / 49, 0.40816],
  ] as const)('%s: J(t = %s min) matches the closed form', (law, k, t, exact, printed) => {
    const j = blockingFlux(law, { k, j0: 20, t });
    expect(rel(j, exact)).toBeLessThan(1e-6);
    expect(Math.abs(j - printed)).toBeLessThan(1e-4); // printed to 4–5 figures
  });

  it.each([
    // complete at constant flux: 1/(1 − k v/J0) = 1/(1 − 0.02·100/20) = 1/0.9 = 1.1111 (hand calculation)
    ['complete', 0.02, 100, 1 / 0.9],
    // standard: (1 − k v/2)^−2 = (1 − 0.5)^−2 = 4 (hand calculation)
    ['standard', 0.01, 100, 4],
    // intermediate, k_i = 0.01: e^(k v) = e^1 (hand calculation)
    ['intermediate', 0.01, 100, Math.E],
    // cake, k_c = 0.0005: 1 + k J0 v = 1 + 0.0005·20·100 = 2 (hand calculation)
    ['cake', 0.0005, 100, 2],
  ] as const)('%s: ΔP/ΔP0 after v = %s L/m² at J0 = 20 (t = 5 min)', (law, k, v, ratio) => {
    expect(rel(blockingPressureRatio(law, { k, j0: 20, v }), ratio)).toBeLessThan(1e-6);
  });

  it.each([
    // complete: (J0/k)(1 − 1/r) = 1000·0.9 = 900 (hand calculation)
    ['complete', 0.02, 900],
    // standard: (2/k)(1 − r^−½) = 200·(1 − 0.3162278) = 136.75445 (hand calculation)
    ['standard', 0.01, 200 * (1 - 1 / Math.sqrt(10))],
    // intermediate: ln(10)/0.01 = 230.2585 (hand calculation)
    ['intermediate', 0.01, Math.log(10) / 0.01],
    // cake: (10 − 1)/(0.0005·20) = 900 (hand calculation)
    ['cake', 0.0005, 900],
  ] as const)('%s: v at ratio 10 (ΔP 0.2 → 2.0 bar, or J → 0.1·J0)', (law, k, v) => {
    expect(rel(blockingVolumeAtRatio(law, { k, j0: 20, ratio: 10 }), v)).toBeLessThan(1e-6);
  });

  it('standard blocking v at r = 10 prints as 136.754 (hand calculation)', () => {
    expect(blockingVolumeAtRatio('standard', { k: 0.01, j0: 20, ratio: 10 })).toBeCloseTo(136.754, 3);
  });
});

describe('standard blocking noise-free disc points (hand calculation)', () => {
  // J0 = 20 L m⁻² min⁻¹, k_s = 0.01 m²/L: v = 20t/(1 + 0.1t)
  // t = 5: 100/1.5 = 66.6667; t = 10: 200/2 = 100; t = 20: 400/3 = 133.3333; t = 30: 600/4 = 150
  // so t/v = 0.075, 0.100, 0.150, 0.200 = 1/J0 + (k_s/2)·t = 0.05 + 0.005·t
  it.each([
    [5, 66.6667, 0.075],
    [10, 100, 0.1],
    [20, 133.3333, 0.15],
    [30, 150, 0.2],
  ])('t = %s min → v = %s L/m², t/v = %s', (t, v, tv) => {
    const got = blockingVolume('standard', { k: 0.01, j0: 20, t });
    expect(Math.abs(got - v)).toBeLessThan(5e-5);
    expect(t / got).toBeCloseTo(tv, 12);
  });
});

describe('limits and small constants', () => {
  it.each(BLOCKING_LAWS.map((l) => [l]))('%s: k = 0 gives clean filtration v = J0 t, J = J0, ratio 1', (law) => {
    expect(blockingVolume(law, { k: 0, j0: 20, t: 7 })).toBeCloseTo(140, 12);
    expect(blockingFlux(law, { k: 0, j0: 20, t: 7 })).toBe(20);
    expect(blockingPressureRatio(law, { k: 0, j0: 20, v: 140 })).toBe(1);
  });

  it.each(BLOCKING_LAWS.map((l) => [l]))('%s: tiny k stays accurate (no cancellation)', (law) => {
    const k = 1e-12;
    const v = blockingVolume(law, { k, j0: 20, t: 10 });
    expect(rel(v, 200)).toBeLessThan(1e-8);
    expect(v).toBeLessThan(200);
  });

  it('complete and standard throw at the plugging asymptote', () => {
    expect(() => blockingPressureRatio('complete', { k: 0.02, j0: 20, v: 1000 })).toThrow(RangeError);
    expect(() => blockingPressureRatio('standard', { k: 0.01, j0: 20, v: 200 })).toThrow(RangeError);
  });

  it.each([
    [{ k: -1, j0: 20, t: 1 }],
    [{ k: 0.1, j0: 0, t: 1 }],
    [{ k: 0.1, j0: 20, t: -1 }],
    [{ k: Number.NaN, j0: 20, t: 1 }],
    [{ k: 0.1, j0: Number.POSITIVE_INFINITY, t: 1 }],
  ])('rejects bad input %o', (p) => {
    expect(() => blockingVolume('cake', p)).toThrow(RangeError);
    expect(() => blockingFlux('cake', p)).toThrow(RangeError);
  });

  it('rejects a ratio below 1, k = 0 for the inverse, and unknown laws', () => {
    expect(() => blockingVolumeAtRatio('cake', { k: 0.1, j0: 20, ratio: 0.5 })).toThrow(RangeError);
    expect(() => blockingVolumeAtRatio('cake', { k: 0, j0: 20, ratio: 2 })).toThrow(RangeError);
    expect(() => blockingVolume('sieve' as BlockingLaw, { k: 0.1, j0: 20, t: 1 })).toThrow(RangeError);
  });
});

// Per-law k ranges chosen so that v stays well inside any asymptote over the sampled times.
const lawArb = fc.constantFrom<BlockingLaw>(...BLOCKING_LAWS);
const j0Arb = fc.double({ min: 1, max: 100, noNaN: true });
const kScale: Record<BlockingLaw, number> = { complete: 0.05, standard: 0.02, intermediate: 0.02, cake: 0.002 };

/**
 * Checks `check` on sampled inputs: every law, J0, k = kf × the law's scale with kf from `kfMin`
 * to 1, and the test's own sampled value(s).
 */
function forSampledLaws<T>(kfMin: number, own: fc.Arbitrary<T>, check: (law: BlockingLaw, k: number, j0: number, own: T) => void) {
  fc.assert(fc.property(lawArb, j0Arb, fc.double({ min: kfMin, max: 1, noNaN: true }), own, (law, j0, kf, x) => check(law, kf * kScale[law], j0, x)));
}

describe('properties (Hermia 1982)', () => {
  it('the fouled state depends on v only: ΔP/ΔP0 at constant flux = J0/J at constant pressure', () => {
    forSampledLaws(1e-3, fc.double({ min: 0, max: 100, noNaN: true }), (law, k, j0, t) => {
      const v = blockingVolume(law, { k, j0, t });
      const j = blockingFlux(law, { k, j0, t });
      const ratio = blockingPressureRatio(law, { k, j0, v });
      expect(rel(ratio, j0 / j)).toBeLessThan(1e-9);
    });
  });

  it('J = dv/dt (central difference)', () => {
    forSampledLaws(1e-2, fc.double({ min: 1, max: 100, noNaN: true }), (law, k, j0, t) => {
      const h = 1e-4 * t;
      const d = (blockingVolume(law, { k, j0, t: t + h }) - blockingVolume(law, { k, j0, t: t - h })) / (2 * h);
      expect(rel(d, blockingFlux(law, { k, j0, t }))).toBeLessThan(1e-6);
    });
  });

  it('volume at ratio inverts the pressure ratio', () => {
    forSampledLaws(1e-3, fc.double({ min: 1, max: 50, noNaN: true }), (law, k, j0, r) => {
      const v = blockingVolumeAtRatio(law, { k, j0, ratio: r });
      expect(rel(blockingPressureRatio(law, { k, j0, v }), r)).toBeLessThan(1e-9);
    });
  });

  it('v(t) rises and J(t) falls with time', () => {
    forSampledLaws(1e-3, fc.tuple(fc.double({ min: 0, max: 100, noNaN: true }), fc.double({ min: 0.01, max: 10, noNaN: true })), (law, k, j0, [t, dt]) => {
      expect(blockingVolume(law, { k, j0, t: t + dt })).toBeGreaterThan(blockingVolume(law, { k, j0, t }));
      expect(blockingFlux(law, { k, j0, t: t + dt })).toBeLessThan(blockingFlux(law, { k, j0, t }));
    });
  });
});
