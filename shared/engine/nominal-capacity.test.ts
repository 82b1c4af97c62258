import { describe, expect, it } from 'vitest';
import { capacityFromVmax, sizeTrain } from './index';
import { pastRunsOfWhites, twoStageSizingInput } from '../../tests/factories/sizing';

// The order of the capacity sources of a stage (issue: "the lot's Vmax disc test, the winery's
// own closed runs of similar wines, and last the type's nominal"; a typed figure overrides all).
// Common practice, no source: the order is the product's rule, the arithmetic is capacity × area.

describe('sizeTrain — the type’s nominal capacity is the last source (common practice, no source)', () => {
  it('typed > Vmax > past runs > nominal > unknown, one source removed at a time', () => {
    const i = twoStageSizingInput();
    const m = i.stages[1].cartridgeType;
    i.wine.vmaxLPerM2 = 900;
    m.capacityLPerM2 = 2000;
    m.pastRuns = pastRunsOfWhites;
    m.nominalCapacityLPerM2 = 800;
    expect(sizeTrain(i).stages[1]).toMatchObject({ capacitySource: 'stage', capacityLPerM2: 2000 });

    delete m.capacityLPerM2;
    const v = sizeTrain(i).stages[1];
    expect(v.capacitySource).toBe('vmax');
    expect(v.capacityLPerM2).toBeCloseTo(capacityFromVmax({ vmaxLPerM2: 900, cleanDpBar: v.cleanDpBar, terminalDpBar: v.terminalDpBar }), 9);

    delete i.wine.vmaxLPerM2;
    expect(sizeTrain(i).stages[1]).toMatchObject({ capacitySource: 'past-runs', capacityLPerM2: 1500, capacityPastRuns: pastRunsOfWhites });

    delete m.pastRuns;
    const n = sizeTrain(i).stages[1];
    expect(n).toMatchObject({ capacitySource: 'nominal', capacityLPerM2: 800 });
    expect(n.capacityPastRuns).toBeUndefined();
    // 0.6 m² per 10-inch × 3 rounds × 3 (30-inch) = 5.4 m² → 800 × 5.4 = 4,320 L; 10,000 L → 3 loads.
    expect(n.areaM2).toBeCloseTo(5.4, 9);
    expect(n.capacityL).toBeCloseTo(4320, 6);
    expect(n.loadsNeeded).toBe(3);

    delete m.nominalCapacityLPerM2;
    expect(sizeTrain(i).stages[1]).toMatchObject({ capacitySource: null, capacityLPerM2: null, capacityL: null });
  });

  it('a prefilter takes its nominal too (no Vmax test applies to it); an infeasible stage still holds 0 L', () => {
    const i = twoStageSizingInput();
    i.wine.vmaxLPerM2 = 900;
    i.stages[0].cartridgeType.nominalCapacityLPerM2 = 3000;
    expect(sizeTrain(i).stages[0]).toMatchObject({ capacitySource: 'nominal', capacityLPerM2: 3000 });
    // At 2 °C with a terminal ΔP below the clean ΔP nothing fits, whatever the nominal says.
    const cold = twoStageSizingInput();
    cold.wine.tempC = 2;
    cold.stages[1].cartridgeType.terminalDpBar = 0.05;
    cold.stages[1].cartridgeType.nominalCapacityLPerM2 = 800;
    const s = sizeTrain(cold).stages[1];
    expect(s.infeasible).toBe(true);
    expect(s.capacityL).toBe(0);
    expect(s.capacitySource).toBeNull();
  });

  it('refuses a nominal capacity that is not a positive finite number', () => {
    for (const bad of [0, -100, Number.NaN, Number.POSITIVE_INFINITY]) {
      const i = twoStageSizingInput();
      i.stages[1].cartridgeType.nominalCapacityLPerM2 = bad;
      expect(() => sizeTrain(i)).toThrow(RangeError);
    }
  });
});
