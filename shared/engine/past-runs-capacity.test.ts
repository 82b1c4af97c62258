import { describe, expect, it } from 'vitest';
import {
  PAST_RUNS_MIN,
  capacityFromPastRuns,
  pastRunsEvidence,
  sizeTrain,
  stageLitresPerM2FromRun,
  type PastRunStageOutcome,
} from './index';
import { pastRunsOfWhites, twoStageSizingInput } from '../../tests/factories/sizing';

// Standard blocking at constant flow (Hermia, Trans. IChemE 60 (1982) 183–187, constant-flux
// form): ΔP = ΔP0 / (1 − K·V)². With ΔP0 = 0.2 bar, K = 1/20,000 L⁻¹ and terminal 1.2 bar:
// (1 − K·V)² = 0.2/1.2 → V = (1 − √(1/6))·20,000 = 11,835.0 L (hand calculation).
const dp0 = 0.2;
const k = 1 / 20_000;
const standardDp = (v: number) => dp0 / (1 - k * v) ** 2;
const vTerminal = (1 - Math.sqrt(dp0 / 1.2)) / k;

describe('stageLitresPerM2FromRun — what one closed run tells', () => {
  it('fits the readings to terminal ΔP when the stage did not reach it (Hermia 1982 standard law; hand calculation 11,835 L over 10 m²)', () => {
    expect(vTerminal).toBeCloseTo(11_835.0, 0);
    const points = [0, 1000, 2000, 3000, 4000, 5000, 6000, 7000, 8000].map((v) => ({ volumeL: v, dpBar: standardDp(v) }));
    const out = stageLitresPerM2FromRun({ points, terminalDpBar: 1.2, areaM2: 10 });
    expect(out).not.toBeNull();
    expect(out!.basis).toBe('fit');
    expect(out!.lPerM2).toBeCloseTo(vTerminal / 10, -1); // within 5 L/m² of 1,183.5
  });

  it('takes the litres actually passed when ΔP reached terminal (≥ 95 %; common practice, no source)', () => {
    const points = [
      { volumeL: 0, dpBar: 0.2 },
      { volumeL: 6000, dpBar: 0.5 },
      { volumeL: 12_000, dpBar: 1.16 },
    ];
    const out = stageLitresPerM2FromRun({ points, terminalDpBar: 1.2, areaM2: 10 });
    expect(out).toEqual({ lPerM2: 1200, basis: 'reached', sets: 1 });
  });

  it('counts each set between changes on its own (9,900 and 14,100 L) and takes their median (common practice, no source)', () => {
    const points = [
      { volumeL: 0, dpBar: 0.2 },
      { volumeL: 9_900, dpBar: 1.2 },
      { volumeL: 10_000, dpBar: 0.25 },
      { volumeL: 24_100, dpBar: 1.19 },
    ];
    const out = stageLitresPerM2FromRun({ points, terminalDpBar: 1.2, areaM2: 10, restartsAtL: [10_000] });
    expect(out).toEqual({ lPerM2: 1200, basis: 'reached', sets: 2 });
  });

  it('says nothing when ΔP did not rise (no fit, not at terminal) or the readings are too few', () => {
    const flat = [0, 1000, 2000, 3000, 4000].map((v) => ({ volumeL: v, dpBar: 0.2 }));
    expect(stageLitresPerM2FromRun({ points: flat, terminalDpBar: 1.2, areaM2: 10 })).toBeNull();
    expect(stageLitresPerM2FromRun({ points: [{ volumeL: 100, dpBar: 0.3 }], terminalDpBar: 1.2, areaM2: 10 })).toBeNull();
    expect(stageLitresPerM2FromRun({ points: [], terminalDpBar: 1.2, areaM2: 10 })).toBeNull();
  });

  it('does not trust a fit that reaches past 3 × the litres seen (run-forecast rule; common practice, no source)', () => {
    const points = [0, 200, 400, 600].map((v) => ({ volumeL: v, dpBar: standardDp(v * 2) }));
    expect(stageLitresPerM2FromRun({ points, terminalDpBar: 1.2, areaM2: 10 })).toBeNull();
  });
});

const outcome = (o: Partial<PastRunStageOutcome> & { runId: string; lPerM2: number }): PastRunStageOutcome => ({
  style: 'white',
  cartridgeTypeId: 'membrane-045',
  cloggingIndexS: null,
  turbidityNtu: null,
  closedAt: '2026-06-01T12:00:00.000Z',
  basis: 'reached',
  ...o,
});

describe('capacityFromPastRuns — the choice among similar wines (common practice, no source)', () => {
  const runs: PastRunStageOutcome[] = [
    outcome({ runId: 'a', cloggingIndexS: 10, turbidityNtu: 0.5, lPerM2: 1350, closedAt: '2026-03-01T00:00:00.000Z' }),
    outcome({ runId: 'b', cloggingIndexS: 12, turbidityNtu: 0.7, lPerM2: 1500, closedAt: '2026-04-01T00:00:00.000Z' }),
    outcome({ runId: 'c', cloggingIndexS: 30, turbidityNtu: 1.5, lPerM2: 1720, closedAt: '2026-05-01T00:00:00.000Z' }),
    outcome({ runId: 'd', cloggingIndexS: 60, turbidityNtu: 4, lPerM2: 600, closedAt: '2026-06-01T00:00:00.000Z' }),
    // not similar: another style, another type
    outcome({ runId: 'e', style: 'red', cloggingIndexS: 11, lPerM2: 90 }),
    outcome({ runId: 'f', cartridgeTypeId: 'prefilter-1', cloggingIndexS: 11, lPerM2: 9000 }),
  ];

  it('takes the same style and type, the nearest by clogging index, and their median; the range is their lowest and highest', () => {
    const c = capacityFromPastRuns(runs, { style: 'white', cartridgeTypeId: 'membrane-045', cloggingIndexS: 11 }, { maxRuns: 3 });
    expect(c).toMatchObject({ lPerM2: 1500, lowLPerM2: 1350, highLPerM2: 1720, runs: 3, nearestBy: 'clogging-index', runIds: ['b', 'a', 'c'] }); // a tie goes to the later run
    expect(pastRunsEvidence(c!)).toBe('3 runs of whites, nearest by clogging index, 1,350–1,720 L/m²');
  });

  it('an even number of runs gives the mean of the middle two', () => {
    const c = capacityFromPastRuns(runs, { style: 'white', cartridgeTypeId: 'membrane-045', cloggingIndexS: 11 }, { maxRuns: 4 });
    expect(c!.lPerM2).toBe((1350 + 1500) / 2);
    expect(c!.runs).toBe(4);
  });

  it('falls back to turbidity when the lot has no clogging index, then to the latest runs', () => {
    const byNtu = capacityFromPastRuns(runs, { style: 'white', cartridgeTypeId: 'membrane-045', turbidityNtu: 3.5 }, { maxRuns: 2 });
    expect(byNtu).toMatchObject({ nearestBy: 'turbidity', runIds: ['d', 'c'], lPerM2: (600 + 1720) / 2 });
    const latest = capacityFromPastRuns(runs, { style: 'white', cartridgeTypeId: 'membrane-045' }, { maxRuns: 2 });
    expect(latest).toMatchObject({ nearestBy: 'latest', runIds: ['d', 'c'] });
    expect(pastRunsEvidence(latest!)).toBe('2 runs of whites, 600–1,720 L/m²');
  });

  it('needs at least two runs of a similar wine (PAST_RUNS_MIN); one run, another style or another type give nothing', () => {
    expect(PAST_RUNS_MIN).toBe(2);
    expect(capacityFromPastRuns(runs, { style: 'red', cartridgeTypeId: 'membrane-045', cloggingIndexS: 11 })).toBeNull();
    expect(capacityFromPastRuns(runs, { style: 'rosé', cartridgeTypeId: 'membrane-045' })).toBeNull();
    expect(capacityFromPastRuns([], { style: 'white', cartridgeTypeId: 'membrane-045' })).toBeNull();
  });

  it('counts a run once even when the type served two of its stages (their median)', () => {
    const twice = [outcome({ runId: 'x', lPerM2: 1000 }), outcome({ runId: 'x', lPerM2: 1400 }), outcome({ runId: 'y', lPerM2: 1300 })];
    const c = capacityFromPastRuns(twice, { style: 'white', cartridgeTypeId: 'membrane-045' });
    expect(c).toMatchObject({ runs: 2, lowLPerM2: 1200, highLPerM2: 1300, lPerM2: 1250 });
  });

  it('writes the range in the reader’s units', () => {
    const c = capacityFromPastRuns(runs, { style: 'white', cartridgeTypeId: 'membrane-045', cloggingIndexS: 11 }, { maxRuns: 2 })!;
    expect(pastRunsEvidence(c, { number: (v) => (v / 40.746).toFixed(1), unit: 'gal/ft²' })).toBe('2 runs of whites, nearest by clogging index, 33.1–36.8 gal/ft²');
  });
});

describe('sizeTrain — order of the capacity sources: typed, Vmax test, past runs, unknown', () => {

  it('takes the past runs when nothing is typed and no Vmax test applies, and carries the evidence', () => {
    const i = twoStageSizingInput();
    i.stages[0].cartridgeType.pastRuns = { ...pastRunsOfWhites, lPerM2: 4000 };
    i.stages[1].cartridgeType.pastRuns = pastRunsOfWhites;
    const r = sizeTrain(i);
    expect(r.stages[0].capacitySource).toBe('past-runs');
    expect(r.stages[0].capacityLPerM2).toBe(4000);
    expect(r.stages[1].capacitySource).toBe('past-runs');
    expect(r.stages[1].capacityL).toBeCloseTo(1500 * r.stages[1].areaM2, 6);
    expect(r.stages[1].capacityPastRuns).toEqual(pastRunsOfWhites);
  });

  it('a Vmax test wins over the past runs for a membrane; a typed capacity wins over both', () => {
    const i = twoStageSizingInput();
    i.wine.vmaxLPerM2 = 900;
    i.stages[1].cartridgeType.pastRuns = pastRunsOfWhites;
    expect(sizeTrain(i).stages[1].capacitySource).toBe('vmax');
    expect(sizeTrain(i).stages[1].capacityPastRuns).toBeUndefined();
    i.stages[1].cartridgeType.capacityLPerM2 = 2000;
    expect(sizeTrain(i).stages[1]).toMatchObject({ capacitySource: 'stage', capacityLPerM2: 2000 });
  });

  it('without any source the capacity is unknown', () => {
    const r = sizeTrain(twoStageSizingInput());
    expect(r.stages.map((s) => s.capacitySource)).toEqual([null, null]);
  });
});
