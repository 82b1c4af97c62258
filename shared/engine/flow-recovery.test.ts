import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { careTemperatureHint, cartridgeLife, fitRecoveryTrend, normalisedWaterFlowLh } from './cartridge-life';
import { waterViscosity } from './fluids';

describe('water flow brought to 20 °C, per cartridge, at the reference ΔP (Darcy; IAPWS R12-08 viscosity; engineering reference §5)', () => {
  it('a clean cartridge measured in 10 °C water reads ≈ 100 % recovery, not 76.7 %', () => {
    // as new: 4 000 L/h at 20 °C. Same cartridge, same ΔP, 10 °C water: 4 000 × μ20/μ10 = 4 000 × 1.0016/1.3059 = 3 068 L/h
    const at10 = (4000 * 1.0016) / 1.3059;
    expect((at10 / 4000) * 100).toBeCloseTo(76.7, 1);
    const q20 = normalisedWaterFlowLh({ flowLh: at10, waterTempC: 10 });
    expect((q20 / 4000) * 100).toBeCloseTo(100, 0);
    expect(waterViscosity(10) / waterViscosity(20)).toBeCloseTo(1.3059 / 1.0016, 3);
  });

  it('a housing flow is divided among its cartridges (3 × 30-inch: one cartridge is 3 of 9 equivalents)', () => {
    expect(normalisedWaterFlowLh({ flowLh: 12000, basis: 'housing', cartridgeEquivalents: 3, housingEquivalents: 9 })).toBeCloseTo(4000, 9);
  });

  it('a flow at 0.5 bar is brought to a 1 bar reference (Q ∝ ΔP)', () => {
    expect(normalisedWaterFlowLh({ flowLh: 2000, dpBar: 0.5, refDpBar: 1 })).toBeCloseTo(4000, 9);
    expect(() => normalisedWaterFlowLh({ flowLh: 2000, dpBar: 0.5 })).toThrow(RangeError);
  });
});

describe('recovery trend of an accelerating decline (Burnham & Anderson 2002, AICc; hand calculation)', () => {
  // r = 100 − 0.2·n² (± 0.2 % reading noise), floor 70 %: the truth reaches 70 % at n = √150 = 12.25,
  // i.e. 4.2 cycles after the 8th. A straight line through the same points leaves about 9.
  const noise = [0.1, -0.2, 0.15, -0.1, 0.2, -0.15, 0.05, -0.05];
  const points = noise.map((e, i) => ({ cycle: i + 1, recoveryPct: 100 - 0.2 * (i + 1) ** 2 + e }));

  it('chooses the quadratic and leaves 3–5 cycles', () => {
    const t = fitRecoveryTrend(points, 70);
    expect(t?.model).toBe('quadratic');
    const left = (t?.cycleAtMinimum as number) - 8;
    expect(left).toBeGreaterThanOrEqual(3);
    expect(left).toBeLessThanOrEqual(5);
  });

  it('the straight line alone would have promised more', () => {
    // least-squares line through the points: slope ≈ −1.8 %/cycle, from 87.2 % → ≈ 9.5 cycles
    const lineOnly = fitRecoveryTrend(points.slice(0, 4), 70);
    expect(lineOnly?.model).not.toBe('quadratic');
  });

  it('cartridgeLife counts the cycles left from the quadratic', () => {
    const life = cartridgeLife(
      { flowRecoveryMinPct: 70 },
      { litresFiltered: 0, waterFlowNewLh: 1000, cycles: points.map((p) => ({ kind: 'hot-water' as const, waterFlowAfterLh: p.recoveryPct * 10 })) },
    );
    expect(life.recovery.trend?.model).toBe('quadratic');
    expect(life.recovery.cyclesLeft).toBeGreaterThanOrEqual(3);
    expect(life.recovery.cyclesLeft).toBeLessThanOrEqual(5);
  });
});

describe('care temperatures never above a rating (common practice, no source)', () => {
  it('a cartridge rated 80 °C is never told "about 82 °C"', () => {
    const h = careTemperatureHint('hot-water', 80);
    expect(h.suggestC).toBeLessThanOrEqual(80);
    expect(h.text).not.toMatch(/82/);
    expect(h.text).toMatch(/80 °C/);
  });

  it('a cartridge rated 90 °C gets the usual 82 °C; steam needs a steam rating', () => {
    expect(careTemperatureHint('hot-water', 90).suggestC).toBe(82);
    expect(careTemperatureHint('steam', 80)).toMatchObject({ suggestC: null });
    expect(careTemperatureHint('steam', 80).text).toMatch(/Not rated for steam/);
    expect(careTemperatureHint('steam', 135).suggestC).toBe(121);
  });

  it('property: the suggestion never exceeds the rating', () => {
    fc.assert(
      fc.property(fc.constantFrom('hot-water', 'steam', 'chemical', 'backflush' as const), fc.double({ min: 20, max: 200, noNaN: true }), (kind, rating) => {
        const h = careTemperatureHint(kind, rating);
        if (h.suggestC !== null) expect(h.suggestC).toBeLessThanOrEqual(rating);
      }),
    );
  });

  it('a cycle that ran above its rating counts in the life and is flagged', () => {
    const life = cartridgeLife({ flowRecoveryMinPct: 70, ratedHotWaterCycles: 10 }, { litresFiltered: 0, cycles: [{ kind: 'hot-water', tempC: 95, aboveRating: true }] });
    expect(life.counts.aboveRating).toBe(1);
    expect(life.budgets.find((b) => b.factor === 'hot-water cycles')?.used).toBe(1);
    expect(life.missing.join(' ')).toMatch(/above the temperature rating/);
  });
});
