import { describe, expect, it } from 'vitest';
import { cartridgeSpent, cartridgeUsable, dayCartridgeNeeds, type DayNeedsCartridge, type DayNeedsStage } from './day-needs';

// Arithmetic checked by hand in each case (common practice, no source: a set stays in its
// housing between lots of the same train and is used until its capacity is reached).
const membrane = (over: Partial<DayNeedsStage> = {}): DayNeedsStage => ({
  cartridgeTypeId: 'mem',
  housingId: 'h2',
  housingCount: 1,
  lengthIn: 30,
  cartridgeCount: 3,
  elementEquivalents: 9,
  capacityL: 10000,
  regenerable: false,
  ...over,
});
const prefilter = (over: Partial<DayNeedsStage> = {}): DayNeedsStage => ({
  ...membrane(),
  cartridgeTypeId: 'pre',
  housingId: 'h1',
  capacityL: 4000,
  regenerable: true,
  maxRegenerationsPerLot: 2,
  ...over,
});
const stock = (typeId: string, n: number, over: Partial<DayNeedsCartridge> = {}): DayNeedsCartridge[] =>
  Array.from({ length: n }, () => ({ cartridgeTypeId: typeId, lengthIn: 30, status: 'in-stock', spent: false, latestIntegrityPass: null, ...over }));

describe('dayCartridgeNeeds', () => {
  it('carries a set over to the next lot of the same train while capacity remains', () => {
    // 6,000 L then 3,000 L through one 10,000 L membrane set: one set for the day.
    const day = dayCartridgeNeeds(
      [
        { lotId: 'a', label: 'A', volumeL: 6000, stages: [membrane()] },
        { lotId: 'b', label: 'B', volumeL: 3000, stages: [membrane()] },
      ],
      stock('mem', 3),
    );
    expect(day.lines).toEqual([
      expect.objectContaining({ cartridgeTypeId: 'mem', cartridgesNeeded: 3, elementEquivalentsNeeded: 9, lotLabels: ['A'], cartridgesAvailable: 3, shortfall: 0, verdict: 'enough' }),
    ]);
    expect(day.lots[1].stages).toEqual([{ carriedOver: true, newSets: 0, regenerations: 0, changes: 0, stops: [] }]);
  });

  it('changes the carried set during the next lot when its capacity runs out', () => {
    // 6,000 + 5,000 L: the set takes 4,000 L more, then a change for the last 1,000 L.
    const day = dayCartridgeNeeds(
      [
        { lotId: 'a', label: 'A', volumeL: 6000, stages: [membrane()] },
        { lotId: 'b', label: 'B', volumeL: 5000, stages: [membrane()] },
      ],
      stock('mem', 3),
    );
    expect(day.lines[0]).toMatchObject({ cartridgesNeeded: 6, lotLabels: ['A', 'B'], shortfall: 3, verdict: 'short' });
    expect(day.lots[1].stages).toEqual([{ carriedOver: true, newSets: 1, regenerations: 0, changes: 1, stops: [{ kind: 'change', afterL: 4000 }] }]);
  });

  it('regenerates a carried regenerable set before changing it', () => {
    // Prefilter 4,000 L per load, 1 + 2 loads per set. Lot A 10,000 L: 3 loads (2 regenerations),
    // 2,000 L left on the third load. Lot B 2,000 L fits exactly; lot C 3,000 L needs a new set.
    const day = dayCartridgeNeeds(
      [
        { lotId: 'a', label: 'A', volumeL: 10000, stages: [prefilter()] },
        { lotId: 'b', label: 'B', volumeL: 2000, stages: [prefilter()] },
        { lotId: 'c', label: 'C', volumeL: 3000, stages: [prefilter()] },
      ],
      stock('pre', 10),
    );
    expect(day.lots.map((l) => l.stages)).toEqual([
      [{ carriedOver: false, newSets: 1, regenerations: 2, changes: 0, stops: [{ kind: 'regeneration', afterL: 4000 }, { kind: 'regeneration', afterL: 8000 }] }],
      [{ carriedOver: true, newSets: 0, regenerations: 0, changes: 0, stops: [] }],
      // The carried set is used up exactly: the change comes before the first litre of C.
      [{ carriedOver: true, newSets: 1, regenerations: 0, changes: 1, stops: [{ kind: 'change', afterL: 0 }] }],
    ]);
    expect(day.lines[0]).toMatchObject({ cartridgesNeeded: 6, lotLabels: ['A', 'C'] });
  });

  it('regenerates the carried set in the next lot while it has cycles left', () => {
    // 1 + 2 loads per set; lot A 3,000 L uses 1 load (1,000 L left); lot B 6,000 L: 1,000 L
    // on that load, then 5,000 L = 2 loads, both regenerations of the same set.
    const day = dayCartridgeNeeds(
      [
        { lotId: 'a', label: 'A', volumeL: 3000, stages: [prefilter()] },
        { lotId: 'b', label: 'B', volumeL: 6000, stages: [prefilter()] },
      ],
      [],
    );
    expect(day.lots[1].stages).toEqual([{ carriedOver: true, newSets: 0, regenerations: 2, changes: 0, stops: [{ kind: 'regeneration', afterL: 1000 }, { kind: 'regeneration', afterL: 5000 }] }]);
    expect(day.lines[0]).toMatchObject({ cartridgesNeeded: 3, cartridgesAvailable: 0, shortfall: 3 });
  });

  it('does not carry over across a different train, an unknown capacity or a lot without train', () => {
    const other = membrane({ housingId: 'h3' });
    const day = dayCartridgeNeeds(
      [
        { lotId: 'a', label: 'A', volumeL: 1000, stages: [membrane()] },
        { lotId: 'b', label: 'B', volumeL: 1000, stages: [other] },
        { lotId: 'c', label: 'C', volumeL: 1000, stages: null },
        { lotId: 'd', label: 'D', volumeL: 1000, stages: [other] },
        { lotId: 'e', label: 'E', volumeL: 1000, stages: [membrane({ capacityL: null })] },
        { lotId: 'f', label: 'F', volumeL: 1000, stages: [membrane({ capacityL: null })] },
      ],
      [],
    );
    expect(day.lots.map((l) => l.stages?.[0].newSets ?? null)).toEqual([1, 1, null, 1, 1, 1]);
    expect(day.lots[5].stages?.[0]).toEqual({ carriedOver: false, newSets: 1, regenerations: null, changes: null, stops: [] });
    expect(day.lines[0].cartridgesNeeded).toBe(15);
  });

  it('counts only usable cartridges: not retired, not spent, latest integrity test not failed', () => {
    const held = [
      ...stock('mem', 1),
      ...stock('mem', 1, { status: 'installed' }),
      ...stock('mem', 1, { status: 'retired' }),
      ...stock('mem', 1, { spent: true }),
      ...stock('mem', 1, { latestIntegrityPass: false }),
      ...stock('mem', 1, { latestIntegrityPass: true }),
      ...stock('mem', 4, { lengthIn: 20 }),
    ];
    const day = dayCartridgeNeeds([{ lotId: 'a', label: 'A', volumeL: 1000, stages: [membrane()] }], held);
    expect(day.lines[0]).toMatchObject({ inStock: 2, installed: 1, cartridgesAvailable: 3, notUsable: 2, shortfall: 0 });
    expect(cartridgeUsable({ cartridgeTypeId: 'x', lengthIn: 10, status: 'regenerating', spent: false, latestIntegrityPass: null })).toBe(false);
  });

  it('calls a cartridge spent when a rated cycle budget is used up', () => {
    const rated = { ratedSteamCycles: 100, ratedHotWaterCycles: null, ratedChemicalCycles: 20 };
    expect(cartridgeSpent({ steamCycles: 99, hotWaterCycles: 500, chemicalCycles: 19 }, rated)).toBe(false);
    expect(cartridgeSpent({ steamCycles: 100, hotWaterCycles: 0, chemicalCycles: 0 }, rated)).toBe(true);
    expect(cartridgeSpent({ steamCycles: 0, hotWaterCycles: 0, chemicalCycles: 20 }, rated)).toBe(true);
  });

  it('lists the stops of a lot not carried over: regenerations, then a change to a new set', () => {
    // 1 + 1 loads per set, 4,000 L per load, 13,000 L: loads at 0, 4,000, 8,000, 12,000 L;
    // sets 1 (loads 0–1) and 2 (loads 2–3).
    const day = dayCartridgeNeeds([{ lotId: 'a', label: 'A', volumeL: 13000, stages: [prefilter({ maxRegenerationsPerLot: 1 })] }], []);
    expect(day.lots[0].stages?.[0]).toEqual({
      carriedOver: false,
      newSets: 2,
      regenerations: 2,
      changes: 1,
      stops: [
        { kind: 'regeneration', afterL: 4000 },
        { kind: 'change', afterL: 8000 },
        { kind: 'regeneration', afterL: 12000 },
      ],
    });
  });

  it('refuses a negative volume', () => {
    expect(() => dayCartridgeNeeds([{ lotId: 'a', label: 'A', volumeL: -1, stages: [membrane()] }], [])).toThrow(RangeError);
  });
});
