import { describe, expect, it } from 'vitest';
import { capacityFromVmax, sizeTrain, type TrainSizingInput } from './index';

// The order of the capacity sources of a stage (issue: "the lot's Vmax disc test, the winery's
// own closed runs of similar wines, and last the type's nominal"; a typed figure overrides all).
// Common practice, no source: the order is the product's rule, the arithmetic is capacity × area.

function input(): TrainSizingInput {
  return {
    wine: { tempC: 20, ethanolPctVol: 12 },
    line: { bottlesPerHour: 3000, bottleMl: 750, marginPct: 10 },
    batchL: 10_000,
    stages: [
      {
        name: 'Prefilter 1 µm',
        cartridgeType: { kind: 'prefilter', ratingUm: 1, areaM2Per10in: 0.6, waterFlowLhPer10in: 1000, waterDpBar: 0.05, maxDpForwardBar: 5, terminalDpBar: 2, designFluxLhPer10in: 1200 },
        housing: { rounds: 3, lengthIn: 20, maxPressureBar: 6, holdUpL: 10 },
      },
      {
        name: 'Membrane 0.45 µm',
        cartridgeType: { kind: 'membrane', ratingUm: 0.45, areaM2Per10in: 0.6, waterFlowLhPer10in: 500, waterDpBar: 0.1, maxDpForwardBar: 5, terminalDpBar: 1.2, designFluxLhPer10in: 500 },
        housing: { rounds: 3, lengthIn: 30, maxPressureBar: 6, holdUpL: 20 },
      },
    ],
  };
}

const past = { lPerM2: 1500, lowLPerM2: 1350, highLPerM2: 1720, runs: 3, style: 'white' as const, nearestBy: 'clogging-index' as const, runIds: ['a', 'b', 'c'] };

describe('sizeTrain — the type’s nominal capacity is the last source (common practice, no source)', () => {
  it('typed > Vmax > past runs > nominal > unknown, one source removed at a time', () => {
    const i = input();
    const m = i.stages[1].cartridgeType;
    i.wine.vmaxLPerM2 = 900;
    m.capacityLPerM2 = 2000;
    m.pastRuns = past;
    m.nominalCapacityLPerM2 = 800;
    expect(sizeTrain(i).stages[1]).toMatchObject({ capacitySource: 'stage', capacityLPerM2: 2000 });

    delete m.capacityLPerM2;
    const v = sizeTrain(i).stages[1];
    expect(v.capacitySource).toBe('vmax');
    expect(v.capacityLPerM2).toBeCloseTo(capacityFromVmax({ vmaxLPerM2: 900, cleanDpBar: v.cleanDpBar, terminalDpBar: v.terminalDpBar }), 9);

    delete i.wine.vmaxLPerM2;
    expect(sizeTrain(i).stages[1]).toMatchObject({ capacitySource: 'past-runs', capacityLPerM2: 1500, capacityPastRuns: past });

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
    const i = input();
    i.wine.vmaxLPerM2 = 900;
    i.stages[0].cartridgeType.nominalCapacityLPerM2 = 3000;
    expect(sizeTrain(i).stages[0]).toMatchObject({ capacitySource: 'nominal', capacityLPerM2: 3000 });
    // At 2 °C with a terminal ΔP below the clean ΔP nothing fits, whatever the nominal says.
    const cold = input();
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
      const i = input();
      i.stages[1].cartridgeType.nominalCapacityLPerM2 = bad;
      expect(() => sizeTrain(i)).toThrow(RangeError);
    }
  });
});
