import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  ASTM_F316_SHAPE_FACTOR,
  allowedPressureDecayMbar,
  bubblePointBar,
  diffusionFlowMlMin,
  diffusionLimitForHousing,
  equivalentDiffusionMlMin,
  evaluateIntegrityTest,
  expectedBubblePointBar,
  poreDiameterFromBubblePointUm,
  thermalPressureChangeMbar,
} from './integrity';
import { waterSurfaceTension } from './fluids';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const SIGMA_20 = 0.072736; // IAPWS R1-76(2014), water at 20 °C, N/m

describe('bubblePointBar — Young–Laplace / ASTM F316', () => {
  // Source: hand calculation, Young–Laplace: 4 × 0.072736 N/m / 1e-6 m = 290 944 Pa = 2.909 bar;
  // ASTM F316-03(2019) C = 2860: p = 2860 × 72.736/1 µm = 208 025 Pa = 2.080 bar (K = 2860/4000 = 0.715).
  it.each([
    [1, 1, 2.90944],
    [1, ASTM_F316_SHAPE_FACTOR, 2.080250],
    [0.5, 1, 5.81888],
  ])('d = %f µm, K = %f → %f bar', (d, K, bp) => {
    expect(rel(bubblePointBar({ poreDiameterUm: d, surfaceTensionNm: SIGMA_20, shapeFactor: K }), bp)).toBeLessThan(1e-6);
  });

  it('ASTM constant C = 2860 corresponds to K = 0.715 (ASTM F316-03(2019))', () => {
    expect(ASTM_F316_SHAPE_FACTOR).toBeCloseTo(2860 / 4000, 12);
  });

  // Source: hand calculation: cos 60° = 0.5 halves the bubble point.
  it('contact angle lowers the bubble point by cos θ', () => {
    const a = bubblePointBar({ poreDiameterUm: 1, surfaceTensionNm: SIGMA_20 });
    const b = bubblePointBar({ poreDiameterUm: 1, surfaceTensionNm: SIGMA_20, contactAngleDeg: 60 });
    expect(b / a).toBeCloseTo(0.5, 12);
  });

  // Source: hand calculation: a water bubble point of 3.5 bar → ideal-cylinder d = 2.90944/3.5 = 0.8313 µm;
  // ASTM F316 form d = 2860 × 72.736/350 000 = 0.5944 µm.
  it.each([
    [1, 0.83127],
    [ASTM_F316_SHAPE_FACTOR, 0.59436],
  ])('3.5 bar with K = %f → d = %f µm', (K, d) => {
    expect(rel(poreDiameterFromBubblePointUm({ bubblePointBar: 3.5, surfaceTensionNm: SIGMA_20, shapeFactor: K }), d)).toBeLessThan(1e-4);
  });

  it('pore size and bubble point are inverse (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 20, noNaN: true }), fc.double({ min: 0.02, max: 0.08, noNaN: true }), (d, s) => {
        const bp = bubblePointBar({ poreDiameterUm: d, surfaceTensionNm: s });
        expect(rel(poreDiameterFromBubblePointUm({ bubblePointBar: bp, surfaceTensionNm: s }), d)).toBeLessThan(1e-12);
        expect(bubblePointBar({ poreDiameterUm: d * 1.1, surfaceTensionNm: s })).toBeLessThan(bp);
      }),
    );
  });

  it.each([
    [{ poreDiameterUm: 0, surfaceTensionNm: SIGMA_20 }],
    [{ poreDiameterUm: -1, surfaceTensionNm: SIGMA_20 }],
    [{ poreDiameterUm: 1, surfaceTensionNm: NaN }],
    [{ poreDiameterUm: 1, surfaceTensionNm: SIGMA_20, contactAngleDeg: 90 }],
    [{ poreDiameterUm: 1, surfaceTensionNm: SIGMA_20, shapeFactor: 1.5 }],
    [{ poreDiameterUm: 1, surfaceTensionNm: SIGMA_20, shapeFactor: 0 }],
  ])('rejects %o', (a) => {
    expect(() => bubblePointBar(a)).toThrow(RangeError);
  });
});

describe('expectedBubblePointBar — scaling by surface tension', () => {
  // Source: IAPWS R1-76(2014): σ(5 °C)/σ(20 °C) = 74.94/72.74 = 1.030 (hand calculation from the formula).
  it('water-wet at 5 °C vs a 20 °C spec is 1.030× higher', () => {
    const r = expectedBubblePointBar({ waterBubblePointBar: 3.2, tempC: 5 }) / 3.2;
    expect(r).toBeCloseTo(1.03, 3);
    expect(r).toBeCloseTo(waterSurfaceTension(5) / waterSurfaceTension(20), 12);
  });

  // Source: hand calculation: wine-wet σ ≈ 48 mN/m at 20 °C → 48/72.736 = 0.6599 × the water value.
  it('product-wet with σ = 0.048 N/m is 0.66× the water value', () => {
    expect(expectedBubblePointBar({ waterBubblePointBar: 3.2, surfaceTensionNm: 0.048 })).toBeCloseTo(3.2 * (0.048 / SIGMA_20), 4);
    expect(rel(expectedBubblePointBar({ waterBubblePointBar: 1, surfaceTensionNm: 0.048 }), 0.66)).toBeLessThan(2e-3);
  });

  it('same temperature and water gives the stated value', () => {
    expect(expectedBubblePointBar({ waterBubblePointBar: 3.45, specTempC: 25, tempC: 25 })).toBeCloseTo(3.45, 12);
  });

  it('rejects a non-positive bubble point', () => {
    expect(() => expectedBubblePointBar({ waterBubblePointBar: 0 })).toThrow(RangeError);
    expect(() => expectedBubblePointBar({ waterBubblePointBar: 3, surfaceTensionNm: -0.01 })).toThrow(RangeError);
  });
});

describe('pressure hold and diffusion', () => {
  // Source: hand calculation (ideal gas, PDA Technical Report No. 26): ΔP = Q·t·p_atm/V =
  // 15 mL/min × 10 min × 1.01325 bar / 5 L = 30.3975 mbar.
  it('allowed decay of the worked example is 30.3975 mbar', () => {
    expect(allowedPressureDecayMbar({ diffusionLimitMlMin: 15, testMin: 10, upstreamVolumeL: 5 })).toBeCloseTo(30.3975, 10);
    expect(allowedPressureDecayMbar({ diffusionLimitMlMin: 15, testMin: 10, upstreamVolumeL: 5, atmBar: 1 })).toBeCloseTo(30, 10);
  });

  // Source: hand calculation: 30.3975 mbar × 5 L / (1.01325 bar × 10 min) = 15 mL/min.
  it('equivalent diffusion inverts the allowed decay', () => {
    expect(equivalentDiffusionMlMin({ decayMbar: 30.3975, testMin: 10, upstreamVolumeL: 5 })).toBeCloseTo(15, 10);
  });

  it('round-trips and scales (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0, max: 500, noNaN: true }),
        fc.double({ min: 0.5, max: 60, noNaN: true }),
        fc.double({ min: 0.5, max: 200, noNaN: true }),
        fc.double({ min: 0.8, max: 1.05, noNaN: true }),
        (q, t, v, atm) => {
          const dp = allowedPressureDecayMbar({ diffusionLimitMlMin: q, testMin: t, upstreamVolumeL: v, atmBar: atm });
          expect(equivalentDiffusionMlMin({ decayMbar: dp, testMin: t, upstreamVolumeL: v, atmBar: atm })).toBeCloseTo(q, 9);
          // a bigger upstream volume allows a smaller decay
          expect(allowedPressureDecayMbar({ diffusionLimitMlMin: q, testMin: t, upstreamVolumeL: v * 2, atmBar: atm })).toBeCloseTo(dp / 2, 9);
        },
      ),
    );
  });

  // Source: hand calculation: per-element limit × element equivalents, 12 mL/min × 9 = 108 mL/min.
  it('housing limit is per-element limit × element equivalents', () => {
    expect(diffusionLimitForHousing(12, 9)).toBe(108);
    expect(() => diffusionLimitForHousing(12, 0)).toThrow(RangeError);
    expect(() => diffusionLimitForHousing(12, 2.5)).toThrow(RangeError);
    expect(() => diffusionLimitForHousing(-1, 3)).toThrow(RangeError);
  });

  // Source: hand calculation: at 2.5 bar gauge (3.51325 bar abs), 20 °C, 1 K → 3.51325/293.15 × 1000 = 11.984 mbar.
  it('a 1 K drift at 2.5 bar gauge moves the pressure by about 12 mbar', () => {
    expect(thermalPressureChangeMbar(2.5, 1, 20)).toBeCloseTo(11.98448, 4);
    expect(thermalPressureChangeMbar(2.5, -1, 20)).toBeCloseTo(-11.98448, 4);
  });

  // Source: hand calculation (Fick + Henry, after Reti 1977): D 1.9e-9 m²/s, H 8.385e-6 mol/(m³·Pa), ΔP 2.8 bar,
  // ε 0.75, A 0.70 m², L 150 µm, τ 1.5 → N = 1.9e-9 × 8.385e-6 × 2.8e5 × 0.75 × 0.70/(150e-6 × 1.5) = 1.040858e-5 mol/s;
  // Q = N × 8.314462618 × 293.15/101 325 m³/s = 15.0228 mL/min (≈ 15.0). Tolerance 1e-3.
  it('diffusion flow of the worked example is 15.0 mL/min', () => {
    const q = diffusionFlowMlMin({
      diffusivityM2S: 1.9e-9,
      henryMolM3Pa: 8.385e-6,
      dpBar: 2.8,
      porosity: 0.75,
      areaM2: 0.7,
      thicknessUm: 150,
      tortuosity: 1.5,
    });
    expect(rel(q, 15.0228)).toBeLessThan(1e-3);
  });

  it.each([
    [{ diffusionLimitMlMin: -1, testMin: 10, upstreamVolumeL: 5 }],
    [{ diffusionLimitMlMin: 15, testMin: 0, upstreamVolumeL: 5 }],
    [{ diffusionLimitMlMin: 15, testMin: 10, upstreamVolumeL: 0 }],
    [{ diffusionLimitMlMin: 15, testMin: 10, upstreamVolumeL: 5, atmBar: 2 }],
    [{ diffusionLimitMlMin: NaN, testMin: 10, upstreamVolumeL: 5 }],
  ])('allowedPressureDecayMbar rejects %o', (p) => {
    expect(() => allowedPressureDecayMbar(p)).toThrow(RangeError);
  });
});

describe('evaluateIntegrityTest', () => {
  // Source: fictional readings and limits; the rule is the maker's limit compared directly (PDA TR 26).
  it.each([
    [{ kind: 'bubble-point', measuredBar: 2.9, minimumBar: 3.2 } as const, false, 'Bubble point 2.9 bar is below the minimum 3.2 bar for this type.'],
    [{ kind: 'bubble-point', measuredBar: 3.5, minimumBar: 3.2 } as const, true, 'Bubble point 3.5 bar meets the minimum 3.2 bar for this type.'],
    [{ kind: 'bubble-point', measuredBar: 3.2, minimumBar: 3.2 } as const, true, 'Bubble point 3.2 bar meets the minimum 3.2 bar for this type.'],
    [{ kind: 'bubble-point', measuredBar: 3.195, minimumBar: 3.2 } as const, false, 'Bubble point 3.195 bar is below the minimum 3.2 bar for this type.'],
    [{ kind: 'diffusion', measuredMlMin: 42, maximumMlMin: 36 } as const, false, 'Diffusion flow 42 mL/min is above the maximum 36 mL/min for this housing.'],
    [{ kind: 'diffusion', measuredMlMin: 12.5, maximumMlMin: 36 } as const, true, 'Diffusion flow 12.5 mL/min is within the maximum 36 mL/min for this housing.'],
    [{ kind: 'pressure-hold', measuredDecayMbar: 18, maximumDecayMbar: 30.4 } as const, true, 'Pressure decay 18 mbar is within the maximum 30.4 mbar for this housing.'],
    [{ kind: 'pressure-hold', measuredDecayMbar: 45.2, maximumDecayMbar: 30.4 } as const, false, 'Pressure decay 45.2 mbar is above the maximum 30.4 mbar for this housing.'],
  ])('%o → pass %s', (test, pass, reason) => {
    expect(evaluateIntegrityTest(test)).toEqual({ pass, reason });
  });

  // Source: NIST SP 811 factor 1 bar = 14.5038 psi: 2.9 bar = 42.06 psi, 3.2 bar = 46.41 psi; 30.4 mbar = 0.44 psi.
  it('reports psi for US users', () => {
    expect(evaluateIntegrityTest({ kind: 'bubble-point', measuredBar: 2.9, minimumBar: 3.2 }, 'us').reason).toBe(
      'Bubble point 42.1 psi is below the minimum 46.4 psi for this type.',
    );
    expect(evaluateIntegrityTest({ kind: 'pressure-hold', measuredDecayMbar: 18, maximumDecayMbar: 30.4 }, 'us').reason).toBe(
      'Pressure decay 0.26 psi is within the maximum 0.44 psi for this housing.',
    );
  });

  it('passes exactly when the reading is on the right side of the limit (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 10, noNaN: true }), fc.double({ min: 0.1, max: 10, noNaN: true }), (m, l) => {
        expect(evaluateIntegrityTest({ kind: 'bubble-point', measuredBar: m, minimumBar: l }).pass).toBe(m >= l);
        expect(evaluateIntegrityTest({ kind: 'diffusion', measuredMlMin: m, maximumMlMin: l }).pass).toBe(m <= l);
        expect(evaluateIntegrityTest({ kind: 'pressure-hold', measuredDecayMbar: m, maximumDecayMbar: l }).pass).toBe(m <= l);
      }),
    );
  });

  it('rejects bad readings and unknown kinds', () => {
    expect(() => evaluateIntegrityTest({ kind: 'bubble-point', measuredBar: NaN, minimumBar: 3 })).toThrow(RangeError);
    expect(() => evaluateIntegrityTest({ kind: 'diffusion', measuredMlMin: -1, maximumMlMin: 3 })).toThrow(RangeError);
    expect(() => evaluateIntegrityTest({ kind: 'other' } as never)).toThrow(RangeError);
  });
});
