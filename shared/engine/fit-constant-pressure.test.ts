import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { BLOCKING_LAWS, blockingVolume, type BlockingLaw } from './blocking';
import { discAreaM2FromDiameterMm, fitConstantPressure, fitConstantPressureLaws } from './fit-constant-pressure';
import { seededNormals } from '../../tests/support/seeded-random';


describe('Vmax disc test on the noise-free standard-blocking points (hand calculation)', () => {
  // Per area, J0 = 20 L m⁻² min⁻¹ and k_s = 0.01 m²/L give v = 20t/(1 + 0.1t) (Hermia 1982):
  //   t = 5, 10, 20, 30 min → v = 66.6667, 100, 133.3333, 150 L/m²; t/v = 0.075, 0.100, 0.150, 0.200 min·m²/L.
  // On a fictional disc of A = 3.5e-4 m² the filtrate is V = v·A = 23.3333, 35, 46.6667, 52.5 mL, so
  //   t/V = 214.286, 285.714, 428.571, 571.429 min/L.
  // Straight line t/V = 1/Q0 + t/Vmax: slope = (571.429 − 214.286)/(30 − 5) = 14.2857 /L → Vmax = 0.07 L;
  //   intercept = 214.286 − 5·14.2857 = 142.857 min/L → Q0 = 0.007 L/min.
  // Per area: Vmax/A = 0.07/3.5e-4 = 200 L/m² (= 2/k_s); J0 = Q0/A = 20 L m⁻² min⁻¹ = 1200 L m⁻² h⁻¹,
  //   i.e. 1/J0 = 0.05 min·m²/L, the intercept of t/v.
  const A = 3.5e-4;
  const v = [200 / 3, 100, 400 / 3, 150];
  const points = [5, 10, 20, 30].map((t, i) => ({ timeS: t * 60, volumeMl: v[i] * A * 1000 }));
  const r = fitConstantPressure({ points, discAreaM2: A });

  it.each([
    ['vmaxL', 0.07],
    ['vmaxLPerM2', 200],
    ['q0LPerMin', 0.007],
    ['j0LPerM2H', 1200],
    ['r2', 1],
  ] as const)('%s = %s', (key, value) => {
    expect(Math.abs(r[key] / value - 1)).toBeLessThan(1e-9);
  });

  it('the printed 4-figure volumes give the same line to 1e-4', () => {
    const printed = [66.6667, 100, 133.3333, 150].map((vv, i) => ({ timeS: [5, 10, 20, 30][i] * 60, volumeMl: vv * A * 1000 }));
    const q = fitConstantPressure({ points: printed, discAreaM2: A });
    expect(q.vmaxLPerM2).toBeCloseTo(200, 2);
    expect(q.j0LPerM2H).toBeCloseTo(1200, 1);
  });

  it('the non-linear fits rank standard blocking first with k_s = 0.01 and J0 = 20', () => {
    expect(r.fits).toHaveLength(4);
    expect(r.fits[0].law).toBe('standard');
    expect(r.fits[0].k).toBeCloseTo(0.01, 9);
    expect(r.fits[0].j0LPerM2Min).toBeCloseTo(20, 8);
    expect(r.fits[0].j0LPerM2H).toBeCloseTo(1200, 6);
    expect(r.nLine).toBe(4);
    expect(r.discAreaM2).toBe(A);
  });
});

describe('law fits on per-area data', () => {
  const J0 = 20; // L m⁻² min⁻¹
  const K: Record<BlockingLaw, number> = { complete: 0.05, standard: 0.01, intermediate: 0.01, cake: 0.0005 };

  it.each(BLOCKING_LAWS.map((l) => [l]))('%s: noise-free v(t) from blockingVolume is recovered exactly', (law) => {
    const pts = Array.from({ length: 30 }, (_, i) => {
      const t = 2 * (i + 1);
      return { timeMin: t, volumeLPerM2: blockingVolume(law, { k: K[law], j0: J0, t }) };
    });
    const fits = fitConstantPressureLaws(pts);
    expect(fits[0].law).toBe(law);
    expect(fits[0].k / K[law]).toBeCloseTo(1, 7);
    expect(fits[0].j0LPerM2Min / J0).toBeCloseTo(1, 7);
    // residuals and RSS agree, AIC = n ln(RSS/n) + 2p (Akaike 1974)
    for (const f of fits) {
      const rss = f.residualsLPerM2.reduce((s, x) => s + x * x, 0);
      expect(f.rss).toBeCloseTo(rss, 12);
      if (f.valid) expect(f.aic).toBeCloseTo(30 * Math.log(Math.max(rss / 30, 1e-300)) + 4, 6);
    }
  });

  it('property: 0.3 % noise on 40 readings over 60 min; law first, k and J0 within a few per cent', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...BLOCKING_LAWS),
        fc.double({ min: 0.6, max: 1.6, noNaN: true }), // scale of k
        fc.double({ min: 10, max: 40, noNaN: true }), // J0
        fc.integer({ min: 1, max: 2 ** 31 - 1 }),
        (law, kf, j0, seed) => {
          // scale k with J0 so the flux falls to roughly 10–40 % of J0 by 60 min
          const k = law === 'complete' ? K[law] * kf : law === 'cake' ? (K[law] * kf * 400) / (j0 * j0) : (K[law] * kf * 20) / j0;
          const z = seededNormals(seed);
          const pts = Array.from({ length: 40 }, (_, i) => {
            const t = 1.5 * (i + 1);
            return { timeMin: t, volumeLPerM2: blockingVolume(law, { k, j0, t }) * (1 + 0.003 * z()) };
          });
          const fits = fitConstantPressureLaws(pts);
          expect(fits[0].law).toBe(law);
          expect(Math.abs(fits[0].k / k - 1)).toBeLessThan(0.05);
          expect(Math.abs(fits[0].j0LPerM2Min / j0 - 1)).toBeLessThan(0.03);
        },
      ),
      { numRuns: 100 },
    );
  });

  it('flux that does not decline is not a blocking law (k < 0 rejected)', () => {
    const pts = Array.from({ length: 10 }, (_, i) => ({ timeMin: i + 1, volumeLPerM2: 10 * (i + 1) + 0.2 * (i + 1) ** 2 }));
    const fits = fitConstantPressureLaws(pts);
    for (const f of fits.filter((x) => x.k < 0)) expect(f.valid).toBe(false);
    expect(fits.some((f) => !f.valid)).toBe(true);
  });
});

describe('discAreaM2FromDiameterMm', () => {
  it.each([
    // π·(0.025 m)²/4 = 4.9087e-4 m² (hand calculation)
    [25, (Math.PI * 0.025 ** 2) / 4],
    // π·(0.047 m)²/4 = 1.7349e-3 m² (hand calculation)
    [47, 1.7349445429449633e-3],
  ])('%s mm → %s m²', (d, a) => {
    expect(discAreaM2FromDiameterMm(d)).toBeCloseTo(a, 12);
  });
  it('rejects a zero diameter', () => {
    expect(() => discAreaM2FromDiameterMm(0)).toThrow(RangeError);
  });
});

describe('input checks', () => {
  const ok = [
    { timeS: 300, volumeMl: 20 },
    { timeS: 600, volumeMl: 30 },
    { timeS: 1200, volumeMl: 40 },
  ];
  it.each([
    ['a zero area', { points: ok, discAreaM2: 0 }],
    ['a negative time', { points: [{ timeS: -1, volumeMl: 1 }, ...ok], discAreaM2: 1e-3 }],
    ['a NaN volume', { points: [{ timeS: 100, volumeMl: Number.NaN }, ...ok], discAreaM2: 1e-3 }],
    ['too few readings', { points: ok.slice(0, 2), discAreaM2: 1e-3 }],
    ['no plugging (t/V flat)', { points: [1, 2, 3, 4].map((t) => ({ timeS: t * 60, volumeMl: t * 10 })), discAreaM2: 1e-3 }],
  ])('throws RangeError for %s', (_n, p) => {
    expect(() => fitConstantPressure(p)).toThrow(RangeError);
  });

  it('a reading at t = 0, V = 0 is allowed and left out of the t/V line', () => {
    const r = fitConstantPressure({ points: [{ timeS: 0, volumeMl: 0 }, ...ok], discAreaM2: 1e-3 });
    expect(r.nLine).toBe(3);
    expect(r.fits[0].n).toBe(4);
  });
});
