import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  TYPICAL_CARTRIDGE_RATINGS,
  cartridgeLife,
  conservativeCartridgeRatings,
  fitRecoveryTrend,
  type CareCycle,
  type CareCycleKind,
  type CartridgeHistory,
  type CartridgeRatings,
} from './cartridge-life';

const WEEK_MS = 7 * 24 * 3600 * 1000;

// Fictional scenario A (hand calculation): a 30" membrane, new clean-water flow 1,000 L/h.
// 10 cycles in order: S H S C S H S H C H (4 steam of 30 min, 4 hot-water, 2 chemical).
// Water flow after cycles 2, 4, 6, 8, 10 = 960, 920, 880, 840, 800 L/h
//   → recovery 96, 92, 88, 84, 80 % = 100 − 2·n exactly (linear).
const kindsA: CareCycleKind[] = ['steam', 'hot-water', 'steam', 'chemical', 'steam', 'hot-water', 'steam', 'hot-water', 'chemical', 'hot-water'];
const cyclesA: CareCycle[] = kindsA.map((kind, i) => ({
  kind,
  seq: i + 1,
  ...(kind === 'steam' ? { tempC: 121, durationMin: 30 } : {}),
  ...((i + 1) % 2 === 0 ? { waterFlowAfterLh: 1000 - 20 * (i + 1), waterFlowBeforeLh: 500 } : {}),
}));
const ratingsA: CartridgeRatings = {
  ratedSteamCycles: 50,
  ratedHotWaterCycles: 100,
  ratedChemicalCycles: 20,
  ratedLitres: 100_000,
  ratedSteamMinutes: 1500,
  flowRecoveryMinPct: 60,
};
const historyA: CartridgeHistory = { litresFiltered: 30_000, cycles: cyclesA, waterFlowNewLh: 1000, integrity: [{ pass: true, atMs: 1 }] };

describe('scenario A: flow recovery limits life (hand calculation)', () => {
  const r = cartridgeLife(ratingsA, historyA, { cyclesPerWeek: 2, nowMs: 0 });

  it('counts the cycles and the fraction of each budget used', () => {
    expect(r.counts).toEqual({ steam: 4, hotWater: 4, chemical: 2, backflush: 0, total: 10, aboveRating: 0 });
    // 4/50 = 0.08; 4/100 = 0.04; 2/20 = 0.1; 30,000/100,000 = 0.3; 4·30 = 120 min / 1,500 = 0.08
    expect(r.fractionUsed.steamCycles).toBeCloseTo(0.08, 12);
    expect(r.fractionUsed.hotWaterCycles).toBeCloseTo(0.04, 12);
    expect(r.fractionUsed.chemicalCycles).toBeCloseTo(0.1, 12);
    expect(r.fractionUsed.litres).toBeCloseTo(0.3, 12);
    expect(r.fractionUsed.steamMinutes).toBeCloseTo(0.08, 12);
    // litres per cycle = 30,000/10 = 3,000 L
    expect(r.litresPerCycle).toBeCloseTo(3000, 12);
  });

  it('budgets count down: cycles left per budget', () => {
    const left = Object.fromEntries(r.budgets.map((b) => [b.factor, b.cyclesLeft]));
    expect(left['steam cycles']).toBe(46); // 50 − 4
    expect(left['hot-water cycles']).toBe(96); // 100 − 4
    expect(left['chemical cycles']).toBe(18); // 20 − 2
    expect(left['steam minutes']).toBeCloseTo(46, 12); // (1,500 − 120)/30
    expect(left['litres']).toBeCloseTo(70_000 / 3000, 12); // 23.33
  });

  it('fits the recovery trend: linear 100 − 2·n, reaches 60 % at n = 20, 10 cycles from now', () => {
    expect(r.recovery.basis).toBe('new');
    expect(r.recovery.points.map((p) => p.recoveryPct)).toEqual([96, 92, 88, 84, 80].map((x) => expect.closeTo(x, 10)));
    // gain after/before: 960/500 = 192 %
    expect(r.recovery.points[0].gainPct).toBeCloseTo(192, 10);
    const t = r.recovery.trend;
    expect(t?.model).toBe('linear');
    expect(t?.slopePctPerCycle).toBeCloseTo(-2, 10);
    expect(t?.interceptPct).toBeCloseTo(100, 10);
    expect(t?.r2).toBeCloseTo(1, 10);
    // (60 − 100)/(−2) = 20; 20 − 10 cycles done = 10
    expect(t?.cycleAtMinimum).toBeCloseTo(20, 10);
    expect(r.recovery.cyclesLeft).toBeCloseTo(10, 10);
  });

  it('limiting factor, remaining cycles and litres, date', () => {
    expect(r.ended).toBe(false);
    expect(r.limitingFactor).toBe('flow recovery'); // 10 < 18 < 23.3 < 46 < 96
    expect(r.remainingCycles).toBe(10);
    // min(100,000 − 30,000 = 70,000; 3,000 L/cycle × 10 = 30,000) = 30,000 L
    expect(r.remainingLitres).toBeCloseTo(30_000, 8);
    // 10 cycles at 2 per week = 5 weeks
    expect(r.estimatedEndMs).toBeCloseTo(5 * WEEK_MS, 3);
  });

  it('says what it knows and what it misses', () => {
    expect(r.known.some((s) => s.includes('As-new clean-water flow'))).toBe(true);
    expect(r.known.some((s) => s.includes('Water flow after the cycle for 5 of 10 cycles'))).toBe(true);
    expect(r.missing).toEqual([]);
  });
});

describe('scenario B: chemical cycles limit life, no flow data (hand calculation)', () => {
  const cycles: CareCycle[] = Array.from({ length: 8 }, (_, i) => ({ kind: 'chemical' as const, agent: 'NaOH 1 %', atMs: 1000 * (i + 1) }));
  const r = cartridgeLife({ ratedChemicalCycles: 10, flowRecoveryMinPct: 50 }, { litresFiltered: 16_000, cycles });

  it('8 of 10 chemical cycles used: 2 left, 2 × 2,000 L/cycle = 4,000 L', () => {
    expect(r.fractionUsed.chemicalCycles).toBeCloseTo(0.8, 12);
    expect(r.limitingFactor).toBe('chemical cycles');
    expect(r.remainingCycles).toBe(2);
    expect(r.remainingLitres).toBeCloseTo(4000, 10);
    expect(r.estimatedEndMs).toBeNull();
  });

  it('lists the missing data', () => {
    const m = r.missing.join(' | ');
    expect(m).toContain('no rated steam cycles');
    expect(m).toContain('As-new clean-water flow');
    expect(m).toContain('Water flow after regeneration');
    expect(m).toContain('Integrity test results');
    expect(m).toContain('cycles per week');
    expect(r.recovery.trend).toBeNull();
    expect(r.recovery.basis).toBeNull();
  });
});

describe('integrity ends life', () => {
  it('a failed integrity test ends life: remaining 0, limiting factor integrity', () => {
    const r = cartridgeLife(ratingsA, { ...historyA, integrity: [{ pass: true, atMs: 1 }, { pass: false, atMs: 2 }] }, { cyclesPerWeek: 2, nowMs: 123 });
    expect(r.ended).toBe(true);
    expect(r.limitingFactor).toBe('integrity');
    expect(r.remainingCycles).toBe(0);
    expect(r.remainingLitres).toBe(0);
    expect(r.endedBecause[0]).toContain('integrity test failed');
    expect(r.estimatedEndMs).toBe(123);
    expect(r.integrity).toEqual({ tests: 2, failures: 1, latestPass: false });
  });

  it('a failure cleared by a passing re-test does not end life under the default rule, and does under "any"', () => {
    // re-test after re-wetting, as a membrane maker's note on false integrity failures advises
    const h = { ...historyA, integrity: [{ pass: false, atMs: 5 }, { pass: true, atMs: 6 }] };
    expect(cartridgeLife(ratingsA, h).ended).toBe(false);
    expect(cartridgeLife(ratingsA, h, { integrityRule: 'any' }).ended).toBe(true);
  });

  it('orders tests by time when every test has one', () => {
    const h = { ...historyA, integrity: [{ pass: false, atMs: 9 }, { pass: true, atMs: 6 }] };
    expect(cartridgeLife(ratingsA, h).ended).toBe(true);
  });
});

describe('budgets reaching 100 % end life', () => {
  it.each([
    // 30 steam cycles of 30 rated (hand calculation: fraction 30/30 = 1)
    ['steam cycles', { ratedSteamCycles: 30, flowRecoveryMinPct: 60 }, { litresFiltered: 5000, cycles: Array.from({ length: 30 }, () => ({ kind: 'steam' as const })) }],
    // 12,000 L of 10,000 rated
    ['litres', { ratedLitres: 10_000, flowRecoveryMinPct: 60 }, { litresFiltered: 12_000, cycles: [{ kind: 'hot-water' as const }] }],
    // 3 steam cycles of 30 min = 90 min of 90 rated
    ['steam minutes', { ratedSteamMinutes: 90, flowRecoveryMinPct: 60 }, { litresFiltered: 0, cycles: Array.from({ length: 3 }, () => ({ kind: 'steam' as const, durationMin: 30 })) }],
  ] as const)('%s used up', (factor, ratings, history) => {
    const r = cartridgeLife(ratings, history as CartridgeHistory);
    expect(r.ended).toBe(true);
    expect(r.limitingFactor).toBe(factor);
    expect(r.remainingCycles).toBe(0);
    expect(r.endedBecause[0]).toMatch(/used up/);
  });

  it('flow recovery below the floor ends life', () => {
    // hand calculation: 550/1,000 = 55 % < 60 %
    const r = cartridgeLife(
      { ratedSteamCycles: 50, flowRecoveryMinPct: 60 },
      { litresFiltered: 1000, waterFlowNewLh: 1000, cycles: [{ kind: 'chemical', waterFlowAfterLh: 700 }, { kind: 'chemical', waterFlowAfterLh: 550 }] },
    );
    expect(r.ended).toBe(true);
    expect(r.limitingFactor).toBe('flow recovery');
    expect(r.endedBecause[0]).toContain('55 %');
  });
});

describe('flow recovery trend models (ordinary least squares)', () => {
  it('exponential decline is fitted as exponential (hand calculation: 100·0.95^n, n = 1…5)', () => {
    const cycles: CareCycle[] = [1, 2, 3, 4, 5].map((n) => ({ kind: 'hot-water' as const, waterFlowAfterLh: 1000 * 0.95 ** n }));
    const r = cartridgeLife({ ratedHotWaterCycles: 100, flowRecoveryMinPct: 60 }, { litresFiltered: 5000, waterFlowNewLh: 1000, cycles });
    const t = r.recovery.trend;
    expect(t?.model).toBe('exponential');
    expect(t?.interceptPct).toBeCloseTo(100, 8);
    expect(t?.ratePerCycle).toBeCloseTo(Math.log(0.95), 10);
    // ln(0.6)/ln(0.95) = −0.5108256/−0.0512933 = 9.95892 → 4.959 more cycles → 4 whole cycles
    expect(t?.cycleAtMinimum).toBeCloseTo(9.95892, 4);
    expect(r.remainingCycles).toBe(4);
    expect(r.limitingFactor).toBe('flow recovery');
  });

  it('without the new flow, recovery is relative to the first measurement (hand calculation)', () => {
    // 900, 855, 810 L/h → 100, 95, 90 % = 105 − 5·n; 60 % at n = 9 → 6 more cycles
    const cycles: CareCycle[] = [900, 855, 810].map((f) => ({ kind: 'backflush' as const, waterFlowAfterLh: f }));
    const r = cartridgeLife({ flowRecoveryMinPct: 60 }, { litresFiltered: 3000, cycles });
    expect(r.recovery.basis).toBe('first-after');
    expect(r.recovery.trend?.model).toBe('linear');
    expect(r.recovery.trend?.slopePctPerCycle).toBeCloseTo(-5, 10);
    expect(r.remainingCycles).toBe(6);
    // 3,000/3 = 1,000 L per cycle × 6 = 6,000 L
    expect(r.remainingLitres).toBeCloseTo(6000, 8);
    expect(r.missing.some((s) => s.startsWith('As-new clean-water flow'))).toBe(true);
  });

  it('two points: both models exact, the line is kept (conservative)', () => {
    const t = fitRecoveryTrend([{ cycle: 1, recoveryPct: 95 }, { cycle: 2, recoveryPct: 90 }], 60);
    expect(t?.model).toBe('linear');
    // 95 − 5(n − 1): 60 % at n = 8
    expect(t?.cycleAtMinimum).toBeCloseTo(8, 10);
  });

  it('a flat or rising trend gives no flow limit', () => {
    const t = fitRecoveryTrend([{ cycle: 1, recoveryPct: 90 }, { cycle: 2, recoveryPct: 91 }, { cycle: 3, recoveryPct: 92 }], 60);
    expect(t?.cycleAtMinimum).toBeNull();
    expect(fitRecoveryTrend([{ cycle: 1, recoveryPct: 90 }], 60)).toBeNull();
  });

  it('property: on exactly linear data the line is recovered', () => {
    fc.assert(
      fc.property(fc.double({ min: 80, max: 100, noNaN: true }), fc.double({ min: -3, max: -0.1, noNaN: true }), fc.integer({ min: 3, max: 12 }), (a, b, n) => {
        const pts = Array.from({ length: n }, (_, i) => ({ cycle: i + 1, recoveryPct: a + b * (i + 1) }));
        const t = fitRecoveryTrend(pts, 1);
        expect(t).not.toBeNull();
        const pred = (x: number) => (t?.model === 'linear' ? (t.interceptPct + (t.slopePctPerCycle as number) * x) : (t?.interceptPct as number) * Math.exp((t?.ratePerCycle as number) * x));
        for (const p of pts) expect(Math.abs(pred(p.cycle) - p.recoveryPct)).toBeLessThan(1e-6);
      }),
    );
  });
});

describe('steam minutes with missing durations (hand calculation)', () => {
  it('fills unknown durations with the longest logged one', () => {
    // 30 + 45 + (unknown → 45) = 120 min of 600 → 0.2; (600 − 120)/45 = 10.67 → 10 steam cycles
    const cycles: CareCycle[] = [{ kind: 'steam', durationMin: 30 }, { kind: 'steam', durationMin: 45 }, { kind: 'steam' }];
    const r = cartridgeLife({ ratedSteamMinutes: 600, flowRecoveryMinPct: 60 }, { litresFiltered: 0, cycles });
    expect(r.fractionUsed.steamMinutes).toBeCloseTo(0.2, 12);
    expect(r.remainingCycles).toBe(10);
    expect(r.limitingFactor).toBe('steam minutes');
    expect(r.missing.some((s) => s.includes('Duration of 1 of 3 steam cycles'))).toBe(true);
  });
});

describe('a new cartridge with no history', () => {
  it('uses the ratings alone', () => {
    const r = cartridgeLife(conservativeCartridgeRatings, { litresFiltered: 0, cycles: [] });
    expect(r.remainingCycles).toBe(TYPICAL_CARTRIDGE_RATINGS.steamCycles.min); // 30 steam cycles (from memory), smallest budget
    expect(r.limitingFactor).toBe('steam cycles');
    expect(r.remainingLitres).toBeNull();
    expect(r.fractionUsed.steamCycles).toBe(0);
    expect(r.ended).toBe(false);
  });

  it('with only a litres rating, litres limit and cycles are unknown', () => {
    const r = cartridgeLife({ ratedLitres: 50_000, flowRecoveryMinPct: 60 }, { litresFiltered: 10_000, cycles: [] });
    expect(r.limitingFactor).toBe('litres');
    expect(r.remainingCycles).toBeNull();
    expect(r.remainingLitres).toBe(40_000);
  });

  it('with nothing rated, nothing limits', () => {
    const r = cartridgeLife({ flowRecoveryMinPct: 60 }, { litresFiltered: 0, cycles: [] });
    expect(r.limitingFactor).toBeNull();
    expect(r.remainingCycles).toBeNull();
    expect(r.missing.some((s) => s.startsWith('Any rating or trend'))).toBe(true);
  });
});

describe('typical defaults carry their provenance', () => {
  it('ranges and sources', () => {
    // hot water 80–90 °C ≥ 50–100 cycles; steam 121 °C 30–100 cycles or 15–50 h (from memory)
    expect(TYPICAL_CARTRIDGE_RATINGS.hotWaterCycles).toMatchObject({ min: 50, max: 100 });
    expect(TYPICAL_CARTRIDGE_RATINGS.steamCycles).toMatchObject({ min: 30, max: 100 });
    expect(TYPICAL_CARTRIDGE_RATINGS.steamMinutes).toMatchObject({ min: 900, max: 3000 });
    // ΔP back to 1.5–2× new → flow 1/2 to 1/1.5 = 50–66.7 % (common practice, no source; Darcy)
    expect(TYPICAL_CARTRIDGE_RATINGS.flowRecoveryMinPct.min).toBe(50);
    expect(TYPICAL_CARTRIDGE_RATINGS.flowRecoveryMinPct.max).toBeCloseTo(66.667, 3);
    expect(TYPICAL_CARTRIDGE_RATINGS.steamCycles.source).toMatch(/from memory/);
    expect(TYPICAL_CARTRIDGE_RATINGS.flowRecoveryMinPct.source).toMatch(/common practice, no source/);
  });
});

describe('cycle order', () => {
  it('sorts by seq when every cycle has one, else by time, else keeps the given order', () => {
    const base = { flowRecoveryMinPct: 10 };
    const bySeq = cartridgeLife(base, {
      litresFiltered: 0,
      waterFlowNewLh: 100,
      cycles: [
        { kind: 'chemical', seq: 2, waterFlowAfterLh: 80 },
        { kind: 'chemical', seq: 1, waterFlowAfterLh: 90 },
      ],
    });
    expect(bySeq.recovery.latestPct).toBeCloseTo(80, 10);
    const byTime = cartridgeLife(base, {
      litresFiltered: 0,
      waterFlowNewLh: 100,
      cycles: [
        { kind: 'chemical', atMs: 20, waterFlowAfterLh: 90 },
        { kind: 'chemical', atMs: 10, waterFlowAfterLh: 80 },
      ],
    });
    expect(byTime.recovery.latestPct).toBeCloseTo(90, 10);
  });
});

describe('input checks', () => {
  const ok: CartridgeHistory = { litresFiltered: 0, cycles: [] };
  it.each([
    [{ flowRecoveryMinPct: 0 }, ok],
    [{ flowRecoveryMinPct: 120 }, ok],
    [{ flowRecoveryMinPct: Number.NaN }, ok],
    [{ flowRecoveryMinPct: 60, ratedSteamCycles: -5 }, ok],
    [{ flowRecoveryMinPct: 60 }, { litresFiltered: -1, cycles: [] }],
    [{ flowRecoveryMinPct: 60 }, { litresFiltered: 0, cycles: [{ kind: 'ozone' as CareCycleKind }] }],
    [{ flowRecoveryMinPct: 60 }, { litresFiltered: 0, cycles: [{ kind: 'steam' as const, tempC: 400 }] }],
    [{ flowRecoveryMinPct: 60 }, { litresFiltered: 0, cycles: [{ kind: 'steam' as const, durationMin: -3 }] }],
    [{ flowRecoveryMinPct: 60 }, { litresFiltered: 0, cycles: [{ kind: 'chemical' as const, waterFlowAfterLh: Number.POSITIVE_INFINITY }] }],
    [{ flowRecoveryMinPct: 60 }, { litresFiltered: 0, cycles: [], waterFlowNewLh: 0 }],
  ])('rejects %o with %o', (ratings, history) => {
    expect(() => cartridgeLife(ratings as CartridgeRatings, history as CartridgeHistory)).toThrow(RangeError);
  });

  it('rejects bad options', () => {
    expect(() => cartridgeLife({ flowRecoveryMinPct: 60 }, ok, { cyclesPerWeek: 0, nowMs: 0 })).toThrow(RangeError);
    expect(() => cartridgeLife({ flowRecoveryMinPct: 60 }, ok, { nowMs: Number.NaN })).toThrow(RangeError);
  });
});

// ---------------------------------------------------------------------------
// Property tests
// ---------------------------------------------------------------------------

const kindArb = fc.constantFrom<CareCycleKind>('steam', 'hot-water', 'chemical', 'backflush');
const cycleArb: fc.Arbitrary<CareCycle> = fc.record(
  {
    kind: kindArb,
    durationMin: fc.integer({ min: 5, max: 60 }),
    waterFlowAfterLh: fc.integer({ min: 200, max: 1000 }),
  },
  { requiredKeys: ['kind'] },
);
const noFlowCycleArb: fc.Arbitrary<CareCycle> = fc.record(
  { kind: kindArb, durationMin: fc.integer({ min: 5, max: 60 }) },
  { requiredKeys: ['kind'] },
);
const ratingsArb = (withLitres: boolean): fc.Arbitrary<CartridgeRatings> =>
  fc.record(
    {
      ratedSteamCycles: fc.integer({ min: 1, max: 120 }),
      ratedHotWaterCycles: fc.integer({ min: 1, max: 120 }),
      ratedChemicalCycles: fc.integer({ min: 1, max: 120 }),
      ratedSteamMinutes: fc.integer({ min: 60, max: 3000 }),
      ...(withLitres ? { ratedLitres: fc.integer({ min: 1000, max: 1_000_000 }) } : {}),
      flowRecoveryMinPct: fc.integer({ min: 20, max: 90 }),
    },
    // With a litres rating the rating must be present; the other budgets may be missing.
    { requiredKeys: withLitres ? (['flowRecoveryMinPct', 'ratedLitres'] as never[]) : ['flowRecoveryMinPct'] },
  );

describe('properties', () => {
  it('one more cycle (without a flow measurement) never increases remaining cycles, never lowers use, never revives', () => {
    fc.assert(
      fc.property(
        ratingsArb(false),
        fc.array(cycleArb, { maxLength: 40 }),
        noFlowCycleArb,
        fc.integer({ min: 0, max: 200_000 }),
        fc.boolean(),
        (ratings, cycles, extra, litres, withNew) => {
          const h: CartridgeHistory = { litresFiltered: litres, cycles, ...(withNew ? { waterFlowNewLh: 1000 } : {}) };
          const a = cartridgeLife(ratings, h);
          const b = cartridgeLife(ratings, { ...h, cycles: [...cycles, extra] });
          if (a.remainingCycles !== null) {
            expect(b.remainingCycles).not.toBeNull();
            expect(b.remainingCycles as number).toBeLessThanOrEqual(a.remainingCycles);
          }
          for (const k of Object.keys(a.fractionUsed) as (keyof typeof a.fractionUsed)[]) {
            // a steam cycle of unknown duration can make the steam time unknown (null): not a lower use
            if (a.fractionUsed[k] !== null && b.fractionUsed[k] !== null) expect(b.fractionUsed[k] as number).toBeGreaterThanOrEqual((a.fractionUsed[k] as number) - 1e-12);
          }
          if (a.ended) expect(b.ended).toBe(true);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('with a litres rating, one more cycle that filters at least the average so far never increases remaining cycles', () => {
    fc.assert(
      fc.property(
        ratingsArb(true),
        fc.array(noFlowCycleArb, { minLength: 1, maxLength: 40 }),
        noFlowCycleArb,
        fc.integer({ min: 1, max: 200_000 }),
        fc.double({ min: 1, max: 3, noNaN: true }),
        (ratings, cycles, extra, litres, k) => {
          const a = cartridgeLife(ratings, { litresFiltered: litres, cycles });
          const more = k * (litres / cycles.length);
          const b = cartridgeLife(ratings, { litresFiltered: litres + more, cycles: [...cycles, extra] });
          expect(a.remainingCycles).not.toBeNull();
          expect(b.remainingCycles as number).toBeLessThanOrEqual(a.remainingCycles as number);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('outputs are finite and consistent: ended ⇔ remaining 0 with reasons; fractions ≥ 0', () => {
    fc.assert(
      fc.property(
        ratingsArb(true),
        fc.array(cycleArb, { maxLength: 60 }),
        fc.integer({ min: 0, max: 2_000_000 }),
        fc.array(fc.record({ pass: fc.boolean() }), { maxLength: 4 }),
        (ratings, cycles, litres, integrity) => {
          const r = cartridgeLife(ratings, { litresFiltered: litres, cycles, integrity, waterFlowNewLh: 1000 }, { cyclesPerWeek: 3, nowMs: 0 });
          expect(r.ended).toBe(r.endedBecause.length > 0);
          if (r.ended) {
            expect(r.remainingCycles).toBe(0);
            expect(r.remainingLitres).toBe(0);
          }
          if (r.remainingCycles !== null) {
            expect(Number.isInteger(r.remainingCycles)).toBe(true);
            expect(r.remainingCycles).toBeGreaterThanOrEqual(0);
          }
          if (r.remainingLitres !== null) expect(Number.isFinite(r.remainingLitres) && r.remainingLitres >= 0).toBe(true);
          for (const v of Object.values(r.fractionUsed)) if (v !== null) expect(Number.isFinite(v) && v >= 0).toBe(true);
          if (r.estimatedEndMs !== null) expect(Number.isFinite(r.estimatedEndMs)).toBe(true);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('messages', () => {
  it('format numbers plainly (thousands separators, no trailing zeros)', () => {
    const r = cartridgeLife({ ratedLitres: 1_250_000, flowRecoveryMinPct: 66.5 }, { litresFiltered: 12_345.6, cycles: [] });
    expect(r.known).toContain('Rated litres: 1,250,000 L.');
    expect(r.known).toContain('Flow recovery floor: 66.5 %.');
    expect(r.known).toContain('Litres filtered: 12,346 L.');
  });
});
