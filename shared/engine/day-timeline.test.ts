import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  buildDayTimeline,
  DEFAULT_DAY_STEPS,
  DEFAULT_HOT_WATER_SANITATION_MIN,
  DEFAULT_STEAM_SANITATION_MIN,
  type DayTimelineInput,
} from './day-timeline';

// Fictional bottling day. 06:00 UTC on 15 September 2025.
const START = Date.UTC(2025, 8, 15, 6, 0, 0);
const MIN = 60_000;

describe('buildDayTimeline — hot-water day with two lots (hand calculation)', () => {
  // Defaults for hot water: sanitation 30 min, cool-down 15, integrity test 20, push-out 10,
  // changeover 30, integrity after 20.
  // Lot A: 4950 L at 2475 L/h = 2 h; lot B: 1237.5 L at 2475 L/h = 0.5 h.
  //   06:00–06:30 sanitation, 06:30–06:45 cool-down, 06:45–07:05 integrity before,
  //   07:05–09:05 run A, 09:05–09:15 push-out A, 09:15–09:45 changeover, 09:45–10:15 run B,
  //   10:15–10:25 push-out B, 10:25–10:45 integrity after. Total 285 min; runs 150 min.
  const day = buildDayTimeline({
    startMs: START,
    sanitationKind: 'hot-water',
    lots: [
      { lotId: 'lot-a', label: 'Rosé 2024 tank 4', volumeL: 4950, flowLh: 2475 },
      { label: 'White blend', volumeL: 1237.5, flowLh: 2475 },
    ],
  });

  it.each([
    [0, 'sanitation', 0, 30, undefined],
    [1, 'sanitation', 30, 45, undefined],
    [2, 'integrity-before', 45, 65, undefined],
    [3, 'run', 65, 185, 0],
    [4, 'push-out', 185, 195, 0],
    [5, 'changeover', 195, 225, 1],
    [6, 'run', 225, 255, 1],
    [7, 'push-out', 255, 265, 1],
    [8, 'integrity-after', 265, 285, undefined],
  ] as const)('block %i is %s from +%i to +%i min', (i, kind, from, to, lotIndex) => {
    const b = day.blocks[i];
    expect(b.kind).toBe(kind);
    expect(b.startMs).toBe(START + from * MIN);
    expect(b.endMs).toBe(START + to * MIN);
    expect(b.lotIndex).toBe(lotIndex);
  });

  it('has nine blocks, labels, lot ids and the hand-calculated totals', () => {
    expect(day.blocks).toHaveLength(9);
    expect(day.blocks[0].label).toBe('Hot-water sanitation');
    expect(day.blocks[1].label).toBe('Cool-down');
    expect(day.blocks[3].label).toContain('Rosé 2024 tank 4');
    expect(day.blocks[3].lotId).toBe('lot-a');
    expect(day.blocks[6].lotId).toBeUndefined();
    expect(day.totals).toEqual({
      startMs: START,
      endMs: START + 285 * MIN,
      totalMin: 285,
      sanitationMin: 45,
      integrityMin: 40,
      runMin: 150,
      pushOutMin: 20,
      changeoverMin: 30,
      interventionMin: 0,
      nonRunMin: 135,
      volumeL: 6187.5,
    });
  });
});

describe('buildDayTimeline — defaults and overrides', () => {
  it('uses 30 min hot water (Mon-Viti, Chambre d’agriculture de la Gironde: ~30 min at 85 °C; UC Davis Bottling Line Readiness 2019: 82 °C ≥ 30 min)', () => {
    expect(DEFAULT_HOT_WATER_SANITATION_MIN).toBe(30);
    expect(DEFAULT_DAY_STEPS['hot-water'].sanitationMin).toBe(30);
  });

  it('uses 45 min of steam (a mobile bottler’s 45-min steam bath; Process Heating, "Sterilizing bottles with steam": ≥ 15 min hold)', () => {
    expect(DEFAULT_STEAM_SANITATION_MIN).toBe(45);
    const day = buildDayTimeline({ startMs: 0, sanitationKind: 'steam', lots: [{ label: 'A', volumeL: 1000, flowLh: 1000 }] });
    expect(day.blocks[0]).toMatchObject({ kind: 'sanitation', label: 'Steam sanitation', startMs: 0, endMs: 45 * MIN });
    // cool-down after steam 30 min (common practice, no source)
    expect(day.blocks[1]).toMatchObject({ kind: 'sanitation', label: 'Cool-down', endMs: 75 * MIN });
  });

  it('merges given steps over the defaults and drops zero-minute steps', () => {
    // One lot of 500 L at 1000 L/h = 30 min; sanitation 20, no cool-down, no integrity tests,
    // push-out 5 → 20 + 30 + 5 = 55 min (hand calculation).
    const day = buildDayTimeline({
      startMs: START,
      sanitationKind: 'hot-water',
      steps: { sanitationMin: 20, coolDownMin: 0, integrityTestMin: 0, pushOutMin: 5, postIntegrityTestMin: 0 },
      lots: [{ label: 'A', volumeL: 500, flowLh: 1000 }],
    });
    expect(day.blocks.map((b) => b.kind)).toEqual(['sanitation', 'run', 'push-out']);
    expect(day.totals.totalMin).toBeCloseTo(55, 12);
    expect(day.steps.changeoverMin).toBe(DEFAULT_DAY_STEPS['hot-water'].changeoverMin);
  });

  it('is pure: the same input gives the same blocks, shifted with the start time', () => {
    const input: DayTimelineInput = { startMs: START, sanitationKind: 'hot-water', lots: [{ label: 'A', volumeL: 3000, flowLh: 2000 }] };
    const a = buildDayTimeline(input);
    expect(buildDayTimeline(input)).toEqual(a);
    const b = buildDayTimeline({ ...input, startMs: START + 3 * 3_600_000 });
    expect(b.blocks.map((x) => x.startMs - 3 * 3_600_000)).toEqual(a.blocks.map((x) => x.startMs));
  });
});

describe('buildDayTimeline — invalid inputs throw RangeError', () => {
  const lot = { label: 'A', volumeL: 1000, flowLh: 1000 };
  it.each<[string, DayTimelineInput]>([
    ['no lots', { startMs: 0, sanitationKind: 'hot-water', lots: [] }],
    ['NaN start', { startMs: NaN, sanitationKind: 'hot-water', lots: [lot] }],
    ['zero flow', { startMs: 0, sanitationKind: 'hot-water', lots: [{ ...lot, flowLh: 0 }] }],
    ['negative volume', { startMs: 0, sanitationKind: 'hot-water', lots: [{ ...lot, volumeL: -5 }] }],
    ['negative push-out time', { startMs: 0, sanitationKind: 'steam', steps: { pushOutMin: -1 }, lots: [lot] }],
    ['unknown sanitation kind', { startMs: 0, sanitationKind: 'ozone' as 'steam', lots: [lot] }],
  ])('%s', (_label, input) => {
    expect(() => buildDayTimeline(input)).toThrow(RangeError);
  });
});

describe('buildDayTimeline — properties (fast-check)', () => {
  it('blocks are contiguous, ordered, and their durations add up to the totals', () => {
    const lotArb = fc.record({
      label: fc.string({ minLength: 1, maxLength: 12 }),
      volumeL: fc.double({ min: 1, max: 60_000, noNaN: true }),
      flowLh: fc.double({ min: 100, max: 20_000, noNaN: true }),
    });
    const minArb = fc.integer({ min: 0, max: 120 });
    fc.assert(
      fc.property(
        fc.array(lotArb, { minLength: 1, maxLength: 6 }),
        fc.record({
          sanitationMin: minArb,
          coolDownMin: minArb,
          integrityTestMin: minArb,
          pushOutMin: minArb,
          changeoverMin: minArb,
          postIntegrityTestMin: minArb,
        }),
        fc.constantFrom('hot-water' as const, 'steam' as const),
        (lots, steps, sanitationKind) => {
          const day = buildDayTimeline({ startMs: START, lots, steps, sanitationKind });
          const { blocks, totals } = day;
          expect(blocks[0].startMs).toBe(START);
          for (let i = 0; i < blocks.length; i++) {
            expect(blocks[i].endMs).toBeGreaterThan(blocks[i].startMs);
            if (i > 0) expect(blocks[i].startMs).toBe(blocks[i - 1].endMs);
          }
          expect(blocks[blocks.length - 1].endMs).toBe(totals.endMs);
          expect(blocks.filter((b) => b.kind === 'run')).toHaveLength(lots.length);
          expect(blocks.filter((b) => b.kind === 'changeover')).toHaveLength(steps.changeoverMin > 0 ? lots.length - 1 : 0);
          const expectedRunMin = lots.reduce((s, l) => s + (l.volumeL / l.flowLh) * 60, 0);
          expect(totals.runMin).toBeCloseTo(expectedRunMin, 6);
          expect(totals.totalMin).toBeCloseTo(totals.runMin + totals.nonRunMin, 6);
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('buildDayTimeline — regenerations and changes within a lot', () => {
  it('cuts the run at each stop and merges stops of two stages at the same litre (hand-calculated; durations common practice, no source)', () => {
    // 6,000 L at 2,000 L/h: 3 h. Prefilter regenerated after 2,000 L; membrane changed and
    // prefilter regenerated after 4,000 L (one 30-min change block).
    const day = buildDayTimeline({
      startMs: 0,
      sanitationKind: 'hot-water',
      steps: { sanitationMin: 0, coolDownMin: 0, integrityTestMin: 0, pushOutMin: 0, postIntegrityTestMin: 0 },
      lots: [
        {
          label: 'W1',
          volumeL: 6000,
          flowLh: 2000,
          stops: [
            { kind: 'regeneration', stage: 'Prefilter', afterL: 4000 },
            { kind: 'regeneration', stage: 'Prefilter', afterL: 2000 },
            { kind: 'change', stage: 'Membrane', afterL: 4000 },
          ],
        },
      ],
    });
    expect(day.blocks.map((b) => [b.kind, b.label, (b.endMs - b.startMs) / MIN])).toEqual([
      ['run', 'Run: W1', 60],
      ['regeneration', 'W1: Regeneration of Prefilter', 20],
      ['run', 'Run: W1', 60],
      ['change', 'W1: Regeneration of Prefilter, change of Membrane', 30],
      ['run', 'Run: W1', 60],
    ]);
    expect(day.totals).toMatchObject({ runMin: 180, interventionMin: 50, nonRunMin: 50, totalMin: 230 });
    expect(DEFAULT_DAY_STEPS.steam).toMatchObject({ regenerationMin: 20, changeMin: 30 });
  });

  it('refuses a stop at or after the end of the lot', () => {
    expect(() =>
      buildDayTimeline({ startMs: 0, sanitationKind: 'steam', lots: [{ label: 'A', volumeL: 1000, flowLh: 1000, stops: [{ kind: 'change', stage: 'M', afterL: 1000 }] }] }),
    ).toThrow(RangeError);
  });
});
