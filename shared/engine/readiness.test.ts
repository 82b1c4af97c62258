import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  WINE_STYLES,
  cloggingIndexVerdict,
  defaultReadinessThresholds,
  lotReadiness,
  readinessThresholdsSchema,
  type ReadinessThresholds,
  type WineStyle,
} from './readiness';

const clone = <T>(x: T): T => JSON.parse(JSON.stringify(x)) as T;

describe('turbidity criterion with the default thresholds', () => {
  it.each([
    // < 1.0 NTU clear enough before bottling (Wineland, "The filterability of wine"; Vitisphere 2010)
    ['white', 0.6, 'ready'],
    ['white', 1.0, 'ready'],
    // borderline margin 0.5 NTU above the limit: common practice, no source
    ['white', 1.2, 'borderline'],
    ['white', 1.5, 'borderline'],
    ['white', 1.8, 'not-ready'],
    ['rosé', 0.9, 'ready'],
    ['rosé', 1.6, 'not-ready'],
    // reds < 2 NTU, some accept 3–5 behind a good prefilter: common practice, no source
    ['red', 1.9, 'ready'],
    ['red', 3.5, 'borderline'],
    ['red', 5.0, 'borderline'],
    ['red', 6.0, 'not-ready'],
    // sweet: 1.0 NTU (Wineland) with no borderline margin (common practice, no source)
    ['sweet', 1.0, 'ready'],
    ['sweet', 1.1, 'not-ready'],
    ['sparkling', 1.3, 'borderline'],
  ] as const)('%s at %s NTU → %s', (style, ntu, verdict) => {
    expect(lotReadiness({ style, turbidityNtu: ntu }).verdict).toBe(verdict);
  });

  it('states the value and the limit in the reason', () => {
    const r = lotReadiness({ style: 'white', turbidityNtu: 1.8 });
    expect(r.verdict).toBe('not-ready');
    expect(r.reasons[0]).toBe('Turbidity 1.8 NTU is above the 1.0 NTU limit for white wines before membrane filtration.');
    // without a clogging index, the lot is told that NTU alone is not enough (Wine Australia 2016, tip 5)
    expect(r.reasons.some((s) => s.startsWith('No clogging index yet'))).toBe(true);
  });

  it('keeps small values readable (0.45 NTU, not 0.5)', () => {
    expect(lotReadiness({ style: 'red', turbidityNtu: 0.45 }).reasons[0]).toContain('0.45 NTU');
  });
});

describe('clogging-index criterion with the default thresholds', () => {
  it.each([
    // ≤ 20 for membrane filtration (Chambre d'agriculture de la Gironde)
    [-2, 'ready'],
    [12, 'ready'],
    [20, 'ready'],
    // 25–50 "good, trouble if the filter is undersized" (Romat 2014 via Oenopedia) → borderline
    [35, 'borderline'],
    [50, 'borderline'],
    // 50–100 "poor, fast clogging" (Romat 2014 via Oenopedia) → not ready
    [51, 'not-ready'],
    [140, 'not-ready'],
  ] as const)('IC %s s → %s', (ci, verdict) => {
    expect(lotReadiness({ style: 'white', cloggingIndex: ci }).verdict).toBe(verdict);
  });

  it('reason names the value and the limit', () => {
    const r = lotReadiness({ style: 'red', cloggingIndex: 35 });
    expect(r.reasons[0]).toBe(
      'Clogging index 35 s is above the 20 s limit for membrane filtration but within 50 s: expect trouble if the filter is undersized.',
    );
  });

  it('warns that the index is unreliable at 3 NTU or more (Oenopedia §6.1.1.b)', () => {
    const r = lotReadiness({ style: 'red', turbidityNtu: 4, cloggingIndex: 10 });
    expect(r.verdict).toBe('borderline'); // worst of red 4 NTU (borderline) and IC 10 (ready)
    expect(r.reasons.some((s) => s.includes('only meaningful below 3.0 NTU'))).toBe(true);
  });
});

describe('Vmax criterion (safety factor 1.5–2, from memory; Badmington et al. 1995)', () => {
  it.each([
    // hand calculation: 3,000/1,000 = 3× ≥ 2× → ready
    [3000, 1000, 'ready'],
    // hand calculation: 2,000/1,000 = 2× → ready (boundary)
    [2000, 1000, 'ready'],
    // hand calculation: 1,800/1,000 = 1.8× → borderline
    [1800, 1000, 'borderline'],
    // hand calculation: 1,200/1,000 = 1.2× < 1.5× → not ready
    [1200, 1000, 'not-ready'],
  ] as const)('Vmax %s L/m² for %s L/m² planned → %s', (vmax, planned, verdict) => {
    const r = lotReadiness({ style: 'white', vmaxLPerM2: vmax, plannedLPerM2: planned });
    expect(r.verdict).toBe(verdict);
    expect(r.reasons[0]).toContain(`Vmax ${vmax} L/m²`);
  });

  it('Vmax without a planned load cannot be judged', () => {
    const r = lotReadiness({ style: 'white', vmaxLPerM2: 2500 });
    expect(r.verdict).toBe('unknown');
    expect(r.reasons[0]).toContain('cannot be judged');
  });
});

describe('verdict = worst of the criteria present', () => {
  it.each([
    [{ turbidityNtu: 0.5, cloggingIndex: 10 }, 'ready'],
    [{ turbidityNtu: 0.5, cloggingIndex: 35 }, 'borderline'],
    [{ turbidityNtu: 1.2, cloggingIndex: 80 }, 'not-ready'],
    [{ turbidityNtu: 0.4, cloggingIndex: 8, vmaxLPerM2: 1000, plannedLPerM2: 900 }, 'not-ready'],
    [{}, 'unknown'],
  ] as const)('white %o → %s', (data, verdict) => {
    const r = lotReadiness({ style: 'white', ...data });
    expect(r.verdict).toBe(verdict);
    expect(r.reasons.length).toBeGreaterThan(0);
  });

  it('property: adding a criterion never improves the verdict', () => {
    const rank = { ready: 0, borderline: 1, 'not-ready': 2 } as const;
    fc.assert(
      fc.property(
        fc.constantFrom(...WINE_STYLES),
        fc.double({ min: 0, max: 20, noNaN: true }),
        fc.double({ min: -5, max: 200, noNaN: true }),
        (style: WineStyle, ntu, ci) => {
          const a = lotReadiness({ style, turbidityNtu: ntu }).verdict;
          const b = lotReadiness({ style, turbidityNtu: ntu, cloggingIndex: ci }).verdict;
          expect(a).not.toBe('unknown');
          expect(b).not.toBe('unknown');
          expect(rank[b as keyof typeof rank]).toBeGreaterThanOrEqual(rank[a as keyof typeof rank]);
        },
      ),
    );
  });

  it('property: a clearer wine is never judged worse (turbidity monotone)', () => {
    const rank = { ready: 0, borderline: 1, 'not-ready': 2 } as const;
    fc.assert(
      fc.property(
        fc.constantFrom(...WINE_STYLES),
        fc.double({ min: 0, max: 20, noNaN: true }),
        fc.double({ min: 0, max: 20, noNaN: true }),
        (style: WineStyle, a, b) => {
          const [lo, hi] = a <= b ? [a, b] : [b, a];
          const vlo = lotReadiness({ style, turbidityNtu: lo }).verdict as keyof typeof rank;
          const vhi = lotReadiness({ style, turbidityNtu: hi }).verdict as keyof typeof rank;
          expect(rank[vlo]).toBeLessThanOrEqual(rank[vhi]);
        },
      ),
    );
  });
});

describe('thresholds are editable data with sources', () => {
  it('the defaults pass the schema and every entry names a source', () => {
    const parsed = readinessThresholdsSchema.parse(defaultReadinessThresholds);
    for (const s of WINE_STYLES) expect(parsed.turbidity[s].source.length).toBeGreaterThan(10);
    expect(parsed.cloggingIndex.source).toMatch(/Romat/);
    expect(parsed.turbidity.red.source).toMatch(/common practice, no source/i);
    expect(parsed.turbidity.white.source).toMatch(/Wineland/);
  });

  it('uses edited thresholds', () => {
    const t: ReadinessThresholds = clone(defaultReadinessThresholds);
    t.turbidity.white.limitNtu = 2;
    t.turbidity.white.borderlineMarginNtu = 0;
    expect(lotReadiness({ style: 'white', turbidityNtu: 1.8 }, t).verdict).toBe('ready');
    expect(lotReadiness({ style: 'white', turbidityNtu: 1.8 }, t).reasons[0]).toContain('2.0 NTU limit');
  });

  it.each([
    ['negative limit', (t: ReadinessThresholds) => void (t.turbidity.red.limitNtu = -1)],
    ['ready above borderline', (t: ReadinessThresholds) => void (t.cloggingIndex.readyMaxS = 60)],
    ['safety factor below 1', (t: ReadinessThresholds) => void (t.vmax.borderlineMinSafetyFactor = 0.5)],
    ['empty source', (t: ReadinessThresholds) => void (t.turbidity.white.source = '')],
  ])('rejects thresholds with %s (schema and RangeError)', (_name, edit) => {
    const t = clone(defaultReadinessThresholds);
    edit(t);
    expect(readinessThresholdsSchema.safeParse(t).success).toBe(false);
    expect(() => lotReadiness({ style: 'white', turbidityNtu: 0.5 }, t)).toThrow(RangeError);
  });
});

describe('input checks', () => {
  it.each([
    [{ style: 'white', turbidityNtu: -0.1 }],
    [{ style: 'white', turbidityNtu: Number.NaN }],
    [{ style: 'white', cloggingIndex: Number.POSITIVE_INFINITY }],
    [{ style: 'white', vmaxLPerM2: 0, plannedLPerM2: 100 }],
    [{ style: 'orange' as WineStyle }],
  ] as const)('rejects %o', (lot) => {
    expect(() => lotReadiness(lot as Parameters<typeof lotReadiness>[0])).toThrow(RangeError);
  });
});

describe('cloggingIndexVerdict: one source for the badge and the readiness', () => {
  it('34 s is above the 20 s limit (Chambre d’agriculture de la Gironde), within 50 s (Romat 2014): borderline, as the readiness says', () => {
    const v = cloggingIndexVerdict(34);
    expect(v).toMatchObject({ verdict: 'borderline', short: 'above 20 s' });
    const lot = lotReadiness({ style: 'white', cloggingIndex: 34 });
    expect(lot.reasons).toContain(v.reason);
    expect(cloggingIndexVerdict(20).verdict).toBe('ready');
    expect(cloggingIndexVerdict(51).verdict).toBe('not-ready');
    expect(cloggingIndexVerdict(25, { readyMaxS: 30, borderlineMaxS: 60 }).verdict).toBe('ready');
  });
});
