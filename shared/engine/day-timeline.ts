/**
 * The timeline of a bottling day: sanitation (hot water or steam) and cool-down, the
 * integrity test before the run, each lot's run and push-out, changeovers between lots,
 * and the integrity test after the run. Pure: the start time is an argument, nothing reads
 * the clock.
 */
import { requireFinite, requireNonNegative, requirePositive } from './errors';

/** How the line and filters are sanitised before the run. */
export type SanitationKind = 'hot-water' | 'steam';

/** Kinds of block on the day's timeline. */
export type DayBlockKind = 'sanitation' | 'integrity-before' | 'run' | 'regeneration' | 'change' | 'push-out' | 'changeover' | 'integrity-after';

/** Durations of the day's steps, minutes. */
export interface DayStepsMin {
  /** Sanitation of line and filters (hot water or steam), min. */
  sanitationMin: number;
  /** Cooling the housings after sanitation, min (shown as a second 'sanitation' block). */
  coolDownMin: number;
  /** Integrity test of the membranes before the run, min. */
  integrityTestMin: number;
  /** Push-out at the end of each lot, min. */
  pushOutMin: number;
  /** Changeover between two lots, min. */
  changeoverMin: number;
  /** Integrity test of the membranes after the run, min. */
  postIntegrityTestMin: number;
  /** Regenerating a stage's set within a lot (backflush or hot water, then a rinse), min. */
  regenerationMin: number;
  /** Changing a stage's set within a lot (drain, swap, flush, and test a membrane), min. */
  changeMin: number;
}

/**
 * Hot-water sanitation time, min (30 min). Hot water at about 85 °C in the filtration
 * direction for about 30 min each bottling morning (Mon-Viti, "Filtration sur cartouches :
 * de multiples avantages", Chambre d'agriculture de la Gironde); 82 °C water for at least
 * 30 min before every bottling day (Z. Ljepović, UC Davis Bottling Line Readiness
 * workshop, 2019).
 */
export const DEFAULT_HOT_WATER_SANITATION_MIN = 30;

/**
 * Steam sanitation time, min (45 min): a mobile bottler's 45-minute steam "bath" before
 * wine (California wine-club blog post "bottling from start to finish"); it covers heat-up
 * and the hold of at least 15 min once the filler spouts reach about 100 °C advised in
 * Process Heating, "Sterilizing bottles with steam".
 */
export const DEFAULT_STEAM_SANITATION_MIN = 45;

/** The steps that take as long after hot water as after steam. */
const STEPS_AFTER_COOL_DOWN = {
  integrityTestMin: 20,
  pushOutMin: 10,
  changeoverMin: 30,
  postIntegrityTestMin: 20,
  regenerationMin: 20,
  changeMin: 30,
} as const;

/**
 * Default step durations by sanitation kind, min. Apart from the sanitation times above,
 * every figure is common practice, no source:
 * cool-down 15 min after hot water (cold water through the housings) and 30 min after steam
 * (the assembly must be back to room temperature before a pressure-based integrity test);
 * integrity test 20 min before and 20 min after the run (wetting check, stabilisation,
 * test); push-out 10 min per lot; changeover 30 min between lots; a regeneration within a
 * lot 20 min (backflush or hot water and a rinse); a change of set within a lot 30 min
 * (drain, swap, flush, and an integrity test of a new membrane set).
 */
export const DEFAULT_DAY_STEPS: Readonly<Record<SanitationKind, Readonly<DayStepsMin>>> = {
  'hot-water': {
    sanitationMin: DEFAULT_HOT_WATER_SANITATION_MIN,
    coolDownMin: 15,
    ...STEPS_AFTER_COOL_DOWN,
  },
  steam: {
    sanitationMin: DEFAULT_STEAM_SANITATION_MIN,
    coolDownMin: 30,
    ...STEPS_AFTER_COOL_DOWN,
  },
};

/** A lot bottled on the day. */
export interface DayLot {
  lotId?: string;
  label: string;
  /** Volume to bottle, L. */
  volumeL: number;
  /** Flow through the train, L/h. */
  flowLh: number;
  /** Regenerations and changes within the lot, each after so many litres of it (see `dayCartridgeNeeds`). */
  stops?: DayLotStop[];
}

/** A regeneration or change of one stage's set within a lot. */
export interface DayLotStop {
  kind: 'regeneration' | 'change';
  /** The stage's name, for the label. */
  stage: string;
  /** Litres of the lot bottled before the stop, 0 ≤ afterL < the lot's volume. */
  afterL: number;
}

/** Input of {@link buildDayTimeline}. */
export interface DayTimelineInput {
  /** Start of sanitation, ms since the Unix epoch. */
  startMs: number;
  /** Lots in bottling order (at least one). */
  lots: DayLot[];
  /** Step durations, min; any missing one takes {@link DEFAULT_DAY_STEPS} for the sanitation kind. */
  steps?: Partial<DayStepsMin>;
  sanitationKind: SanitationKind;
}

/** One block of the day. Blocks follow one another without gaps. */
export interface DayBlock {
  kind: DayBlockKind;
  label: string;
  startMs: number;
  endMs: number;
  /** Index into `lots` for run, push-out and changeover blocks (for a changeover: the lot that follows). */
  lotIndex?: number;
  lotId?: string;
}

/** Totals of the day, min (except the times). */
export interface DayTimelineTotals {
  startMs: number;
  endMs: number;
  totalMin: number;
  /** Sanitation plus cool-down, min. */
  sanitationMin: number;
  /** Integrity tests before and after, min. */
  integrityMin: number;
  runMin: number;
  pushOutMin: number;
  changeoverMin: number;
  /** Regenerations and changes within the lots, min. */
  interventionMin: number;
  /** Everything but the runs, min. */
  nonRunMin: number;
  volumeL: number;
}

/** Result of {@link buildDayTimeline}. */
export interface DayTimeline {
  blocks: DayBlock[];
  totals: DayTimelineTotals;
  /** The step durations used, min (input merged over the defaults). */
  steps: DayStepsMin;
}

const MS_PER_MIN = 60_000;

/**
 * Builds the ordered blocks of a bottling day: sanitation, cool-down, integrity test
 * before, then for each lot its run (volume ÷ flow, cut by each regeneration or change of a
 * stage's set within the lot) and push-out, a changeover between
 * consecutive lots, and the integrity test after the last lot. Steps of zero minutes are
 * left out. Durations are planning figures; see {@link DEFAULT_DAY_STEPS} for their basis.
 *
 * @param input start time (ms), lots (volume L, flow L/h), step durations (min) and sanitation kind
 * @returns blocks in time order, the totals and the step durations used
 * @throws RangeError for a non-finite start, no lots, non-positive volumes or flows, or negative step times
 */
export function buildDayTimeline(input: DayTimelineInput): DayTimeline {
  const { startMs, lots, sanitationKind } = input;
  requireFinite('start time (ms)', startMs);
  if (sanitationKind !== 'hot-water' && sanitationKind !== 'steam') {
    throw new RangeError(`Sanitation kind must be "hot-water" or "steam" (got ${String(sanitationKind)}).`);
  }
  if (!Array.isArray(lots) || lots.length === 0) throw new RangeError('A bottling day needs at least one lot.');
  const d = DEFAULT_DAY_STEPS[sanitationKind];
  const s = input.steps ?? {};
  const steps: DayStepsMin = {
    sanitationMin: s.sanitationMin ?? d.sanitationMin,
    coolDownMin: s.coolDownMin ?? d.coolDownMin,
    integrityTestMin: s.integrityTestMin ?? d.integrityTestMin,
    pushOutMin: s.pushOutMin ?? d.pushOutMin,
    changeoverMin: s.changeoverMin ?? d.changeoverMin,
    postIntegrityTestMin: s.postIntegrityTestMin ?? d.postIntegrityTestMin,
    regenerationMin: s.regenerationMin ?? d.regenerationMin,
    changeMin: s.changeMin ?? d.changeMin,
  };
  requireNonNegative('sanitation time (min)', steps.sanitationMin);
  requireNonNegative('cool-down time (min)', steps.coolDownMin);
  requireNonNegative('integrity test time (min)', steps.integrityTestMin);
  requireNonNegative('push-out time (min)', steps.pushOutMin);
  requireNonNegative('changeover time (min)', steps.changeoverMin);
  requireNonNegative('post-run integrity test time (min)', steps.postIntegrityTestMin);
  requireNonNegative('regeneration time (min)', steps.regenerationMin);
  requireNonNegative('change time (min)', steps.changeMin);
  for (let i = 0; i < lots.length; i++) {
    requirePositive(`volume of lot ${String(i + 1)} (L)`, lots[i].volumeL);
    requirePositive(`flow of lot ${String(i + 1)} (L/h)`, lots[i].flowLh);
    for (const stop of lots[i].stops ?? []) {
      requireNonNegative(`litres before a stop in lot ${String(i + 1)}`, stop.afterL);
      if (stop.afterL >= lots[i].volumeL) throw new RangeError(`A stop in lot ${String(i + 1)} comes after its whole volume (${String(stop.afterL)} L).`);
    }
  }

  const blocks: DayBlock[] = [];
  let t = startMs;
  const add = (kind: DayBlockKind, label: string, minutes: number, lotIndex?: number): void => {
    if (minutes <= 0) return;
    const end = t + minutes * MS_PER_MIN;
    const block: DayBlock = { kind, label, startMs: t, endMs: end };
    if (lotIndex !== undefined) {
      block.lotIndex = lotIndex;
      const id = lots[lotIndex].lotId;
      if (id !== undefined) block.lotId = id;
    }
    blocks.push(block);
    t = end;
  };

  add('sanitation', sanitationKind === 'steam' ? 'Steam sanitation' : 'Hot-water sanitation', steps.sanitationMin);
  add('sanitation', 'Cool-down', steps.coolDownMin);
  add('integrity-before', 'Integrity test before the run', steps.integrityTestMin);
  let runMin = 0;
  let volumeL = 0;
  let interventionMin = 0;
  for (let i = 0; i < lots.length; i++) {
    const lot = lots[i];
    if (i > 0) add('changeover', `Changeover to ${lot.label}`, steps.changeoverMin, i);
    runMin += (lot.volumeL / lot.flowLh) * 60;
    volumeL += lot.volumeL;
    // The run is cut at each stop; stops of several stages at the same litre are one block
    // (a change when any stage is changed), as long as the longest of them.
    const groups = new Map<number, DayLotStop[]>();
    for (const stop of [...(lot.stops ?? [])].sort((a, b) => a.afterL - b.afterL)) {
      const key = [...groups.keys()].find((k) => Math.abs(k - stop.afterL) <= 1e-6 * lot.volumeL) ?? stop.afterL;
      groups.set(key, [...(groups.get(key) ?? []), stop]);
    }
    let doneL = 0;
    for (const [afterL, stops] of groups) {
      add('run', `Run: ${lot.label}`, ((afterL - doneL) / lot.flowLh) * 60, i);
      doneL = afterL;
      const change = stops.some((x) => x.kind === 'change');
      const minutes = change ? Math.max(steps.changeMin, stops.some((x) => x.kind === 'regeneration') ? steps.regenerationMin : 0) : steps.regenerationMin;
      const what = stops.map((x) => `${x.kind === 'change' ? 'change' : 'regeneration'} of ${x.stage}`).join(', ');
      const before = t;
      add(change ? 'change' : 'regeneration', `${lot.label}: ${what[0].toUpperCase()}${what.slice(1)}`, minutes, i);
      interventionMin += (t - before) / MS_PER_MIN;
    }
    add('run', `Run: ${lot.label}`, ((lot.volumeL - doneL) / lot.flowLh) * 60, i);
    add('push-out', `Push-out: ${lot.label}`, steps.pushOutMin, i);
  }
  add('integrity-after', 'Integrity test after the run', steps.postIntegrityTestMin);

  const nLots = lots.length;
  const sanitationMin = steps.sanitationMin + steps.coolDownMin;
  const integrityMin = steps.integrityTestMin + steps.postIntegrityTestMin;
  const pushOutMin = steps.pushOutMin * nLots;
  const changeoverMin = steps.changeoverMin * (nLots - 1);
  const nonRunMin = sanitationMin + integrityMin + pushOutMin + changeoverMin + interventionMin;
  return {
    blocks,
    steps,
    totals: {
      startMs,
      endMs: t,
      totalMin: (t - startMs) / MS_PER_MIN,
      sanitationMin,
      integrityMin,
      runMin,
      pushOutMin,
      changeoverMin,
      interventionMin,
      nonRunMin,
      volumeL,
    },
  };
}
