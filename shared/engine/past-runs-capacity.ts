/**
 * Capacity per m² learned from the winery's own closed runs of similar wines.
 *
 * Two steps, both pure:
 * 1. {@link stageLitresPerM2FromRun}: what one stage of one closed run tells about the litres
 *    per m² a set takes to terminal ΔP — the litres it actually passed when its ΔP reached
 *    terminal (within {@link TERMINAL_REACHED_FRACTION}), otherwise the litres at terminal from
 *    the blocking-law fits of its readings (forecastRunFromReadings; Hermia 1982), and nothing
 *    when neither is known or the fit reaches far past the readings.
 * 2. {@link capacityFromPastRuns}: among those outcomes, the runs of the same style and the
 *    same cartridge type, the nearest by clogging index (else by turbidity, else the latest)
 *    — their median is the capacity, their lowest and highest the range shown as evidence.
 *
 * The choice of the median of the nearest few runs, the 5 % "reached" margin and the minimum of
 * two runs are common practice, no source.
 */
import { requireNonNegative, requirePositive } from './errors';
import { forecastRunFromReadings, type ForecastReading } from './run-forecast';
import type { WineStyle } from './readiness';

/** A stage counts as having reached terminal ΔP when its last ΔP is at least this share of terminal (common practice, no source). */
export const TERMINAL_REACHED_FRACTION = 0.95;
/** Fewest runs of a similar wine before their capacity is used (common practice, no source). */
export const PAST_RUNS_MIN = 2;
/** Most runs taken, the nearest first (common practice, no source). */
export const PAST_RUNS_MAX = 5;

/** What one stage of one closed run tells: the litres per m² a set took to terminal ΔP. */
export type PastStageLearning = {
  /** L/m² to terminal ΔP (median over the stage's sets when it had several). */
  lPerM2: number;
  /** 'reached': ΔP reached terminal and the litres passed are known; 'fit': from the fits of the readings. */
  basis: 'reached' | 'fit';
  /** Sets (segments between changes or regenerations) that gave a figure. */
  sets: number;
};

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = Math.floor(s.length / 2);
  return s.length % 2 === 1 ? s[m] : (s[m - 1] + s[m]) / 2;
}

/**
 * Litres per m² to terminal ΔP that one stage of a closed run reached, set by set (a change or
 * regeneration starts a new set). Per set: when its last ΔP reached terminal (≥ 95 %) the litres
 * at the first such reading; otherwise, when the readings' fits show fouling and do not reach past
 * 3 × the litres seen, the fitted litres at terminal ΔP; otherwise the set says nothing.
 * @param p.points the stage's readings (volumeL since the run's start, ΔP in bar, flow and temperature when logged)
 * @param p.terminalDpBar the cartridge type's terminal ΔP, bar
 * @param p.areaM2 filter area of the stage, m²
 * @param p.restartsAtL run volumes of the stage's changes and regenerations, L
 * @param p.flowLh flow to bring readings to (default the latest reading's, else 1 — only ratios matter)
 * @param p.resolutionBar gauge resolution, bar
 * @returns the learning, or null when no set tells anything
 */
export function stageLitresPerM2FromRun(p: {
  points: ForecastReading[];
  terminalDpBar: number;
  areaM2: number;
  restartsAtL?: number[];
  flowLh?: number;
  resolutionBar?: number;
}): PastStageLearning | null {
  requirePositive('terminal ΔP (bar)', p.terminalDpBar);
  requirePositive('stage area (m²)', p.areaM2);
  const points = p.points.filter((q) => Number.isFinite(q.volumeL) && q.volumeL >= 0 && Number.isFinite(q.dpBar) && q.dpBar > 0);
  if (points.length === 0) return null;
  const restarts = [...new Set((p.restartsAtL ?? []).filter((r) => Number.isFinite(r) && r > 0))].sort((a, b) => a - b);
  const bounds = [0, ...restarts, Infinity];
  const flowLh = p.flowLh ?? [...points].sort((a, b) => b.volumeL - a.volumeL).find((q) => q.flowLh != null && q.flowLh > 0)?.flowLh ?? 1;
  const figures: { l: number; basis: 'reached' | 'fit' }[] = [];
  for (let k = 0; k + 1 < bounds.length; k++) {
    const start = bounds[k];
    const end = bounds[k + 1];
    const seg = points
      .filter((q) => q.volumeL >= start && q.volumeL < end)
      .map((q) => ({ ...q, volumeL: q.volumeL - start }))
      .sort((a, b) => a.volumeL - b.volumeL);
    if (seg.length === 0) continue;
    const atTerminal = seg.find((q) => q.dpBar >= TERMINAL_REACHED_FRACTION * p.terminalDpBar);
    if (atTerminal && atTerminal.volumeL > 0) {
      figures.push({ l: atTerminal.volumeL, basis: 'reached' });
      continue;
    }
    try {
      const { forecast } = forecastRunFromReadings({ points: seg, terminalDpBar: p.terminalDpBar, flowLh, resolutionBar: p.resolutionBar });
      if (!forecast.beyondReadings && forecast.basis === 'readings' && Number.isFinite(forecast.volumeAtTerminalL) && forecast.volumeAtTerminalL > 0) {
        figures.push({ l: forecast.volumeAtTerminalL, basis: 'fit' });
      }
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
    }
  }
  if (figures.length === 0) return null;
  return {
    lPerM2: median(figures.map((f) => f.l)) / p.areaM2,
    basis: figures.every((f) => f.basis === 'reached') ? 'reached' : 'fit',
    sets: figures.length,
  };
}

/** One closed run's stage outcome, as the capacity choice reads it. */
export type PastRunStageOutcome = {
  runId: string;
  /** Style of the run's lot. */
  style: WineStyle;
  cartridgeTypeId: string;
  /** Clogging index of the run's lot before the run, s, or null. */
  cloggingIndexS: number | null;
  /** Turbidity of the run's lot before the run, NTU, or null. */
  turbidityNtu: number | null;
  /** When the run closed (ISO); the latest come first when no lab figure is comparable. */
  closedAt: string;
  /** L/m² to terminal ΔP the stage reached or was fitted to reach. */
  lPerM2: number;
  basis: 'reached' | 'fit';
};

/** The capacity the past runs give one stage, with its evidence in words. */
export type PastRunsCapacity = {
  /** Median L/m² of the runs taken. */
  lPerM2: number;
  lowLPerM2: number;
  highLPerM2: number;
  /** Runs taken. */
  runs: number;
  style: WineStyle;
  /** How the runs were picked: nearest clogging index, nearest turbidity, or the latest. */
  nearestBy: 'clogging-index' | 'turbidity' | 'latest';
  /** Ids of the runs taken, nearest first. */
  runIds: string[];
};

const STYLE_PLURAL: Record<WineStyle, string> = { white: 'whites', 'rosé': 'rosés', red: 'reds', sweet: 'sweet wines', sparkling: 'sparkling wines' };

/**
 * "4 runs of whites, 1,350–1,720 L/m²" — the evidence line of a past-runs capacity. `opts.number`
 * writes a L/m² figure as a number in the reader's units (default: whole L/m² with thousands
 * separators) and `opts.unit` names that unit (default "L/m²").
 */
export function pastRunsEvidence(c: PastRunsCapacity, opts: { number?: (lPerM2: number) => string; unit?: string } = {}): string {
  const num = opts.number ?? ((v: number) => Math.round(v).toLocaleString('en-US'));
  const unit = opts.unit ?? 'L/m²';
  const low = num(c.lowLPerM2);
  const high = num(c.highLPerM2);
  const range = low === high ? `${low} ${unit}` : `${low}–${high} ${unit}`;
  const by = c.nearestBy === 'clogging-index' ? ', nearest by clogging index' : c.nearestBy === 'turbidity' ? ', nearest by turbidity' : '';
  return `${String(c.runs)} run${c.runs === 1 ? '' : 's'} of ${STYLE_PLURAL[c.style]}${by}, ${range}`;
}

/**
 * The capacity per m² a stage takes from the winery's closed runs of similar wines: runs of the
 * same style through the same cartridge type; when the lot has a clogging index, the runs whose
 * lots had one are ranked by its distance, else by turbidity, else the latest first; the nearest
 * `maxRuns` are taken and their median is the capacity. Fewer than `minRuns` → null (the
 * type's nominal or unknown follows). Common practice, no source.
 * @param outcomes the winery's closed-run stage outcomes (any style and type)
 * @param lot the lot being planned: style, cartridge type of the stage, clogging index (s) and turbidity (NTU) when known
 * @param opts.minRuns fewest runs (default {@link PAST_RUNS_MIN}); opts.maxRuns most runs (default {@link PAST_RUNS_MAX})
 */
export function capacityFromPastRuns(
  outcomes: readonly PastRunStageOutcome[],
  lot: { style: WineStyle; cartridgeTypeId: string; cloggingIndexS?: number | null; turbidityNtu?: number | null },
  opts: { minRuns?: number; maxRuns?: number } = {},
): PastRunsCapacity | null {
  const minRuns = opts.minRuns ?? PAST_RUNS_MIN;
  const maxRuns = opts.maxRuns ?? PAST_RUNS_MAX;
  requirePositive('fewest runs', minRuns);
  requirePositive('most runs', maxRuns);
  requireNonNegative('most runs less fewest', maxRuns - minRuns);
  // One figure per run (a run with the stage's type twice counts once, at its median).
  const byRun = new Map<string, PastRunStageOutcome[]>();
  for (const o of outcomes) {
    if (o.style !== lot.style || o.cartridgeTypeId !== lot.cartridgeTypeId) continue;
    if (!Number.isFinite(o.lPerM2) || o.lPerM2 <= 0) continue;
    byRun.set(o.runId, [...(byRun.get(o.runId) ?? []), o]);
  }
  const runs = [...byRun.values()].map((os) => ({ ...os[0], lPerM2: median(os.map((o) => o.lPerM2)) }));
  if (runs.length < minRuns) return null;
  const latestFirst = (a: PastRunStageOutcome, b: PastRunStageOutcome) => (a.closedAt < b.closedAt ? 1 : a.closedAt > b.closedAt ? -1 : a.runId.localeCompare(b.runId));
  const ci = lot.cloggingIndexS ?? null;
  const ntu = lot.turbidityNtu ?? null;
  const withCi = ci !== null && Number.isFinite(ci) ? runs.filter((r) => r.cloggingIndexS !== null && Number.isFinite(r.cloggingIndexS)) : [];
  const withNtu = ntu !== null && Number.isFinite(ntu) ? runs.filter((r) => r.turbidityNtu !== null && Number.isFinite(r.turbidityNtu)) : [];
  let nearestBy: PastRunsCapacity['nearestBy'];
  let ranked: PastRunStageOutcome[];
  const by = (f: (r: PastRunStageOutcome) => number) => (a: PastRunStageOutcome, b: PastRunStageOutcome) => f(a) - f(b) || latestFirst(a, b);
  if (withCi.length >= minRuns) {
    nearestBy = 'clogging-index';
    ranked = withCi.sort(by((r) => Math.abs(r.cloggingIndexS! - ci!)));
  } else if (withNtu.length >= minRuns) {
    nearestBy = 'turbidity';
    ranked = withNtu.sort(by((r) => Math.abs(r.turbidityNtu! - ntu!)));
  } else {
    nearestBy = 'latest';
    ranked = runs.sort(latestFirst);
  }
  const taken = ranked.slice(0, maxRuns);
  const values = taken.map((r) => r.lPerM2);
  return {
    lPerM2: median(values),
    lowLPerM2: Math.min(...values),
    highLPerM2: Math.max(...values),
    runs: taken.length,
    style: lot.style,
    nearestBy,
    runIds: taken.map((r) => r.runId),
  };
}
