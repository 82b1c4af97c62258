import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import type { BlockingLaw } from './blocking';
import { fitConstantFlow, volumeAtDp, volumeAtDpGradient, type ConstantFlowFit } from './fit-constant-flow';
import { seededNormals } from '../../tests/support/seeded-random';

const LAWS: BlockingLaw[] = ['complete', 'standard', 'intermediate', 'cake'];

/** ΔP/ΔP0 after V litres at constant flow (Hermia 1982, constant-flux forms). */
function shape(law: BlockingLaw, K: number, V: number): number {
  switch (law) {
    case 'complete':
      return 1 / (1 - K * V);
    case 'standard':
      return (1 - K * V) ** -2;
    case 'intermediate':
      return Math.exp(K * V);
    case 'cake':
      return 1 + K * V;
  }
}

/** K that makes ΔP/ΔP0 = ratio at V = vEnd. */
function kForRatio(law: BlockingLaw, ratio: number, vEnd: number): number {
  switch (law) {
    case 'complete':
      return (1 - 1 / ratio) / vEnd;
    case 'standard':
      return (1 - 1 / Math.sqrt(ratio)) / vEnd;
    case 'intermediate':
      return Math.log(ratio) / vEnd;
    case 'cake':
      return (ratio - 1) / vEnd;
  }
}


function run(law: BlockingLaw, dp0: number, K: number, vEnd: number, n: number, noise = 0, seed = 1) {
  const z = seededNormals(seed);
  return Array.from({ length: n }, (_, i) => {
    const V = (vEnd * i) / (n - 1);
    return { volumeL: V, dpBar: dp0 * shape(law, K, V) * (1 + noise * z()) };
  });
}

const byLaw = (fits: ConstantFlowFit[], law: BlockingLaw) => fits.find((f) => f.law === law)!;

/**
 * The optimum of a least-squares fit satisfies the normal equations Jᵀr = 0: the cosine between
 * the residual vector and each Jacobian column (`columns` per point: ∂/∂ΔP0, ∂/∂K) is below 1e-4.
 */
function expectNormalEquations(points: { volumeL: number }[], residuals: number[], columns: (p: { volumeL: number }) => [number, number]) {
  let g0 = 0;
  let g1 = 0;
  let n0 = 0;
  let n1 = 0;
  let nr = 0;
  points.forEach((p, i) => {
    const r = residuals[i];
    const [d0, d1] = columns(p);
    g0 += r * d0;
    g1 += r * d1;
    n0 += d0 * d0;
    n1 += d1 * d1;
    nr += r * r;
  });
  expect(Math.abs(g0) / Math.sqrt(n0 * nr)).toBeLessThan(1e-4);
  expect(Math.abs(g1) / Math.sqrt(n1 * nr)).toBeLessThan(1e-4);
}

describe('fitConstantFlow: noise-free runs are recovered exactly (constructed from the Hermia 1982 forms)', () => {
  it.each(LAWS.map((l) => [l]))('%s: law first, ΔP0 and K to 1e-8', (law) => {
    const K = kForRatio(law, 3, 4000); // ΔP triples over 4000 L
    const fits = fitConstantFlow(run(law, 0.18, K, 4000, 25));
    expect(fits).toHaveLength(4);
    expect(new Set(fits.map((f) => f.law))).toEqual(new Set(LAWS));
    expect(fits[0].law).toBe(law);
    expect(Math.abs(fits[0].dp0Bar / 0.18 - 1)).toBeLessThan(1e-8);
    expect(Math.abs(fits[0].kPerL / K - 1)).toBeLessThan(1e-8);
    expect(fits[0].r2).toBeCloseTo(1, 12);
    expect(fits[0].valid).toBe(true);
  });

  it('cake on three readings is plain linear regression (hand calculation)', () => {
    // ΔP = 0.2, 0.3, 0.4 bar at V = 0, 500, 1000 L: slope 0.1/500 = 2e-4 bar/L, intercept 0.2 bar,
    // so ΔP0 = 0.2 bar and K = slope/ΔP0 = 1e-3 per L.
    const fits = fitConstantFlow([
      { volumeL: 0, dpBar: 0.2 },
      { volumeL: 500, dpBar: 0.3 },
      { volumeL: 1000, dpBar: 0.4 },
    ]);
    const cake = byLaw(fits, 'cake');
    expect(cake.dp0Bar).toBeCloseTo(0.2, 12);
    expect(cake.kPerL).toBeCloseTo(1e-3, 12);
    expect(fits[0].law).toBe('cake');
  });
});

describe('fitConstantFlow: statistics reported', () => {
  const pts = run('standard', 0.15, kForRatio('standard', 2.5, 6000), 6000, 80, 0.01, 7);
  const fits = fitConstantFlow(pts);
  const n = pts.length;
  const mean = pts.reduce((s, p) => s + p.dpBar, 0) / n;
  const tss = pts.reduce((s, p) => s + (p.dpBar - mean) ** 2, 0);

  it.each(LAWS.map((l) => [l]))('%s: residuals, RSS, AIC = n ln(RSS/n) + 2p and r² = 1 − RSS/TSS agree', (law) => {
    const f = byLaw(fits, law);
    expect(f.n).toBe(n);
    expect(f.residuals).toHaveLength(n);
    f.residuals.forEach((r, i) => {
      const model = f.dp0Bar * shape(law, f.kPerL, pts[i].volumeL);
      expect(r).toBeCloseTo(pts[i].dpBar - model, 12);
    });
    const rss = f.residuals.reduce((s, r) => s + r * r, 0);
    expect(f.rss).toBeCloseTo(rss, 14);
    expect(f.aic).toBeCloseTo(n * Math.log(rss / n) + 4, 9); // Akaike 1974, p = 2
    expect(f.r2).toBeCloseTo(1 - rss / tss, 12);
    expect(f.sigmaBar).toBeCloseTo(Math.sqrt(rss / (n - 2)), 14);
  });

  it('valid fits are ordered by AIC, lowest first', () => {
    for (let i = 1; i < fits.length; i++) expect(fits[i].aic).toBeGreaterThanOrEqual(fits[i - 1].aic);
  });

  it('cake covariance equals the straight-line least-squares formulas (Draper & Smith, Applied Regression Analysis, 3rd ed., ch. 1; from memory)', () => {
    // ΔP = a + b·V with b = a·K: Var(a) = σ²·ΣV²/(n·Sxx); Var(b) = σ²/Sxx; Cov(a, b) = −σ²·V̄/Sxx.
    // Delta method for K = b/a: Var(K) = (Var(b) − 2K·Cov(a, b) + K²·Var(a))/a².
    const f = byLaw(fits, 'cake');
    const s2 = f.sigmaBar ** 2;
    const vbar = pts.reduce((s, p) => s + p.volumeL, 0) / n;
    const sxx = pts.reduce((s, p) => s + (p.volumeL - vbar) ** 2, 0);
    const sum2 = pts.reduce((s, p) => s + p.volumeL ** 2, 0);
    const varA = (s2 * sum2) / (n * sxx);
    const varB = s2 / sxx;
    const covAB = (-s2 * vbar) / sxx;
    const K = f.kPerL;
    const a = f.dp0Bar;
    expect(f.covariance.dp0Dp0 / varA).toBeCloseTo(1, 9);
    expect(f.covariance.kK / ((varB - 2 * K * covAB + K * K * varA) / (a * a))).toBeCloseTo(1, 9);
    expect(f.covariance.dp0K / ((covAB - K * varA) / a)).toBeCloseTo(1, 9);
  });

  it.each([['complete'], ['standard'], ['intermediate']] as const)(
    '%s: the optimum satisfies the normal equations Jᵀr = 0',
    (law) => {
      const f = byLaw(fits, law);
      const h = 1e-7;
      expectNormalEquations(pts, f.residuals, (p) => [
        shape(law, f.kPerL, p.volumeL),
        (f.dp0Bar * (shape(law, f.kPerL * (1 + h), p.volumeL) - shape(law, f.kPerL * (1 - h), p.volumeL))) / (2 * h * f.kPerL),
      ]);
    },
  );

  it('a long logger file (10 000 readings) is fitted to the full-data optimum', () => {
    const big = run('intermediate', 0.12, kForRatio('intermediate', 3, 20000), 20000, 10000, 0.01, 3);
    const f = fitConstantFlow(big);
    expect(f[0].law).toBe('intermediate');
    const best = f[0];
    expectNormalEquations(big, best.residuals, (p) => {
      const e = Math.exp(best.kPerL * p.volumeL);
      return [e, best.dp0Bar * p.volumeL * e];
    });
    expect(Math.abs(best.kPerL / kForRatio('intermediate', 3, 20000) - 1)).toBeLessThan(0.01);
  });
});

describe('fitConstantFlow: non-physical results are rejected', () => {
  it('falling ΔP (possible bypass or faulty gauge) gives fits marked invalid, after any valid one', () => {
    const pts = Array.from({ length: 10 }, (_, i) => ({ volumeL: i * 300, dpBar: 0.5 - 2e-5 * i * 300 }));
    const fits = fitConstantFlow(pts);
    for (const f of fits) {
      expect(f.kPerL).toBeLessThan(0);
      expect(f.valid).toBe(false);
      expect(f.note).toMatch(/does not rise/);
      expect(() => volumeAtDp(f, 1)).toThrow(RangeError);
    }
  });

  it('complete and standard fits always stay below their asymptote K·Vmax < 1', () => {
    // steeper than any complete/standard curve can follow near its end
    const pts = run('intermediate', 0.1, kForRatio('intermediate', 40, 1000), 1000, 30);
    const fits = fitConstantFlow(pts);
    for (const law of ['complete', 'standard'] as const) {
      const f = byLaw(fits, law);
      expect(f.kPerL * 1000).toBeLessThan(1);
      expect(Number.isFinite(f.rss)).toBe(true);
    }
  });

  it.each([
    ['fewer than 3 readings', [{ volumeL: 0, dpBar: 0.2 }, { volumeL: 10, dpBar: 0.3 }]],
    ['a negative volume', [{ volumeL: -1, dpBar: 0.2 }, { volumeL: 10, dpBar: 0.3 }, { volumeL: 20, dpBar: 0.4 }]],
    ['a zero ΔP', [{ volumeL: 0, dpBar: 0 }, { volumeL: 10, dpBar: 0.3 }, { volumeL: 20, dpBar: 0.4 }]],
    ['a NaN', [{ volumeL: 0, dpBar: 0.2 }, { volumeL: Number.NaN, dpBar: 0.3 }, { volumeL: 20, dpBar: 0.4 }]],
    ['an infinite ΔP', [{ volumeL: 0, dpBar: 0.2 }, { volumeL: 5, dpBar: Infinity }, { volumeL: 20, dpBar: 0.4 }]],
    ['one volume only', [{ volumeL: 5, dpBar: 0.2 }, { volumeL: 5, dpBar: 0.3 }, { volumeL: 5, dpBar: 0.4 }]],
  ])('throws RangeError for %s', (_name, pts) => {
    expect(() => fitConstantFlow(pts)).toThrow(RangeError);
  });
});

describe('volumeAtDp (inverse of the constant-flux forms, Hermia 1982)', () => {
  // ΔP0 = 0.2 bar, K = 1e-4 /L, target 0.8 bar → r = 4 (hand calculation):
  it.each([
    ['complete', (1 - 1 / 4) / 1e-4], // (1 − 1/r)/K = 0.75/1e-4 = 7500 L
    ['standard', (1 - 1 / 2) / 1e-4], // (1 − r^−½)/K = 0.5/1e-4 = 5000 L
    ['intermediate', Math.log(4) / 1e-4], // ln 4/K = 13 862.94 L
    ['cake', 3 / 1e-4], // (r − 1)/K = 30 000 L
  ] as const)('%s: %s L to reach 0.8 bar', (law, v) => {
    expect(volumeAtDp({ law, dp0Bar: 0.2, kPerL: 1e-4 }, 0.8)).toBeCloseTo(v, 6);
  });

  it('intermediate value prints as 13 862.94 L (hand calculation: ln 4 = 1.3862944)', () => {
    expect(volumeAtDp({ law: 'intermediate', dp0Bar: 0.2, kPerL: 1e-4 }, 0.8)).toBeCloseTo(13862.94, 2);
  });

  it('a target at or below the clean ΔP is reached at once (0 L); bad inputs throw', () => {
    expect(volumeAtDp({ law: 'cake', dp0Bar: 0.2, kPerL: 1e-4 }, 0.15)).toBe(0);
    expect(() => volumeAtDp({ law: 'cake', dp0Bar: 0.2, kPerL: 0 }, 1)).toThrow(RangeError);
    expect(() => volumeAtDp({ law: 'cake', dp0Bar: 0.2, kPerL: 1e-4 }, -1)).toThrow(RangeError);
    expect(() => volumeAtDp({ law: 'cake', dp0Bar: 0.2, kPerL: 1e-4 }, Number.NaN)).toThrow(RangeError);
    expect(() => volumeAtDp({ law: 'cake', dp0Bar: -0.2, kPerL: 1e-4 }, 1)).toThrow(RangeError);
  });

  it('property: the fitted law reaches dpBar at volumeAtDp, and the gradient matches finite differences', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...LAWS),
        fc.double({ min: 0.05, max: 0.5, noNaN: true }),
        fc.double({ min: 1e-6, max: 1e-3, noNaN: true }),
        fc.double({ min: 1.05, max: 20, noNaN: true }),
        (law, dp0, K, r) => {
          const fit = { law, dp0Bar: dp0, kPerL: K };
          const V = volumeAtDp(fit, r * dp0);
          expect(dp0 * shape(law, K, V)).toBeCloseTo(r * dp0, 9);
          const [gA, gK] = volumeAtDpGradient(fit, r * dp0);
          const h = 1e-6;
          const fdA = (volumeAtDp({ ...fit, dp0Bar: dp0 * (1 + h) }, r * dp0) - volumeAtDp({ ...fit, dp0Bar: dp0 * (1 - h) }, r * dp0)) / (2 * h * dp0);
          const fdK = (volumeAtDp({ ...fit, kPerL: K * (1 + h) }, r * dp0) - volumeAtDp({ ...fit, kPerL: K * (1 - h) }, r * dp0)) / (2 * h * K);
          expect(Math.abs(gA - fdA)).toBeLessThan(1e-5 * Math.abs(fdA) + 1e-9);
          expect(Math.abs(gK - fdK)).toBeLessThan(1e-5 * Math.abs(fdK));
        },
      ),
    );
  });
});

describe('property: runs generated from each law with 0.5 % noise are recovered', () => {
  it('law ranked first, ΔP0 and K within a few per cent', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...LAWS),
        fc.double({ min: 0.08, max: 0.4, noNaN: true }), // clean ΔP, bar
        fc.double({ min: 2, max: 5, noNaN: true }), // ΔP rise over the run
        fc.double({ min: 2000, max: 40000, noNaN: true }), // litres in the run
        fc.integer({ min: 60, max: 400 }), // readings
        fc.integer({ min: 1, max: 2 ** 31 - 1 }), // noise seed
        (law, dp0, ratio, vEnd, n, seed) => {
          const K = kForRatio(law, ratio, vEnd);
          const fits = fitConstantFlow(run(law, dp0, K, vEnd, n, 0.005, seed));
          expect(fits[0].law).toBe(law);
          expect(Math.abs(fits[0].dp0Bar / dp0 - 1)).toBeLessThan(0.02);
          expect(Math.abs(fits[0].kPerL / K - 1)).toBeLessThan(0.05);
        },
      ),
      { numRuns: 200 },
    );
  });
});
