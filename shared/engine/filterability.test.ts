import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  FILTERABILITY_RATIO_SCALE,
  PASS_FAIL_FILTERABILITY_SCALES,
  ROMAT_CLOGGING_INDEX_SCALE,
  ROMAT_VMAX_DISC_SCALE,
  bandOf,
  cloggingIndex,
  cloggingIndexBand,
  elementsNeeded,
  filterabilityRatio,
  filterabilityRatioBand,
  modifiedCloggingIndex,
  scaleUpArea,
  vmaxArea,
  vmaxDiscBand,
  vmaxEndFlux,
  vmaxMinArea,
  vmaxSizing,
} from './filterability';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('cloggingIndex = T400 − 2·T200 (Oenopedia §6.1.1.b citing Romat 2014)', () => {
  it.each([
    // hand calculation: 70 − 2·30 = 10 s
    [30, 70, 10],
    // hand calculation: 95 − 2·40 = 15 s
    [40, 95, 15],
    // hand calculation: 200 − 2·60 = 80 s
    [60, 200, 80],
    // hand calculation: no fouling, the second 200 mL takes as long as the first: 50 − 2·25 = 0 s
    [25, 50, 0],
    // hand calculation: a faster second 200 mL (wetting effect): 58 − 2·30 = −2 s
    [30, 58, -2],
  ])('T200 = %s s, T400 = %s s → IC = %s s', (t200, t400, ci) => {
    expect(cloggingIndex(t200, t400)).toBeCloseTo(ci, 12);
  });

  it.each([
    [0, 10],
    [-1, 10],
    [30, 30],
    [30, 20],
    [Number.NaN, 40],
    [30, Number.POSITIVE_INFINITY],
  ])('rejects T200 = %s, T400 = %s', (a, b) => {
    expect(() => cloggingIndex(a, b)).toThrow(RangeError);
  });

  it('property: the index is the extra time of the second 200 mL over the first (definition)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 1000, noNaN: true }),
        fc.double({ min: 0.01, max: 5000, noNaN: true }),
        (t200, second) => {
          const ci = cloggingIndex(t200, t200 + second);
          expect(Math.abs(ci - (second - t200))).toBeLessThan(1e-9 * (t200 + second));
        },
      ),
    );
  });
});

describe('modifiedCloggingIndex = T600 − 2·T400 + T200 (US winemaking supplier, "Filtration checklist for successful bottling")', () => {
  it.each([
    // hand calculation: (T600 − T400) − (T400 − T200) = (120 − 70) − (70 − 30) = 50 − 40 = 10 s;
    // also 120 − 140 + 30 = 10 s
    [30, 70, 120, 10],
    // hand calculation: no fouling after the first 200 mL: 30, 60, 90 → 90 − 120 + 30 = 0 s
    [30, 60, 90, 0],
    // hand calculation: 40, 95, 180 → 180 − 190 + 40 = 30 s
    [40, 95, 180, 30],
  ])('T200 %s, T400 %s, T600 %s s → FIm %s s', (a, b, c, fim) => {
    expect(modifiedCloggingIndex(a, b, c)).toBeCloseTo(fim, 12);
  });

  it.each([
    [30, 70, 70],
    [30, 20, 90],
    [0, 40, 90],
    [30, 70, Number.NaN],
  ])('rejects non-increasing or invalid times %s, %s, %s', (a, b, c) => {
    expect(() => modifiedCloggingIndex(a, b, c)).toThrow(RangeError);
  });
});

describe('cloggingIndexBand — Romat 2014 via Oenopedia §6.1.1.b (0.65 µm, 25 mm, 2 bar)', () => {
  it.each([
    // "< 25 very good; 25–50 good; 50–100 poor; > 100 very poor" (Romat 2014 via Oenopedia)
    [-3, 'very-good'],
    [0, 'very-good'],
    [24.9, 'very-good'],
    [25, 'good'],
    [40, 'good'],
    [50, 'good'],
    [50.1, 'poor'],
    [100, 'poor'],
    [100.5, 'very-poor'],
    [400, 'very-poor'],
  ] as const)('IC %s s → %s', (ci, band) => {
    const b = cloggingIndexBand(ci);
    expect(b.band).toBe(band);
    expect(b.label.length).toBeGreaterThan(0);
  });

  it('returns the band limits as data', () => {
    expect(cloggingIndexBand(30).limits).toEqual({ min: 25, max: 50, includesMin: true, includesMax: true });
  });

  it('rejects NaN', () => {
    expect(() => cloggingIndexBand(Number.NaN)).toThrow(RangeError);
  });

  it('property: every scale covers the whole line without overlap', () => {
    const scales = [ROMAT_CLOGGING_INDEX_SCALE, ROMAT_VMAX_DISC_SCALE, FILTERABILITY_RATIO_SCALE, ...PASS_FAIL_FILTERABILITY_SCALES];
    fc.assert(
      fc.property(fc.constantFrom(...scales), fc.double({ min: -1e4, max: 1e5, noNaN: true }), (scale, x) => {
        const hits = scale.bands.filter((b) => {
          const l = b.limits;
          const okMin = l.min === null || (l.includesMin ? x >= l.min : x > l.min);
          const okMax = l.max === null || (l.includesMax ? x <= l.max : x < l.max);
          return okMin && okMax;
        });
        expect(hits).toHaveLength(1);
        expect(bandOf(scale, x).band).toBe(hits[0].band);
      }),
    );
  });

  it('property: the band never improves as the index rises (monotone)', () => {
    const order = ROMAT_CLOGGING_INDEX_SCALE.bands.map((b) => b.band);
    fc.assert(
      fc.property(fc.double({ min: -50, max: 500, noNaN: true }), fc.double({ min: 0, max: 500, noNaN: true }), (a, d) => {
        expect(order.indexOf(cloggingIndexBand(a + d).band)).toBeGreaterThanOrEqual(order.indexOf(cloggingIndexBand(a).band));
      }),
    );
  });
});

describe('other trade scales', () => {
  it.each([
    // "> 4,000 very good; 2,500–4,000 average; 1,500–2,500 poor; < 1,500 cannot be membrane-filtered" (Romat 2014 via Oenopedia)
    [5200, 'very-good'],
    [4000, 'average'],
    [3000, 'average'],
    [2500, 'average'],
    [2000, 'poor'],
    [1500, 'poor'],
    [1200, 'unfilterable'],
  ] as const)('disc Vmax %s mL → %s', (v, band) => {
    expect(vmaxDiscBand(v).band).toBe(band);
  });

  it.each([
    // "1.0–1.5 good; 1.5–2.0 moderate; > 2.0 re-filter" (NMIT course notes, Dec 2020)
    [1.2, 'good'],
    [1.5, 'good'],
    [1.8, 'moderate'],
    [2.0, 'moderate'],
    [2.4, 're-filter'],
  ] as const)('filterability ratio %s → %s', (r, band) => {
    expect(filterabilityRatioBand(r).band).toBe(band);
  });

  it('filterabilityRatio: hand calculation 90 mL ÷ 60 mL = 1.5', () => {
    expect(filterabilityRatio(90, 60)).toBeCloseTo(1.5, 12);
    expect(() => filterabilityRatio(90, 0)).toThrow(RangeError);
  });

  it.each([
    // IC ≤ 20 for membrane filtration (Chambre d'agriculture de la Gironde)
    [0, 20, 'pass'],
    [0, 21, 'fail'],
    // FI < 20 low blocking, > 20 expect blockage (UK filter supplier; NMIT)
    [1, 19.5, 'pass'],
    [1, 25, 'fail'],
    // FI < 30 ready, > 30 prefilter first (Bulgarian lab-equipment maker)
    [2, 29, 'pass'],
    [2, 31, 'fail'],
  ] as const)('pass/fail scale %s: %s → %s', (i, x, band) => {
    expect(bandOf(PASS_FAIL_FILTERABILITY_SCALES[i], x).band).toBe(band);
  });
});

describe('vmaxArea: A_install = SF·(V_b/v_max + V_b/(J0·t_b)) (Badmington et al. 1995; Zydney & Ho 2002)', () => {
  it.each([
    // hand calculation: 10,000 L, 8 h, v_max 2,000 L/m², J0 500 L/m²/h, SF 1.5:
    //   V_b/v_max = 10,000/2,000 = 5 m²; V_b/(J0 t_b) = 10,000/(500·8) = 2.5 m²;
    //   A_min = 7.5 m²; A_install = 1.5·7.5 = 11.25 m²
    [{ batchL: 10_000, hours: 8, vmaxLPerM2: 2000, j0LPerM2H: 500, safetyFactor: 1.5 }, 7.5, 11.25],
    // hand calculation: 30,000 L, 10 h, v_max 15,000 L/m², J0 1,200 L/m²/h, SF 2:
    //   30,000/15,000 = 2 m²; 30,000/12,000 = 2.5 m²; A_min = 4.5 m²; A_install = 9 m²
    [{ batchL: 30_000, hours: 10, vmaxLPerM2: 15_000, j0LPerM2H: 1200, safetyFactor: 2 }, 4.5, 9],
    // hand calculation: 2,000 L, 4 h, v_max 1,000 L/m², J0 250 L/m²/h, SF 1:
    //   2 m² + 2,000/1,000 = 2 m² → 4 m²
    [{ batchL: 2000, hours: 4, vmaxLPerM2: 1000, j0LPerM2H: 250, safetyFactor: 1 }, 4, 4],
  ])('%o → A_min %s m², A_install %s m²', (p, aMin, aInst) => {
    expect(rel(vmaxMinArea(p), aMin)).toBeLessThan(1e-12);
    expect(rel(vmaxArea(p), aInst)).toBeLessThan(1e-12);
  });

  it('the installed area filters the batch in the time at the test pressure (standard blocking, v(t) = J0 t/(1 + J0 t/v_max))', () => {
    // hand calculation, first case above with SF 1: area 7.5 m², v(8 h) = 500·8/(1 + 4000/2000) = 4000/3 L/m²;
    // 7.5 m² × 1333.33 L/m² = 10,000 L, the batch exactly.
    const a = vmaxArea({ batchL: 10_000, hours: 8, vmaxLPerM2: 2000, j0LPerM2H: 500, safetyFactor: 1 });
    const v = (500 * 8) / (1 + (500 * 8) / 2000);
    expect(rel(a * v, 10_000)).toBeLessThan(1e-12);
  });

  it('property: at SF = 1 the area passes exactly the batch in the time (the sizing relation inverted)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 100, max: 1e6, noNaN: true }),
        fc.double({ min: 0.1, max: 48, noNaN: true }),
        fc.double({ min: 10, max: 1e5, noNaN: true }),
        fc.double({ min: 1, max: 5000, noNaN: true }),
        (batchL, hours, vmaxLPerM2, j0LPerM2H) => {
          const a = vmaxArea({ batchL, hours, vmaxLPerM2, j0LPerM2H, safetyFactor: 1 });
          const v = (j0LPerM2H * hours) / (1 + (j0LPerM2H * hours) / vmaxLPerM2);
          expect(rel(a * v, batchL)).toBeLessThan(1e-9);
          expect(a).toBeGreaterThan(batchL / vmaxLPerM2);
        },
      ),
    );
  });

  it.each([
    { batchL: 0, hours: 8, vmaxLPerM2: 2000, j0LPerM2H: 500, safetyFactor: 1.5 },
    { batchL: 1000, hours: -1, vmaxLPerM2: 2000, j0LPerM2H: 500, safetyFactor: 1.5 },
    { batchL: 1000, hours: 8, vmaxLPerM2: Number.NaN, j0LPerM2H: 500, safetyFactor: 1.5 },
    { batchL: 1000, hours: 8, vmaxLPerM2: 2000, j0LPerM2H: 0, safetyFactor: 1.5 },
    { batchL: 1000, hours: 8, vmaxLPerM2: 2000, j0LPerM2H: 500, safetyFactor: 0.8 },
    { batchL: 1000, hours: 8, vmaxLPerM2: 2000, j0LPerM2H: 500, safetyFactor: Number.POSITIVE_INFINITY },
  ])('rejects %o', (p) => {
    expect(() => vmaxArea(p)).toThrow(RangeError);
  });
});

describe('vmaxEndFlux: J(t_b) = J0/(1 + J0 t_b/v_max)² (Badmington et al. 1995)', () => {
  it.each([
    // hand calculation: J0 500, t 8 h, v_max 2,000: 1 + 4000/2000 = 3 → 500/9 = 55.5556 L/m²/h
    [500, 8, 2000, 500 / 9],
    // hand calculation: J0 1,200, t 10 h, v_max 15,000: 1 + 12,000/15,000 = 1.8 → 1200/3.24 = 370.370 L/m²/h
    [1200, 10, 15_000, 1200 / 3.24],
  ])('J0 %s, t_b %s h, v_max %s → %s', (j0, h, vmax, j) => {
    expect(rel(vmaxEndFlux({ j0LPerM2H: j0, hours: h, vmaxLPerM2: vmax }), j)).toBeLessThan(1e-12);
  });

  it('matches the derivative of v(t) = J0 t/(1 + J0 t/v_max) (numerical check, central difference)', () => {
    const j0 = 700;
    const vmax = 3000;
    const v = (t: number) => (j0 * t) / (1 + (j0 * t) / vmax);
    const h = 1e-5;
    const dvdt = (v(6 + h) - v(6 - h)) / (2 * h);
    expect(rel(vmaxEndFlux({ j0LPerM2H: j0, hours: 6, vmaxLPerM2: vmax }), dvdt)).toBeLessThan(1e-7);
  });
});

describe('elementsNeeded: n = ceil(A_install/A_element)', () => {
  it.each([
    // hand calculation: 11.25/0.7 = 16.07 → 17
    [11.25, 0.7, 17],
    // hand calculation: 9/0.6 = 15 exactly → 15 (no extra element from rounding noise)
    [9, 0.6, 15],
    // hand calculation: 0.3/0.1 = 2.9999999999999996 in floating point → 3
    [0.3, 0.1, 3],
    [0, 0.7, 0],
    // hand calculation: 0.71/0.7 = 1.014 → 2
    [0.71, 0.7, 2],
  ])('%s m² of %s m² elements → %s', (a, e, n) => {
    expect(elementsNeeded(a, e)).toBe(n);
  });

  it.each([
    [-1, 0.7],
    [1, 0],
    [Number.NaN, 0.7],
  ])('rejects %s, %s', (a, e) => {
    expect(() => elementsNeeded(a, e)).toThrow(RangeError);
  });

  it('property: n elements cover the area and n − 1 do not', () => {
    fc.assert(
      fc.property(fc.double({ min: 0.01, max: 500, noNaN: true }), fc.double({ min: 0.05, max: 2, noNaN: true }), (a, e) => {
        const n = elementsNeeded(a, e);
        expect(n * e).toBeGreaterThanOrEqual(a * (1 - 1e-9));
        expect((n - 1) * e).toBeLessThan(a);
      }),
    );
  });
});

describe('vmaxSizing: the whole sizing in one result', () => {
  it('hand calculation: 10,000 L, 8 h, v_max 2,000 L/m², J0 500 L/m²/h, SF 1.5, 0.7 m² elements', () => {
    const s = vmaxSizing({ batchL: 10_000, hours: 8, vmaxLPerM2: 2000, j0LPerM2H: 500, safetyFactor: 1.5, elementAreaM2: 0.7 });
    expect(s.capacityAreaM2).toBeCloseTo(5, 12); // 10,000/2,000
    expect(s.flowAreaM2).toBeCloseTo(2.5, 12); // 10,000/(500·8)
    expect(s.minAreaM2).toBeCloseTo(7.5, 12);
    expect(s.installAreaM2).toBeCloseTo(11.25, 12); // 1.5·7.5
    expect(s.elements).toBe(17); // ceil(11.25/0.7 = 16.07)
    expect(s.installedAreaM2).toBeCloseTo(11.9, 12); // 17·0.7
    expect(s.endFluxLPerM2H).toBeCloseTo(500 / 9, 10); // 500/(1 + 2)²
    expect(s.endFluxFraction).toBeCloseTo(1 / 9, 12);
  });

  it('without an element area, elements are null', () => {
    const s = vmaxSizing({ batchL: 1000, hours: 2, vmaxLPerM2: 1000, j0LPerM2H: 500, safetyFactor: 1 });
    expect(s.elements).toBeNull();
    expect(s.installedAreaM2).toBeNull();
    expect(s.installAreaM2).toBeCloseTo(2, 12); // 1 + 1000/1000
  });
});

describe('scaleUpArea: disc to element by area', () => {
  it.each([
    // hand calculation: 4,000 mL through 3.5 cm²: v_max = 4 L / 3.5e-4 m² = 11,428.57 L/m²;
    //   × 0.5 m² = 5,714.3 L per element; area ratio 0.5/3.5e-4 = 1,428.6
    [4000, 3.5, 0.5, 11_428.571428571, 5_714.2857142857, 1_428.5714285714],
    // hand calculation: 4,000 mL through 4 cm²: 10,000 L/m² × 0.8 m² = 8,000 L; ratio 2,000
    [4000, 4, 0.8, 10_000, 8_000, 2_000],
  ])('disc %s mL over %s cm², element %s m²', (vml, acm2, ae, vpa, vel, ratio) => {
    const s = scaleUpArea({ discVmaxMl: vml, discAreaCm2: acm2, elementAreaM2: ae });
    expect(rel(s.vmaxLPerM2, vpa)).toBeLessThan(1e-10);
    expect(rel(s.vmaxLPerElement, vel)).toBeLessThan(1e-10);
    expect(rel(s.areaRatio, ratio)).toBeLessThan(1e-10);
  });

  it('rejects a zero disc area', () => {
    expect(() => scaleUpArea({ discVmaxMl: 4000, discAreaCm2: 0, elementAreaM2: 0.5 })).toThrow(RangeError);
  });
});
