import { describe, expect, it } from 'vitest';
import { sizeTrain } from '../engine';
import { cartridgeTypeFigures, housingAreaM2, housingElementEquivalents, lineFigures } from './equipment';
import { blockingReasons, buildTrainSizingInput, sizePlanTrain, type TrainSizingSource } from './plans';

// Fictional catalogue rows, as the repositories return them.
const membrane = {
  id: 't1',
  name: 'Membrane 0.45',
  kind: 'membrane' as const,
  ratingUm: 0.45,
  areaM2Per10in: 0.6,
  waterFlowLhPer10in: 1000,
  waterDpBar: 0.2,
  maxDpForwardBar: 5,
  maxDpReverseBar: 2,
  maxTempC: 80,
  terminalDpBar: 2,
  designFluxLhPer10in: 500,
  pricePer10in: 100,
  currency: 'EUR',
  ratedHotWaterCycles: 20,
};
const housing = { id: 'h1', name: 'H1', rounds: 3, lengthIn: 30, maxPressureBar: 6, maxTempC: 90, holdUpL: 12 };
const source = (over: Partial<TrainSizingSource> = {}): TrainSizingSource => ({
  wine: { tempC: 15, ethanolPctVol: 12.5, sugarGPerL: 3 },
  volumeL: 10_000,
  line: { bottlesPerHour: 3000, bottleMl: 750 },
  stages: [{ name: 'Final', cartridgeTypeId: 't1', housingId: 'h1' }] as TrainSizingSource['stages'],
  types: [membrane],
  housings: [housing],
  ...over,
});

describe('plan rows to the engine (shared/adapters/plans.ts)', () => {
  it('maps a stored stage to the engine stage: a backwashable type is regenerable for rated cycles + 1 loads', () => {
    const built = buildTrainSizingInput(source());
    expect(built.ok).toBe(true);
    if (!built.ok) return;
    const stage = built.input.stages[0];
    expect(stage).toMatchObject({ name: 'Final', housingId: 'h1', housingCount: 1, housing: { rounds: 3, lengthIn: 30 } });
    expect(stage.cartridgeType).toMatchObject({ regenerable: true, serviceLifeLoads: 21, capacityLPerM2: undefined });
    expect(built.input).toMatchObject({ batchL: 10_000, line: { bottlesPerHour: 3000, bottleMl: 750 }, lineLosses: undefined, sanitation: undefined });
  });

  it('says in words what is missing instead of sizing', () => {
    expect(buildTrainSizingInput(source({ line: null }))).toEqual({ ok: false, error: 'Choose a bottling line for the plan first.' });
    expect(buildTrainSizingInput(source({ stages: [] }))).toEqual({ ok: false, error: 'Add at least one stage.' });
    expect(buildTrainSizingInput(source({ types: [] }))).toMatchObject({ ok: false, error: 'Final: choose a cartridge type from the catalogue.' });
  });

  it('sizes with the engine itself, and an outcome without sizing is its own blocking reason', () => {
    const outcome = sizePlanTrain(source());
    const built = buildTrainSizingInput(source());
    if (!outcome.ok || !built.ok) throw new Error('expected a sizing');
    expect(outcome.result).toEqual(sizeTrain(built.input));
    expect(blockingReasons({ ok: false, error: 'Add at least one stage.' })).toEqual(['Add at least one stage.']);
  });
});

describe('equipment rows to engine figures (shared/adapters/equipment.ts)', () => {
  it('counts 10-inch equivalents and area (rounds × length / 10; common practice, no source)', () => {
    expect(housingElementEquivalents({ rounds: 3, lengthIn: 30 })).toBe(9);
    expect(housingElementEquivalents({ rounds: 0, lengthIn: 30 })).toBeNull();
    expect(housingAreaM2(9, 0.6)).toBeCloseTo(5.4, 12);
    expect(housingAreaM2(0, 0.6)).toBeNull();
  });

  it('gives line flows (3000 bottles/h × 0.75 L = 2250 L/h, hand arithmetic) and null for a half-typed form', () => {
    expect(lineFigures({ bottlesPerHour: 3000, bottleMl: 750 })?.fillerFlowLh).toBeCloseTo(2250, 9);
    expect(lineFigures({ bottlesPerHour: -1, bottleMl: 750 })).toBeNull();
  });

  it('gives clean-water figures of a type, or null outside the engine range', () => {
    const f = cartridgeTypeFigures(membrane);
    expect(f?.specTempC).toBe(20);
    expect(f?.resistancePerM).toBeGreaterThan(0);
    // Darcy is linear in flow: the design flow (500 L/h) is half the spec flow (1000 L/h at 0.2 bar).
    expect(f?.cleanWaterDpBarAtDesignFlux).toBeCloseTo(0.1, 9);
    expect(cartridgeTypeFigures({ ...membrane, waterFlowLhPer10in: 0 })).toBeNull();
  });
});
