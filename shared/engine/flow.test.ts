import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  CRANE_FT_BY_NOMINAL_INCH,
  FITTING_K_FACTORS,
  cleanDpBar,
  cleanFlowLh,
  colebrookFrictionFactor,
  correctDpForViscosity,
  correctDpForWaterTemperature,
  correctFlowForViscosity,
  fittingK,
  frictionFactor,
  lineFlowDetails,
  lineLossBar,
  mediumResistance,
  sumFittingsK,
  turbulentFrictionFactor,
} from './flow';
import { waterViscosity } from './fluids';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('Darcy flow through a medium', () => {
  // Source: hand calculation (Darcy 1856): spec 20 L/min = 1200 L/h water at 20 °C, 100 mbar, A = 0.70 m²:
  // J = (20e-3/60)/0.70 = 4.7619e-4 m/s; R_m = 1e4 Pa/(1.0016e-3 Pa·s × 4.7619e-4 m/s) = 2.0966e10 1/m. Tol 1e-4.
  const spec = { waterFlowLh: 1200, dpBar: 0.1, areaM2: 0.7 };
  it('medium resistance of the worked example is 2.0966e10 1/m', () => {
    expect(rel(mediumResistance(spec), 2.0966e10)).toBeLessThan(1e-4);
    expect(mediumResistance({ ...spec, tempC: 20 })).toBe(mediumResistance(spec));
  });

  // Source: hand calculation: 12 %vol wine at 10 °C (2.145 mPa·s), same element, 20 L/min →
  // 100 mbar × 2.145/1.0016 = 214.2 mbar. Tol 1e-4.
  it('clean ΔP of wine in the same element is 214.2 mbar', () => {
    const R = mediumResistance(spec);
    const dp = cleanDpBar({ flowLh: 1200, areaM2: 0.7, resistancePerM: R, viscosityPaS: 2.145e-3 });
    // 214.2 is printed to 4 significant digits: |Δ| < 0.05 mbar
    expect(dp * 1000).toBeCloseTo(214.2, 1);
    expect(rel(correctDpForViscosity(0.1, 1.0016e-3, 2.145e-3) * 1000, (100 * 2.145) / 1.0016)).toBeLessThan(1e-12);
  });

  // Source: hand calculation: water at 5 °C, same 100 mbar → Q = 20 × 1.00160/1.51818 = 13.19 L/min
  // = 13.19475 L/min (IAPWS R12-08 water at 5 °C = 1.51818 mPa·s). Tol 1e-4.
  it('water at 5 °C and 100 mbar passes 13.19 L/min', () => {
    const R = mediumResistance(spec);
    const q = cleanFlowLh({ dpBar: 0.1, areaM2: 0.7, resistancePerM: R, viscosityPaS: waterViscosity(5) });
    expect(rel(q / 60, 13.19475)).toBeLessThan(1e-4);
    expect(rel(correctFlowForViscosity(1200, waterViscosity(20), waterViscosity(5)) / 60, 13.19475)).toBeLessThan(1e-4);
    expect(rel(correctDpForWaterTemperature(0.1, 20, 5), (0.1 * 1.51818) / 1.0016)).toBeLessThan(1e-4);
  });

  it('the spec is reproduced: cleanDpBar at the spec flow and viscosity returns the spec ΔP', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 10, max: 1e5, noNaN: true }),
        fc.double({ min: 0.001, max: 5, noNaN: true }),
        fc.double({ min: 0.01, max: 50, noNaN: true }),
        fc.double({ min: 0, max: 100, noNaN: true }),
        (q, dp, a, t) => {
          const R = mediumResistance({ waterFlowLh: q, dpBar: dp, areaM2: a, tempC: t });
          const back = cleanDpBar({ flowLh: q, areaM2: a, resistancePerM: R, viscosityPaS: waterViscosity(t) });
          expect(rel(back, dp)).toBeLessThan(1e-12);
        },
      ),
    );
  });

  it('ΔP rises with flow and viscosity (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1e5, noNaN: true }), fc.double({ min: 1, max: 1e4, noNaN: true }), (q, dq) => {
        const base = { areaM2: 0.7, resistancePerM: 2e10, viscosityPaS: 1.5e-3 };
        expect(cleanDpBar({ ...base, flowLh: q + dq })).toBeGreaterThan(cleanDpBar({ ...base, flowLh: q }));
        expect(cleanDpBar({ ...base, flowLh: q + dq, viscosityPaS: 2e-3 })).toBeGreaterThan(cleanDpBar({ ...base, flowLh: q + dq }));
      }),
    );
  });

  it.each([
    [{ waterFlowLh: 0, dpBar: 0.1, areaM2: 0.7 }],
    [{ waterFlowLh: -5, dpBar: 0.1, areaM2: 0.7 }],
    [{ waterFlowLh: 1200, dpBar: 0.1, areaM2: 0 }],
    [{ waterFlowLh: 1200, dpBar: NaN, areaM2: 0.7 }],
    [{ waterFlowLh: 1200, dpBar: 0.1, areaM2: 0.7, tempC: 120 }],
  ])('mediumResistance rejects %o', (s) => {
    expect(() => mediumResistance(s)).toThrow(RangeError);
  });
  it('cleanDpBar rejects negative flow', () => {
    expect(() => cleanDpBar({ flowLh: -1, areaM2: 1, resistancePerM: 1e10, viscosityPaS: 1e-3 })).toThrow(RangeError);
  });
});

describe('frictionFactor', () => {
  // Source: Colebrook equation solved independently (scipy.optimize.brentq, xtol = rtol = 1e-15), Colebrook 1939;
  // the 1e5 / 1e-4 point is the classic Moody (1944) chart value ≈ 0.0185. Tolerance 1e-12 relative.
  it.each([
    [1e4, 0, 0.030882950353487697],
    [1e6, 0, 0.011645040997991626],
    [1e5, 1e-4, 0.018513866077471648],
    [4000, 1e-3, 0.040910389862846126],
    [2e7, 1e-5, 0.008599183124071222],
    [1e8, 1e-2, 0.03790432338735433],
  ])('Re = %f, ε/D = %f → %f', (re, rr, f) => {
    expect(rel(frictionFactor(re, rr), f)).toBeLessThan(1e-12);
    expect(rel(colebrookFrictionFactor(re, rr), f)).toBeLessThan(1e-12);
  });

  // Source: Hagen–Poiseuille laminar law f = 64/Re (Moody 1944): Re = 1000 → 0.064.
  it.each([
    [1000, 0.064],
    [100, 0.64],
    [1999, 64 / 1999],
  ])('laminar Re = %f → %f', (re, f) => {
    expect(frictionFactor(re, 1e-3)).toBeCloseTo(f, 15);
  });

  // Source: Colebrook solved independently (scipy brentq): Re 3000 smooth 0.04351918876857631,
  // Re 2500 ε/D 1e-3 0.04688415644672096; both exceed 64/Re (0.02133, 0.0256), so the conservative rule returns them.
  it.each([
    [3000, 0, 0.04351918876857631],
    [2500, 1e-3, 0.04688415644672096],
  ])('transition Re = %f, ε/D = %f returns the larger (Colebrook) value %f', (re, rr, f) => {
    expect(rel(frictionFactor(re, rr), f)).toBeLessThan(1e-12);
    expect(frictionFactor(re, rr)).toBeGreaterThanOrEqual(64 / re);
  });

  it('satisfies the Colebrook equation to machine precision (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 4000, max: 1e8, noNaN: true }), fc.double({ min: 0, max: 0.05, noNaN: true }), (re, rr) => {
        const f = frictionFactor(re, rr);
        const x = 1 / Math.sqrt(f);
        const residual = x + 2 * Math.log10(rr / 3.7 + 2.51 * x / re);
        expect(Math.abs(residual)).toBeLessThan(1e-13 * x);
      }),
    );
  });

  it('falls with Re in turbulent flow and rises with roughness (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 4000, max: 1e7, noNaN: true }), fc.double({ min: 0, max: 0.04, noNaN: true }), (re, rr) => {
        expect(frictionFactor(re * 1.5, rr)).toBeLessThanOrEqual(frictionFactor(re, rr));
        expect(frictionFactor(re, rr + 0.001)).toBeGreaterThan(frictionFactor(re, rr));
      }),
    );
  });

  it.each([
    [0, 0],
    [-10, 0],
    [NaN, 0],
    [1e5, -1e-4],
    [1e5, 0.2],
  ])('rejects Re = %f, ε/D = %f', (re, rr) => {
    expect(() => frictionFactor(re, rr)).toThrow(RangeError);
  });
});

describe('lineLossBar', () => {
  // Source: hand calculation (Darcy–Weisbach with Colebrook 1939): water 20 °C (ρ 998.21, μ 1.0016e-3), Q = 6 m³/h,
  // D = 40 mm, L = 10 m, ε = 0.0015 mm: v = 1.3263 m/s, Re = 52 872, f = 0.02077, ΔP = 4559 Pa;
  // ΣK = 2.1 adds 2.1 × ρv²/2 = 1844 Pa. Tolerance 0.1 %.
  const water = { flowLh: 6000, diameterMm: 40, lengthM: 10, roughnessMm: 0.0015, densityKgM3: 998.21, viscosityPaS: 1.0016e-3 };
  it('worked example: friction loss 45.59 mbar', () => {
    const d = lineFlowDetails(water);
    expect(rel(d.velocityMS, 1.3263)).toBeLessThan(1e-3);
    expect(rel(d.reynolds, 52872)).toBeLessThan(1e-3);
    expect(rel(d.frictionFactor, 0.02077)).toBeLessThan(1e-3);
    expect(rel(lineLossBar(water) * 1e5, 4559)).toBeLessThan(1e-3);
  });
  it('worked example with ΣK = 2.1 adds 1844 Pa', () => {
    const withK = lineLossBar({ ...water, sumK: 2.1 });
    expect(rel((withK - lineLossBar(water)) * 1e5, 1844)).toBeLessThan(1e-3);
    expect(rel(lineFlowDetails({ ...water, sumK: 2.1 }).fittingLossPa, 1844)).toBeLessThan(1e-3);
  });

  // Source: hand calculation, Hagen–Poiseuille: ΔP = 128 μ L Q/(π D⁴); μ = 0.1 Pa·s, L = 1 m, Q = 360 L/h = 1e-4 m³/s,
  // D = 20 mm → 128 × 0.1 × 1 × 1e-4/(π × 1.6e-7) = 2546.5 Pa (Re = 1000 × 0.3183 × 0.02/0.1 = 63.7, laminar).
  it('laminar line loss equals Hagen–Poiseuille', () => {
    const dp = lineLossBar({ flowLh: 360, diameterMm: 20, lengthM: 1, roughnessMm: 0.0015, densityKgM3: 1000, viscosityPaS: 0.1 });
    expect(rel(dp * 1e5, (128 * 0.1 * 1 * 1e-4) / (Math.PI * 0.02 ** 4))).toBeLessThan(1e-12);
  });

  it('zero flow gives zero loss', () => {
    expect(lineLossBar({ ...water, flowLh: 0, sumK: 3 })).toBe(0);
  });

  it('ΔP rises with flow, length and ΣK (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 60000, noNaN: true }),
        fc.double({ min: 1.01, max: 3, noNaN: true }),
        fc.double({ min: 0.1, max: 50, noNaN: true }),
        (q, factor, len) => {
          const a = { ...water, flowLh: q, lengthM: len };
          expect(lineLossBar({ ...a, flowLh: q * factor })).toBeGreaterThan(lineLossBar(a));
          expect(lineLossBar({ ...a, lengthM: len * factor })).toBeGreaterThan(lineLossBar(a));
          expect(lineLossBar({ ...a, sumK: 1 })).toBeGreaterThan(lineLossBar(a));
        },
      ),
    );
  });

  it.each([
    [{ flowLh: -1 }],
    [{ diameterMm: 0 }],
    [{ lengthM: -2 }],
    [{ roughnessMm: -0.1 }],
    [{ densityKgM3: 0 }],
    [{ viscosityPaS: Infinity }],
    [{ sumK: -1 }],
    [{ roughnessMm: 10 }],
  ])('rejects %o', (bad) => {
    expect(() => lineLossBar({ ...water, ...bad })).toThrow(RangeError);
  });
});

describe('fittings (Crane TP-410 two-K style)', () => {
  // Source: hand calculation (Python) of f_T = 0.25/[log10(ε/3.7D)]², ε = 0.046 mm, Sch 40 inside diameters
  // 1" 26.64 mm → 0.0225318, 2" 52.50 mm → 0.0190186, 4" 102.26 mm → 0.0163096; compared with the rounded
  // Crane TP-410 table "zone of complete turbulence" (p. A-26): 0.023, 0.019, 0.017 (within 0.0008).
  it.each([
    [26.64, 0.0225318, 0.023],
    [52.5, 0.0190186, 0.019],
    [102.26, 0.0163096, 0.017],
  ])('turbulentFrictionFactor(%f mm) = %f (Crane table %f)', (d, fT, crane) => {
    expect(Math.abs(turbulentFrictionFactor(d) - fT)).toBeLessThan(1e-6);
    expect(Math.abs(turbulentFrictionFactor(d) - crane)).toBeLessThan(8e-4);
  });

  // Source: Crane TP-410 p. A-29: 90° bend r/d = 1.5 is 14 f_T; 90° standard elbow 30 f_T; 45° elbow 16 f_T.
  it.each([
    ['bend-90-r1.5', 0.021, 14 * 0.021],
    ['elbow-90-standard', 0.019, 30 * 0.019],
    ['elbow-45-standard', 0.019, 16 * 0.019],
    ['exit', 0.019, 1],
    ['entrance-sharp', 0.019, 0.5],
  ])('fittingK(%s, f_T = %f) = %f', (id, fT, k) => {
    expect(fittingK(id, fT)).toBeCloseTo(k, 12);
  });

  // Source: hand calculation: two r/d = 1.5 bends on a 1½" line (f_T = 0.021, Crane table) = 2 × 14 × 0.021 = 0.588,
  // sharp entrance 0.5, exit 1.0, one user-given hygienic clamp K = 0.2 ×3 = 0.6 → ΣK = 2.688.
  it('sums a line of fittings', () => {
    const k = sumFittingsK(
      [{ fittingId: 'bend-90-r1.5', count: 2 }, { fittingId: 'entrance-sharp' }, { fittingId: 'exit' }, { k: 0.2, count: 3 }],
      0.021,
    );
    expect(k).toBeCloseTo(2.688, 12);
  });

  it('catalogue entries are well formed and ids unique', () => {
    const ids = new Set(FITTING_K_FACTORS.map((f) => f.id));
    expect(ids.size).toBe(FITTING_K_FACTORS.length);
    for (const f of FITTING_K_FACTORS) {
      expect(f.value).toBeGreaterThan(0);
      expect(f.source.length).toBeGreaterThan(0);
      expect(['read-in-source', 'from-memory']).toContain(f.tag);
    }
    // f_T falls with size in Crane's table
    for (let i = 1; i < CRANE_FT_BY_NOMINAL_INCH.length; i++) {
      expect(CRANE_FT_BY_NOMINAL_INCH[i][1]).toBeLessThan(CRANE_FT_BY_NOMINAL_INCH[i - 1][1]);
    }
  });

  it.each([
    [[{ fittingId: 'no-such-fitting' }]],
    [[{ fittingId: 'exit', count: -1 }]],
    [[{ fittingId: 'exit', count: 1.5 }]],
    [[{ k: -0.5 }]],
  ])('sumFittingsK rejects %o', (list) => {
    expect(() => sumFittingsK(list, 0.02)).toThrow(RangeError);
  });
});
