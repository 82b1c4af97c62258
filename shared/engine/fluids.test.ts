import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  ETHANOL_DENSITY_20C,
  ethanolMassFraction,
  ethanolViscosityRatio,
  ethanolWaterDensity,
  ethanolWaterViscosity,
  if97Region1SpecificVolume,
  if97SaturationPressurePa,
  sugarMassFraction,
  sugarViscosityRatio,
  waterDensity,
  waterSurfaceTension,
  waterViscosity,
  waterViscosityAt,
  wineViscosity,
} from './fluids';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('waterViscosityAt — IAPWS R12-08 Table 4 (μ̄2 = 1), to all printed digits', () => {
  // Source: IAPWS R12-08 (2008), Table 4 "Sample points for computer-program verification".
  it.each([
    [298.15, 998, 889.7351],
    [298.15, 1200, 1437.649467],
    [373.15, 1000, 307.883622],
    [433.15, 1, 14.538324],
    [433.15, 1000, 217.685358],
    [873.15, 1, 32.619287],
    [873.15, 100, 35.802262],
    [873.15, 600, 77.430195],
    [1173.15, 1, 44.217245],
    [1173.15, 100, 47.640433],
    [1173.15, 400, 64.154608],
  ])('T = %f K, ρ = %f kg/m³ → %f µPa·s', (T, rho, muMicro) => {
    // all printed digits (|Δ| < 5e-7 µPa·s), i.e. better than rel. 1e-9 at the liquid points
    expect(waterViscosityAt(T, rho) * 1e6).toBeCloseTo(muMicro, 6);
  });
});

describe('IAPWS-IF97 program verification', () => {
  // Source: IAPWS R7-97(2012), Table 5 (region 1 specific volume, m³/kg); values from memory, reproduced to all 9 digits.
  it.each([
    [300, 3e6, 0.100215168e-2],
    [300, 80e6, 0.971180894e-3],
    [500, 3e6, 0.1202418e-2],
  ])('v(%f K, %f Pa) = %f', (T, p, v) => {
    expect(rel(if97Region1SpecificVolume(T, p), v)).toBeLessThan(1e-8);
  });
  // Source: IAPWS R7-97(2012), Table 35 (saturation pressure, MPa); values from memory, reproduced to all 9 digits.
  it.each([
    [300, 0.353658941e-2],
    [500, 0.263889776e1],
    [600, 0.123443146e2],
  ])('p_sat(%f K) = %f MPa', (T, pMPa) => {
    expect(rel(if97SaturationPressurePa(T) / 1e6, pMPa)).toBeLessThan(1e-8);
  });
});

describe('waterViscosity at 0.101325 MPa (IF97 density), rel. 5e-5', () => {
  // Source: IAPWS R12-08 evaluated with IAPWS-95 density at 0.1 MPa (independent Python implementation,
  // agreeing with python3-iapws 1.5.2 to 0.001 µPa·s); IF97 density shifts μ by ≤ 0.0022 %, hence 5e-5.
  it.each([
    [0, 1.79176],
    [10, 1.3059],
    [20, 1.0016],
    [25, 0.89002],
    [40, 0.65273],
    [60, 0.46604],
    [80, 0.35405],
  ])('%f °C → %f mPa·s', (t, mu) => {
    expect(rel(waterViscosity(t) * 1e3, mu)).toBeLessThan(5e-5);
  });

  // Source: Perry's Chemical Engineers' Handbook, 9th ed., Table 2-135 (saturated water), ≤ 0.1 %.
  it.each([
    [0.01, 1791.2],
    [6.85, 1433.7],
    [16.85, 1084.0],
    [26.85, 853.84],
  ])('%f °C agrees with Perry\'s 9th ed. Table 2-135 (%f µPa·s) to 0.1 %%', (t, muMicro) => {
    expect(rel(waterViscosity(t) * 1e6, muMicro)).toBeLessThan(1e-3);
  });

  // Source: Popiel & Wojtkowiak, Heat Transfer Eng. 19(3) (1998) 87–101; reproduces IAPWS to 0.11 % over 0–100 °C.
  it('agrees with the Popiel–Wojtkowiak (1998) correlation to 0.12 % over 0–100 °C', () => {
    for (let t = 0; t <= 100; t += 2.5) {
      const pw = 1 / (557.82468 + 19.408782 * t + 0.1360459 * t * t - 3.1160832e-4 * t ** 3);
      expect(rel(waterViscosity(t), pw)).toBeLessThan(1.2e-3);
    }
  });

  it('is continuous across the boiling point at 0.101325 MPa (99.974 °C)', () => {
    // step across the switch to saturated liquid ≈ the neighbouring step below it (within 5 %)
    const across = waterViscosity(99.97) - waterViscosity(99.98);
    const below = waterViscosity(99.96) - waterViscosity(99.97);
    expect(Math.abs(across / below - 1)).toBeLessThan(0.05);
  });

  it('falls with temperature (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 99.9, noNaN: true }), fc.double({ min: 0.05, max: 10, noNaN: true }), (t, dt) => {
        const t2 = Math.min(100, t + dt);
        expect(waterViscosity(t2)).toBeLessThan(waterViscosity(t));
      }),
    );
  });

  it.each([[-1], [100.5], [NaN], [Infinity]])('rejects %f °C with a RangeError', (t) => {
    expect(() => waterViscosity(t)).toThrow(RangeError);
  });
});

describe('waterDensity at 0.101325 MPa (IF97 region 1)', () => {
  // Source: IAPWS-95 (IAPWS R6-95(2018)) at 0.101325 MPa, as evaluated by python3-iapws 1.5.2; between-model
  // tolerance 0.01 kg/m³.
  it.each([
    [0, 999.8431],
    [4, 999.9749],
    [20, 998.2072],
    [25, 997.0476],
  ])('%f °C → %f kg/m³ (±0.01)', (t, rho) => {
    expect(Math.abs(waterDensity(t) - rho)).toBeLessThan(0.01);
  });
  // Source: Tanaka, Girard, Davis, Peuto, Bignell, Metrologia 38 (2001) 301–309, formula; 0.01 kg/m³ between models.
  it('agrees with Tanaka et al. (2001) to 0.01 kg/m³ over 0–40 °C', () => {
    for (let t = 0; t <= 40; t += 1) {
      const tanaka = 999.97495 * (1 - ((t - 3.983035) ** 2 * (t + 301.797)) / (522528.9 * (t + 69.34881)));
      expect(Math.abs(waterDensity(t) - tanaka)).toBeLessThan(0.01);
    }
  });
  // Source: Kell, J. Chem. Eng. Data 20 (1975) 97–105, formula; 0.02 kg/m³ over 40–100 °C.
  it('agrees with Kell (1975) to 0.02 kg/m³ over 0–99 °C', () => {
    for (let t = 0; t <= 99; t += 3) {
      const kell =
        (999.83952 + 16.945176 * t - 7.9870401e-3 * t ** 2 - 46.170461e-6 * t ** 3 + 105.56302e-9 * t ** 4 - 280.54253e-12 * t ** 5) /
        (1 + 16.87985e-3 * t);
      expect(Math.abs(waterDensity(t) - kell)).toBeLessThan(t <= 40 ? 0.01 : 0.02);
    }
  });
  // Source: saturated liquid at 100 °C, IAPWS-IF97 ≈ 958.35 kg/m³ (from memory, ±0.02).
  it('returns saturated liquid at 100 °C', () => {
    expect(Math.abs(waterDensity(100) - 958.35)).toBeLessThan(0.02);
  });
});

describe('waterSurfaceTension — IAPWS R1-76(2014), ±0.005 mN/m', () => {
  // Source: IAPWS R1-76(2014) formula evaluated independently (python3-iapws 1.5.2); the release's
  // table gives 75.65, 72.74, 71.97, 67.94, 58.91 mN/m.
  it.each([
    [0.01, 75.646],
    [20, 72.736],
    [25, 71.972],
    [50, 67.944],
    [100, 58.912],
  ])('%f °C → %f mN/m', (t, sigma) => {
    expect(Math.abs(waterSurfaceTension(t) * 1e3 - sigma)).toBeLessThan(0.005);
  });
  it('falls with temperature (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 99, noNaN: true }), (t) => {
        expect(waterSurfaceTension(t + 1)).toBeLessThan(waterSurfaceTension(t));
      }),
    );
  });
});

describe('ethanol–water — OIML R 22', () => {
  // Source: OIML R 22 formula evaluated independently (Python); tolerance 0.005 %m/m and 0.02 kg/m³.
  it.each([
    [5, 3.982, 991.05],
    [10, 8.015, 984.71],
    [12, 9.641, 982.35],
    [14, 11.274, 980.08],
    [20, 16.213, 973.56],
  ])('%f %%vol → %f %%m/m, ρ(20 °C) = %f kg/m³', (pctVol, pctMass, rho) => {
    const w = ethanolMassFraction(pctVol);
    expect(Math.abs(w * 100 - pctMass)).toBeLessThan(0.005);
    expect(Math.abs(ethanolWaterDensity(w, 20) - rho)).toBeLessThan(0.02);
  });

  // Source: Lange's Handbook of Chemistry, Table 5.13: 4.8 %m/m ↔ 6.00 %vol, 11.3 %m/m ↔ 14.0 %vol (printed to 0.1 %m/m).
  it.each([
    [6.0, 4.8],
    [14.0, 11.3],
  ])('%f %%vol ≈ %f %%m/m (Lange\'s, ±0.06)', (pctVol, pctMass) => {
    expect(Math.abs(ethanolMassFraction(pctVol) * 100 - pctMass)).toBeLessThan(0.06);
  });

  // Source: OIML R 22 end points: water 998.20 kg/m³ and ethanol 789.24 kg/m³ at 20 °C.
  it('gives the end-point densities at 20 °C', () => {
    expect(Math.abs(ethanolWaterDensity(0, 20) - 998.2)).toBeLessThan(0.01);
    expect(Math.abs(ethanolWaterDensity(1, 20) - ETHANOL_DENSITY_20C)).toBeLessThan(0.01);
    expect(ethanolMassFraction(0)).toBe(0);
    expect(ethanolMassFraction(100)).toBe(1);
  });

  it('inverts the strength equation exactly (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 99.99, noNaN: true }), (pct) => {
        const w = ethanolMassFraction(pct);
        const back = (100 * w * ethanolWaterDensity(w, 20)) / ETHANOL_DENSITY_20C;
        expect(Math.abs(back - pct)).toBeLessThan(1e-9);
      }),
    );
  });

  it.each([[-1], [101], [NaN]])('rejects strength %f with a RangeError', (p) => {
    expect(() => ethanolMassFraction(p)).toThrow(RangeError);
  });
});

describe('ethanolWaterViscosity — Bingham & Jackson (1918) ratio × IAPWS water', () => {
  // Source: hand calculation from the Bingham & Jackson (1918) table (Bull. Bur. Standards 14:59, reprinted
  // in Simmonds, "Alcohol", 1919): ratio interpolated (quadratic Lagrange of ln ratio in mass %, linear in 1/T),
  // × IAPWS R12-08 water: 12 %vol → 2.614 (5 °C), 2.141 (10 °C), 1.512 (20 °C) mPa·s; tolerance 1e-3 relative.
  it.each([
    [12, 5, 2.614],
    [12, 10, 2.141],
    [12, 20, 1.512],
  ])('%f %%vol at %f °C → %f mPa·s', (pct, t, mu) => {
    expect(rel(ethanolWaterViscosity(pct, t) * 1e3, mu)).toBeLessThan(1e-3);
  });

  // Source: Bingham & Jackson (1918) table, direct reading: at the tabulated nodes the ratio equals the
  // tabulated η_mix/η_water (e.g. 20 %m/m at 20 °C: 2.183/1.005; 50 %m/m at 40 °C: 1.499/0.656).
  it.each([
    [20, 20, 2.183 / 1.005],
    [50, 40, 1.499 / 0.656],
    [10, 0, 3.311 / 1.792],
  ])('reproduces the table node %f %%m/m at %f °C', (pctMass, t, ratio) => {
    // find the %vol of that mass fraction
    const w = pctMass / 100;
    const pctVol = (100 * w * ethanolWaterDensity(w, 20)) / ETHANOL_DENSITY_20C;
    expect(rel(ethanolViscosityRatio(pctVol, t), ratio)).toBeLessThan(1e-9);
  });

  // Source: Walstra, Physical Chemistry of Foods (2003), Table 5.2: 20 % (m/m) ethanol at 20 °C = 2.14 mPa·s (±3 %).
  it('is close to Walstra (2003) for 20 %m/m at 20 °C', () => {
    const w = 0.2;
    const pctVol = (100 * w * ethanolWaterDensity(w, 20)) / ETHANOL_DENSITY_20C;
    expect(rel(ethanolWaterViscosity(pctVol, 20) * 1e3, 2.14)).toBeLessThan(0.03);
  });

  // Source: Oxford Companion to Wine, 3rd ed. (2006), "viscosity": +1 %vol raises relative viscosity by ≈ 0.04.
  it('rises by about 0.04 relative viscosity per %vol near wine strength at 20 °C', () => {
    const slope = (ethanolViscosityRatio(13, 20) - ethanolViscosityRatio(11, 20)) / 2;
    expect(slope).toBeGreaterThan(0.035);
    expect(slope).toBeLessThan(0.05);
  });

  it('rises with ethanol over 0–20 %vol and falls with temperature (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 19.5, noNaN: true }),
        fc.double({ min: 0.1, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 59, noNaN: true }),
        (p, dp, t) => {
          const p2 = Math.min(20, p + dp);
          expect(ethanolWaterViscosity(p2, t)).toBeGreaterThan(ethanolWaterViscosity(p, t));
          expect(ethanolWaterViscosity(p, t + 1)).toBeLessThan(ethanolWaterViscosity(p, t));
        },
      ),
    );
  });

  it.each([
    [12, 61],
    [12, -1],
    [120, 20],
  ])('rejects %f %%vol at %f °C', (p, t) => {
    expect(() => ethanolWaterViscosity(p, t)).toThrow(RangeError);
  });
});

describe('sugar and wine', () => {
  // Source: CRC Handbook of Chemistry and Physics, "Concentrative properties of aqueous solutions", sucrose
  // at 20 °C (from memory, cross-checked with Walstra 2003 Table 5.2: 20 % sucrose 1.94 mPa·s); water 1.002.
  it.each([
    [0.05, 1.146 / 1.002],
    [0.1, 1.336 / 1.002],
    [0.2, 1.945 / 1.002],
    [0.3, 3.187 / 1.002],
  ])('sugarViscosityRatio(%f) matches the CRC sucrose table to 0.1 %%', (w, ratio) => {
    expect(rel(sugarViscosityRatio(w), ratio)).toBeLessThan(1e-3);
  });

  // Source: hand calculation: 200 g/L in a 12 %vol base: ρ ≈ 982.35 + 0.38·200 = 1058.35 kg/m³ → w = 200/1058.35 = 0.18897.
  it('converts g/L of sugar to a mass fraction', () => {
    expect(Math.abs(sugarMassFraction(200, 12) - 200 / (982.35 + 0.38 * 200))).toBeLessThan(1e-4);
  });

  // Source: Yanniotis, Kotseridis, Orfanidou, Petraki, J. Food Eng. 81 (2007) 399–403: dry wines at 16 °C
  // 1.71–1.92 mPa·s; plausibility tolerance ±10 %.
  it.each([[12.5], [13]])('dry wine of %f %%vol at 16 °C lies in the measured range', (pct) => {
    const mu = wineViscosity({ tempC: 16, ethanolPctVol: pct }) * 1e3;
    expect(mu).toBeGreaterThan(1.71 * 0.9);
    expect(mu).toBeLessThan(1.92 * 1.1);
    expect(mu).toBeGreaterThan(1.74);
    expect(mu).toBeLessThan(1.8);
  });

  // Source: Yanniotis et al. (2007): two sweet wines at 16 °C, 3.04 and 3.16 mPa·s; a plausible sweet wine
  // (15 %vol, 150 g/L sugar, extract factor 1.05) must land within ±25 % of them.
  it('sweet wine at 16 °C is of the measured order', () => {
    const mu = wineViscosity({ tempC: 16, ethanolPctVol: 15, sugarGPerL: 150, extractFactor: 1.05 }) * 1e3;
    expect(mu).toBeGreaterThan(3.04 * 0.75);
    expect(mu).toBeLessThan(3.16 * 1.25);
  });

  // Source: hand calculation: a 12 %vol wine at 5 °C is 2.614/1.512 = 1.73× as viscous as at 20 °C.
  it('cold wine is about 1.73× as viscous as at 20 °C', () => {
    const r = wineViscosity({ tempC: 5, ethanolPctVol: 12 }) / wineViscosity({ tempC: 20, ethanolPctVol: 12 });
    expect(Math.abs(r - 1.73)).toBeLessThan(0.005);
  });

  it('equals ethanol–water viscosity for a dry wine with no extract', () => {
    expect(wineViscosity({ tempC: 10, ethanolPctVol: 12 })).toBe(ethanolWaterViscosity(12, 10));
  });

  it('rises with sugar, ethanol and extract and falls with temperature (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 59, noNaN: true }),
        fc.double({ min: 0, max: 19, noNaN: true }),
        fc.double({ min: 0, max: 250, noNaN: true }),
        fc.double({ min: 1, max: 1.15, noNaN: true }),
        (t, e, s, x) => {
          const base = wineViscosity({ tempC: t, ethanolPctVol: e, sugarGPerL: s, extractFactor: x });
          expect(wineViscosity({ tempC: t, ethanolPctVol: e, sugarGPerL: s + 10, extractFactor: x })).toBeGreaterThan(base);
          expect(wineViscosity({ tempC: t, ethanolPctVol: e + 1, sugarGPerL: s, extractFactor: x })).toBeGreaterThan(base);
          expect(wineViscosity({ tempC: t, ethanolPctVol: e, sugarGPerL: s, extractFactor: x + 0.05 })).toBeGreaterThan(base);
          expect(wineViscosity({ tempC: t + 1, ethanolPctVol: e, sugarGPerL: s, extractFactor: x })).toBeLessThan(base);
        },
      ),
    );
  });

  it.each([
    [{ tempC: -2, ethanolPctVol: 12 }],
    [{ tempC: 20, ethanolPctVol: 30 }],
    [{ tempC: 20, ethanolPctVol: 12, sugarGPerL: -1 }],
    [{ tempC: 20, ethanolPctVol: 12, sugarGPerL: 390 }],
    [{ tempC: 20, ethanolPctVol: 12, extractFactor: 0.9 }],
    [{ tempC: NaN, ethanolPctVol: 12 }],
  ])('rejects %o with a RangeError', (wine) => {
    expect(() => wineViscosity(wine)).toThrow(RangeError);
  });
});
