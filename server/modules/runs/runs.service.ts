import { chartPointsPerStage, thinSeries } from '../../../shared/chart/thin';
import {
  detectFlatDp,
  fitConstantFlow,
  foulingCheck,
  forecastRunFromReadings,
  requiredFlowLh,
  runAlarm,
  volumeAtDp,
  type ConstantFlowFit,
} from '../../../shared/engine';
import type {
  CloseRunInput,
  CorrectReadingInput,
  LogReadingInput,
  LogReadingsBatchInput,
  RunBlockReason,
  RunChangeInput,
  RunReadingsQuery,
  StartRunInput,
  VoidReadingInput,
} from '../../../shared/schemas/runs';
import type {
  LoggedReadingDto,
  ReadingsBatchResultDto,
  RunDetailDto,
  RunReadingDto,
  RunStageDto,
  RunStageFinalDto,
  RunStartCheckDto,
  RunStartOptionDto,
  RunSummaryDto,
} from '../../../shared/types/runs';
import type { ListDto } from '../../../shared/types/api';
import type { Database, DbOrTx } from '../../db/client';
import type { PlanTrainStage } from '../../db/schema';
import { badRequest, conflict, forbidden, HttpError, notFound } from '../../lib/errors';
import type { TenantContext } from '../../middleware/authorize';
import { cartridgeMovesIn } from '../cartridges/cartridges.service';
import { cyclesOf, isOverridable, litresText, startChecks } from './runs.checks';
import { effectiveReadings, presentChange, presentReading, presentRunSummary, presentStageCartridge, type EffectiveReading } from './runs.presenter';
import { createRunsRepository, type CorrectionInsert, type NewReading, type NewReadingRow, type RunReadingRow, type RunsRepository, type RunStageCartridgeRow } from './runs.repository';
import { auditSnapshot, recordChange } from '../audit/audit.service';
import { gaugeResolutionFor } from '../winery-settings/winery-settings.service';
import { reallocateClosedRun, runEndLitres, stintLitres } from './runs.reallocate';
import { readinessAtStart } from '../records/readiness-at-start';
import { createKeyedQueue } from '../../lib/keyed-queue';

/** Roles that may start a run despite overridable start checks, with a written reason. */
const OVERRIDE_ROLES = ['owner', 'cellar-master'] as const;
const CYCLE_COUNTERS = { steam: 'steamCycles', 'hot-water': 'hotWaterCycles', chemical: 'chemicalCycles', backflush: null } as const;

const runBlocked = (reasons: RunBlockReason[], message: string) => new HttpError(409, 'run_blocked', message, undefined, { reasons });

export const RUN_LIST_LIMIT = 100;
/** Readings a stage needs before its ΔP curve is fitted. */
export const MIN_READINGS_FOR_FIT = 3;
const CURVE_POINTS = 40;

/** Points of the fitted curve from clean ΔP to terminal, by inverting the fit with the engine (the run page's chart; the closed run's record freezes it). */
export function fittedCurve(fit: ConstantFlowFit, terminalDpBar: number, maxVolumeL: number) {
  const top = Math.max(terminalDpBar, fit.dp0Bar);
  const out: { volumeL: number; dpBar: number }[] = [];
  for (let i = 0; i <= CURVE_POINTS; i++) {
    const dp = fit.dp0Bar + ((top - fit.dp0Bar) * i) / CURVE_POINTS;
    if (dp <= 0) continue;
    try {
      const v = volumeAtDp(fit, dp);
      if (Number.isFinite(v)) out.push({ volumeL: v, dpBar: dp });
    } catch {
      break;
    }
    if (out.length > 0 && out[out.length - 1].volumeL > Math.max(maxVolumeL * 20, 1)) break;
  }
  return out;
}

/** A stage's fit, curve, forecast and alarm; a terminal ΔP not above zero (the stage's cartridge type is gone from the catalogue) gives none, with a note. */
export function stageFigures(p: {
  readings: EffectiveReading[];
  /** The stage's cartridge type's terminal ΔP, bar; 0 when the type is no longer in the catalogue. */
  terminalDpBar: number;
  lineFlowLh: number | null;
  currentVolumeL: number;
  volumeToBottleL: number;
  restartsAtL?: number[];
  /** The winery's gauge resolution, bar: a smaller ΔP rise is not fouling. */
  resolutionBar?: number;
}): Pick<RunStageDto, 'fit' | 'curve' | 'forecast' | 'alarm' | 'flowLh' | 'note' | 'flatWarning'> {
  if (!(p.terminalDpBar > 0)) return { fit: null, curve: [], forecast: null, alarm: null, flowLh: null, flatWarning: null, note: 'This stage’s cartridge type is no longer in the catalogue.' };
  let latestFlow: number | null = null;
  for (let i = p.readings.length - 1; i >= 0; i--) {
    const f = p.readings[i].flowLh;
    if (f !== null && f > 0) {
      latestFlow = f;
      break;
    }
  }
  const flowLh = latestFlow ?? p.lineFlowLh;
  const dpPoints = p.readings.map((r) => ({ volumeL: r.volumeL, dpBar: r.upstreamBar - r.downstreamBar }));
  const lastRestartL = Math.max(0, ...(p.restartsAtL ?? []));
  const flat = detectFlatDp(
    dpPoints.filter((q) => q.volumeL >= lastRestartL),
    { resolutionBar: p.resolutionBar },
  );
  const flatWarning = flat.flat ? flat.reason : null;
  const none = { fit: null, curve: [], forecast: null, alarm: null, flowLh, flatWarning };
  if (p.readings.length < MIN_READINGS_FOR_FIT) {
    const more = MIN_READINGS_FOR_FIT - p.readings.length;
    return { ...none, note: `Log ${String(more)} more reading${more === 1 ? '' : 's'} on this stage for a fit and a forecast (at least ${String(MIN_READINGS_FOR_FIT)}).` };
  }
  const points = p.readings.map((r) => ({ volumeL: r.volumeL, dpBar: r.upstreamBar - r.downstreamBar, flowLh: r.flowLh, tempC: r.tempC }));
  const maxV = Math.max(...points.map((q) => q.volumeL));
  if (flowLh === null) {
    let best: ConstantFlowFit | null = null;
    try {
      best = fitConstantFlow(dpPoints).find((f) => foulingCheck(f, { resolutionBar: p.resolutionBar }).fouling) ?? null;
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
    }
    return {
      ...none,
      fit: best,
      curve: best ? fittedCurve(best, p.terminalDpBar, maxV) : [],
      note: best ? 'Log the flow with a reading (or give the plan a line) to forecast the time left.' : 'ΔP is not rising on these readings yet, so no forecast can be made.',
    };
  }
  try {
    const { forecast, fits } = forecastRunFromReadings({
      points,
      terminalDpBar: p.terminalDpBar,
      flowLh,
      currentVolumeL: Math.max(p.currentVolumeL, maxV),
      restartsAtL: p.restartsAtL,
      resolutionBar: p.resolutionBar,
    });
    const fit = forecast.segmentStartL === 0 ? (fits.find((f) => f.law === forecast.law && f.valid && f.kPerL > 0) ?? null) : null;
    return {
      fit,
      curve: fit ? fittedCurve(fit, p.terminalDpBar, maxV) : [],
      forecast,
      alarm: runAlarm({ forecast, volumeToBottleL: p.volumeToBottleL }),
      flowLh,
      note: null,
      flatWarning,
    };
  } catch (e) {
    if (e instanceof RangeError) return { ...none, note: e.message };
    throw e;
  }
}

/**
 * A closed run's stage as it ended: litres through it and its last set, the changes and
 * regenerations, the last and highest ΔP of the last set, and whether it reached terminal ΔP.
 */
function finalFigures(p: { readings: EffectiveReading[]; changes: { kind: 'change' | 'regeneration'; atVolumeL: number }[]; volumeL: number; terminalDpBar: number }): RunStageFinalDto {
  const restartL = Math.max(0, ...p.changes.map((c) => c.atVolumeL));
  const dp = (r: EffectiveReading) => r.upstreamBar - r.downstreamBar;
  const lastSet = p.readings.filter((r) => r.volumeL >= restartL);
  const last = p.readings.at(-1);
  const maxDpBar = lastSet.length > 0 ? Math.max(...lastSet.map(dp)) : null;
  return {
    litresL: p.volumeL,
    litresLastSetL: Math.max(0, p.volumeL - restartL),
    changes: p.changes.filter((c) => c.kind === 'change').length,
    regenerations: p.changes.filter((c) => c.kind === 'regeneration').length,
    lastDpBar: last ? dp(last) : null,
    maxDpBar,
    terminalReached: maxDpBar !== null && p.terminalDpBar > 0 && maxDpBar >= p.terminalDpBar,
  };
}

/** A fit as the run page gets it: its per-reading residuals stay on the server (one per reading). */
function withoutResiduals(fit: Omit<ConstantFlowFit, 'residuals'> | null): Omit<ConstantFlowFit, 'residuals'> | null {
  if (!fit) return null;
  const { residuals: _residuals, ...rest } = fit as ConstantFlowFit;
  return rest;
}

/** Why a closed run's stage has no fitted curve, in words of the past; null when it has one. */
function closedNote(f: { fit: unknown; forecast: unknown; note: string | null }): string | null {
  if (f.fit !== null) return null;
  if (f.forecast !== null) return 'No curve drawn: the stage was fitted on its last set only, after a change or regeneration.';
  if (f.note?.startsWith('Log ')) return `No fitted curve: fewer than ${String(MIN_READINGS_FOR_FIT)} readings on the stage's last set.`;
  return f.note;
}

/**
 * Part of every stored run figures entry's key (run page and Today): raise it when a change of
 * code changes what `stagePageFigures` or `todayFigures` answer for the same rows (the engine's
 * fits and forecast, the chart's thinning, the presenters, the DTO's fields), so entries stored
 * by the code before are worked out again instead of being served.
 */
export const RUN_FIGURES_REVISION = 1;

/**
 * Everything a stage's figures on the run page are worked out from besides the run's readings,
 * corrections and changes: small, read on every request, and kept as the stored entry's key (an
 * entry worked out with other inputs is not used). `stagePageFigures` reads nothing else.
 */
export type PageFigureInputs = {
  revision: typeof RUN_FIGURES_REVISION;
  status: 'running' | 'closed';
  /** Per stage of the train (its length is the stage count, which sets the chart's points). */
  terminalDpBars: number[];
  lineFlowLh: number | null;
  currentVolumeL: number;
  volumeToBottleL: number;
  resolutionBar: number;
};

/** The part of a run page's stage worked out from its readings (what `run_figures.page` keeps per stage). */
export type StagePageFigures = Pick<RunStageDto, 'readings' | 'readingCount' | 'fit' | 'curve' | 'forecast' | 'alarm' | 'flowLh' | 'note' | 'flatWarning' | 'final'>;

/** A stage's chart readings, fit, curve, forecast, alarm and (closed) final figures, from all its readings (every stage's, corrections applied). */
export function stagePageFigures(
  inputs: PageFigureInputs,
  index: number,
  readings: EffectiveReading[],
  changes: { stageIndex: number; kind: 'change' | 'regeneration'; atVolumeL: number }[],
): StagePageFigures {
  const own = readings.filter((r) => r.stageIndex === index);
  const counted = own.filter((r) => !r.voided);
  const terminalDpBar = inputs.terminalDpBars[index] ?? 0;
  const stageChanges = changes.filter((c) => c.stageIndex === index);
  const figures = stageFigures({
    readings: counted,
    terminalDpBar,
    lineFlowLh: inputs.lineFlowLh,
    currentVolumeL: inputs.currentVolumeL,
    volumeToBottleL: inputs.volumeToBottleL,
    // A change or regeneration restores the stage: the forecast starts again from there.
    restartsAtL: stageChanges.map((c) => c.atVolumeL),
    resolutionBar: inputs.resolutionBar,
  });
  // A closed run is a record: its final figures, never a forecast or an alarm.
  const final = inputs.status === 'closed' ? finalFigures({ readings: counted, changes: stageChanges, volumeL: inputs.currentVolumeL, terminalDpBar }) : null;
  return {
    // The chart's points only; everything below was computed from all the stage's readings.
    readings: thinSeries(own, { max: chartPointsPerStage(inputs.terminalDpBars.length), y: (r) => r.upstreamBar - r.downstreamBar, keep: (r) => r.corrections.length > 0 }).map(presentReading),
    readingCount: own.length,
    ...figures,
    fit: withoutResiduals(figures.fit),
    // Closed: the fitted curve stays only over the litres the run filtered (no extrapolation).
    ...(final ? { forecast: null, alarm: null, note: closedNote(figures), curve: figures.curve.filter((q) => q.volumeL <= inputs.currentVolumeL) } : {}),
    final,
  };
}

/** What is in the stages' housings and why a run could not start on it. */
async function inspect(r: RunsRepository, wineryId: string, stages: PlanTrainStage[], opts: { lock?: boolean } = {}) {
  const housingIds = [...new Set(stages.map((s) => s.housingId))];
  const housings = opts.lock ? await r.lockHousings(wineryId, housingIds) : await r.housingRows(wineryId, housingIds);
  const installed = await r.cartridgesIn(wineryId, housingIds);
  const events = await r.eventsOf(wineryId, installed.map((i) => i.cartridge.id));
  const planned = await r.types(wineryId, [...new Set(stages.map((s) => s.cartridgeTypeId))]);
  const plannedTypeNames = new Map(planned.map((p) => [p.id, p.name]));
  const reasons = startChecks({ stages, housings, installed, events, plannedTypeNames, now: new Date() });
  return {
    reasons,
    housings,
    installed,
    stages: stages.map((s, index) => {
      const h = housings.find((x) => x.id === s.housingId);
      return {
        index,
        name: s.name ?? `Stage ${String(index + 1)}`,
        housingId: s.housingId,
        housingName: h?.name ?? 'Unknown housing',
        rounds: h?.rounds ?? 0,
        housingCount: s.housingCount,
        plannedTypeId: s.cartridgeTypeId,
        plannedTypeName: plannedTypeNames.get(s.cartridgeTypeId) ?? 'Unknown type',
        installed: installed
          .filter((i) => i.cartridge.housingId === s.housingId && i.cartridge.status === 'installed')
          .map((i) => ({ id: i.cartridge.id, serial: i.cartridge.serial, typeId: i.type.id, typeName: i.type.name })),
      };
    }),
  };
}

function toNew(input: LogReadingInput): NewReading {
  return {
    stageIndex: input.stageIndex,
    volumeL: input.volumeL,
    upstreamBar: input.upstreamBar,
    downstreamBar: input.downstreamBar,
    flowLh: input.flowLh ?? null,
    tempC: input.tempC ?? null,
    at: input.at ? new Date(input.at) : null,
    clientKey: input.clientKey,
  };
}

/** Rows one INSERT … ON CONFLICT DO NOTHING carries (a logger file goes in as several). */
export const READINGS_INSERT_CHUNK = 5000;

/**
 * Stores checked readings of a run in bulk, inside the caller's transaction (which holds the
 * run row share-locked): chunked multi-row inserts on conflict (run, clientKey) do nothing.
 * The one path for many new readings (the phone's batches and logger files), so anything kept
 * per run about its readings is updated here. Returns how many were stored.
 */
export async function storeReadings(tx: DbOrTx, values: NewReadingRow[]): Promise<number> {
  const r = createRunsRepository(tx);
  let stored = 0;
  for (let i = 0; i < values.length; i += READINGS_INSERT_CHUNK) stored += await r.insertReadings(values.slice(i, i + READINGS_INSERT_CHUNK));
  return stored;
}

/** True when the run is the winery's: a plain lookup, no lock and no look at its readings. */
export async function runIsWinerys(db: DbOrTx, wineryId: string, runId: string): Promise<boolean> {
  return (await createRunsRepository(db).run(wineryId, runId)) !== null;
}

/**
 * What a bulk write needs to know of a run (status, stage count), read in the caller's
 * transaction with the run row share-locked until commit; null when the run is not the winery's.
 */
export function runForBulkReadings(tx: DbOrTx, wineryId: string, runId: string) {
  return createRunsRepository(tx).batchContext(wineryId, runId, []);
}

/**
 * Single readings of one run waiting together go into one statement, at most this many (the
 * rest take the next turn).
 */
export const READINGS_PER_TURN = 16;
/**
 * While readings of one run keep waiting, its turns start at least this far apart: one run then
 * takes at most 800 single readings a second in this process (16 every 20 ms), whatever the
 * number of clients, and the rest of the process keeps its latency (measured in the bench: with
 * 100 clients on one run, the health check at 1.5× its idle time, against 7× with turns back to
 * back). A reading that arrives when none is waiting is written at once.
 */
export const READING_TURN_GAP_MS = 20;

/** Runs: one planned lot filtered through its chosen train, followed by pressure readings per stage. */
export function createRunsService(db: Database) {
  const repo = createRunsRepository(db);
  /**
   * Readings of one run are written one statement after the other in this process (see
   * keyed-queue), so they wait in memory, not on a pooled connection. The single readings that
   * arrive while a statement runs go together in the next one: one commit for all of them
   * (PostgreSQL's own group commit cannot help writers that take turns on the run's row).
   */
  const readingTurns = createKeyedQueue();
  type WaitingReading = { userId: string; reading: NewReading; resolve: (row: RunReadingRow | null) => void; reject: (error: unknown) => void };
  const waitingReadings = new Map<string, WaitingReading[]>();
  const turnKey = (wineryId: string, runId: string) => `${wineryId}:${runId}`;

  /** Stores one reading in the run's next turn, with the others waiting then; null when it was not stored (resent key, or a check failed). */
  function storeReadingInTurn(wineryId: string, runId: string, userId: string, reading: NewReading): Promise<RunReadingRow | null> {
    return new Promise((resolve, reject) => {
      const key = turnKey(wineryId, runId);
      const waiting = waitingReadings.get(key);
      const item = { userId, reading, resolve, reject };
      // A list in the map always has a turn queued that will take it.
      if (waiting) {
        waiting.push(item);
        return;
      }
      waitingReadings.set(key, [item]);
      void readingTurns.run(key, () => storeWaiting(wineryId, runId));
    });
  }

  async function storeWaiting(wineryId: string, runId: string) {
    const key = turnKey(wineryId, runId);
    const waiting = waitingReadings.get(key) ?? [];
    const items = waiting.splice(0, READINGS_PER_TURN);
    if (waiting.length === 0) waitingReadings.delete(key);
    else void readingTurns.run(key, () => storeWaiting(wineryId, runId));
    const started = performance.now();
    const settle = (group: WaitingReading[], rows: RunReadingRow[]) => {
      const byKey = new Map(rows.map((r) => [r.clientKey, r]));
      for (const x of group) x.resolve(byKey.get(x.reading.clientKey) ?? null);
    };
    try {
      settle(items, await repo.insertReadingsIfOpen(wineryId, runId, items));
    } catch (error) {
      if (items.length === 1) items[0].reject(error);
      else {
        // One reading's failure is its own: store them one by one, so only that one fails.
        for (const x of items) {
          try {
            settle([x], await repo.insertReadingsIfOpen(wineryId, runId, [x]));
          } catch (own) {
            x.reject(own);
          }
        }
      }
    }
    // More readings are waiting: the next turn keeps its distance (the answers above are already sent).
    const rest = READING_TURN_GAP_MS - (performance.now() - started);
    if (waitingReadings.has(key) && rest > 0) await new Promise((r) => setTimeout(r, rest));
  }

  /**
   * The run's summary, plan context and the figures of its stages (all, or just one). The
   * stages' figures worked out from the readings come from the stored entry (`run_figures.page`)
   * when its version and its key (the small inputs, read here on every request) are still the
   * run's; otherwise they are worked out from every reading as before and, for the whole run,
   * stored (only if the version has not moved since it was read).
   */
  async function build(wineryId: string, id: string, onlyStage?: number) {
    // First: the version is read before anything the figures are worked out from.
    const found = await repo.summaryWithPlanLot(wineryId, id);
    if (!found) throw notFound('Run');
    const { summary, ctx, stored } = found;
    const all = ctx.train?.stages ?? [];
    const wanted = onlyStage === undefined ? all.map((_s, index) => index) : [onlyStage].filter((i) => i < all.length);
    const stages = wanted.map((index) => ({ index, s: all[index] }));
    const whole = onlyStage === undefined;
    // Read the readings alongside the rest when nothing stored can be used anyway.
    const readingsNow = !whole || stored.page === null;
    const [types, housings, stints, changes, resolutionBar, data] = await Promise.all([
      repo.types(wineryId, [...new Set(all.map((s) => s.cartridgeTypeId))]),
      repo.housings(wineryId, [...new Set(stages.map(({ s }) => s.housingId))]),
      repo.stageCartridges(wineryId, id),
      repo.changes(wineryId, id),
      gaugeResolutionFor(db, wineryId),
      readingsNow ? readingData(wineryId, id, onlyStage) : null,
    ]);
    const serialOf = new Map(stints.map((c) => [c.cartridgeId, c.serial]));
    const lineFlowLh = ctx.line ? requiredFlowLh({ bottlesPerHour: ctx.line.bottlesPerHour, bottleMl: ctx.line.bottleMl }) : null;
    const volumeToBottleL = Math.max(0, summary.volumeL - summary.currentVolumeL);
    const inputs: PageFigureInputs = {
      revision: RUN_FIGURES_REVISION,
      status: summary.run.status,
      terminalDpBars: all.map((s) => types.find((t) => t.id === s.cartridgeTypeId)?.terminalDpBar ?? 0),
      lineFlowLh,
      currentVolumeL: summary.currentVolumeL,
      volumeToBottleL,
      resolutionBar,
    };
    const key = JSON.stringify(inputs);
    let computed: StagePageFigures[];
    if (whole && stored.page !== null && stored.pageKey === key) {
      computed = stored.page as StagePageFigures[];
    } else {
      const { raw, corrections } = data ?? (await readingData(wineryId, id));
      const readings = effectiveReadings(raw, corrections);
      computed = stages.map(({ index }) => stagePageFigures(inputs, index, readings, changes));
      if (whole) await repo.storePageFigures(id, stored.version, key, JSON.stringify(computed));
    }
    const stageDtos: RunStageDto[] = stages.map(({ s, index }, i) => {
      const type = types.find((t) => t.id === s.cartridgeTypeId);
      const housing = housings.find((h) => h.id === s.housingId);
      return {
        index,
        name: s.name ?? `Stage ${String(index + 1)}`,
        cartridgeTypeId: s.cartridgeTypeId,
        cartridgeTypeName: type?.name ?? 'Unknown type',
        housingId: s.housingId,
        housingName: housing?.name ?? 'Unknown housing',
        terminalDpBar: inputs.terminalDpBars[index],
        ...computed[i],
        cartridges: stints.filter((c) => c.stageIndex === index).map(presentStageCartridge),
      };
    });
    return { summary, ctx, lineFlowLh, volumeToBottleL, stages: stageDtos, changes, serialOf };
  }

  async function readingData(wineryId: string, id: string, onlyStage?: number) {
    const [raw, corrections] = await Promise.all([repo.readingsForFigures(wineryId, id, onlyStage), repo.corrections(wineryId, id)]);
    return { raw, corrections };
  }

  /**
   * A correction or void of one reading, kept beside the original: in one transaction the run is
   * locked, the reading found (404s), the correction row written with who, the run's counters
   * recounted, the change logged and, for a closed run, the cartridges' litres re-allocated.
   */
  async function amendReading(
    t: TenantContext,
    runId: string,
    readingId: string,
    amendment: { kind: 'correct' | 'void'; reason: string; values: Partial<Pick<CorrectionInsert, 'volumeL' | 'upstreamBar' | 'downstreamBar' | 'flowLh' | 'tempC'>> },
  ): Promise<RunDetailDto> {
    await db.transaction(async (tx) => {
      const r = createRunsRepository(tx);
      const run = await r.lockRun(t.wineryId, runId);
      if (!run) throw notFound('Run');
      const reading = await r.reading(t.wineryId, runId, readingId);
      if (!reading) throw notFound('Reading');
      await r.insertCorrection({ wineryId: t.wineryId, runId, readingId, kind: amendment.kind, ...amendment.values, reason: amendment.reason, createdBy: t.userId, createdByName: t.userName ?? null });
      await r.recountRun(t.wineryId, runId);
      await recordChange(tx, t, { action: amendment.kind, kind: 'run', id: runId });
      await reallocateClosedRun(tx, t, run, { readingId, kind: amendment.kind, reason: amendment.reason });
    });
    return detail(t.wineryId, runId);
  }

  async function detail(wineryId: string, id: string): Promise<RunDetailDto> {
    const { summary, ctx, lineFlowLh, volumeToBottleL, stages, changes, serialOf } = await build(wineryId, id);
    const base = presentRunSummary(summary);
    return {
      ...base,
      notes: summary.run.notes,
      trainName: ctx.train?.name ?? '',
      lineName: ctx.line?.name ?? null,
      requiredFlowLh: lineFlowLh,
      volumeToBottleL,
      startedByName: summary.run.startedByName,
      closedByName: summary.run.closedByName,
      override: summary.run.overrideReason
        ? { reason: summary.run.overrideReason, byName: summary.run.overrideByName, checks: summary.run.overriddenChecks ?? [] }
        : null,
      changes: changes.map((c) => presentChange(c, serialOf)),
      stages,
    };
  }

  /** Why a reading was not stored (the single statement stores only when every check passes). */
  async function refusal(wineryId: string, runId: string, input: { stageIndex: number; volumeL: number }): Promise<HttpError> {
    const run = await repo.run(wineryId, runId);
    if (!run) return notFound('Run');
    if (run.status !== 'running') return conflict('This run is closed; it takes no more readings.', 'run_closed');
    const ctx = await repo.planLot(wineryId, run.planLotId);
    const stageCount = ctx?.train?.stages.length ?? 0;
    if (input.stageIndex >= stageCount) return badRequest('Check the reading.', { stageIndex: 'Choose a stage of this run’s train.' });
    const last = await repo.lastReading(wineryId, runId, input.stageIndex);
    if (last && input.volumeL < last.volumeL) {
      return badRequest('Check the reading.', { volumeL: `Litres cannot go down: the last reading of this stage was ${String(last.volumeL)} L.` });
    }
    return conflict('The reading could not be stored; send it again.');
  }

  /**
   * A run's stored readings, newest first (time, then litres), with their corrections applied and
   * listed; one stage or all. For the run page's tables, which page rather than load thousands.
   */
  async function readingsPage(wineryId: string, runId: string, q: RunReadingsQuery): Promise<ListDto<RunReadingDto>> {
    const run = await repo.run(wineryId, runId);
    if (!run) throw notFound('Run');
    const [raw, corrections] = await Promise.all([repo.readings(wineryId, runId, q.stage), repo.corrections(wineryId, runId)]);
    const all = effectiveReadings(raw, corrections).sort((a, b) => b.at.getTime() - a.at.getTime() || b.volumeL - a.volumeL || b.stageIndex - a.stageIndex);
    const from = (q.page - 1) * q.pageSize;
    return { items: all.slice(from, from + q.pageSize).map(presentReading), total: all.length };
  }

  return {
    detail: (t: TenantContext, id: string) => detail(t.wineryId, id),
    readings: (t: TenantContext, id: string, q: RunReadingsQuery) => readingsPage(t.wineryId, id, q),

    async list(t: TenantContext): Promise<{ items: RunSummaryDto[]; total: number }> {
      const rows = await repo.list(t.wineryId, RUN_LIST_LIMIT);
      return { items: rows.map(presentRunSummary), total: rows.length };
    },

    async startOptions(t: TenantContext): Promise<{ items: RunStartOptionDto[] }> {
      const rows = await repo.startOptions(t.wineryId);
      return { items: rows.map((r) => ({ ...r, trainName: r.trainName })) };
    },

    /** What is physically in the chosen train's housings against the plan, and why a start would be refused. */
    async startCheck(t: TenantContext, planLotId: string): Promise<RunStartCheckDto> {
      const ctx = await repo.planLot(t.wineryId, planLotId);
      if (!ctx) throw notFound('Lot of a plan');
      const { reasons, stages } = await inspect(repo, t.wineryId, ctx.train?.stages ?? []);
      return { planLotId, stages, reasons: reasons.map((r) => ({ ...r, overridable: isOverridable(r.code) })) };
    },

    /**
     * Starts a run, snapshotting every cartridge in each stage's housing. Refused (409
     * run_blocked, one reason per problem) when the housings do not hold what the plan asks
     * for; a cellar master or owner may start anyway with a written reason for a type
     * mismatch, a partial fill or a spent cartridge, never for a failed integrity test.
     */
    async start(t: TenantContext, input: StartRunInput): Promise<RunDetailDto> {
      const id = await db.transaction(async (tx) => {
        const r = createRunsRepository(tx);
        const ctx = await r.planLot(t.wineryId, input.planLotId);
        if (!ctx) throw notFound('Lot of a plan');
        if (ctx.plan.status !== 'approved') throw conflict('Only a lot of an approved plan can be run. Approve the plan first.');
        if (!ctx.train || ctx.train.stages.length === 0) throw conflict('Choose a train for this lot in its plan before starting a run.');
        await r.lockPlanLot(t.wineryId, input.planLotId);
        const running = await r.runningFor(t.wineryId, input.planLotId);
        if (running) throw conflict('This lot already has a run going. Close it before starting another.', 'run_running');
        const stages = ctx.train.stages;
        const { reasons, housings, installed } = await inspect(r, t.wineryId, stages, { lock: true });
        if (reasons.length > 0) {
          const hard = reasons.filter((x) => !isOverridable(x.code));
          if (hard.length > 0) {
            throw runBlocked(reasons, `The run cannot start: ${String(reasons.length)} problem${reasons.length === 1 ? '' : 's'} with the cartridges in the train.`);
          }
          if (!input.override) {
            throw runBlocked(reasons, 'The cartridges in the train do not match the plan. Fix them, or a cellar master or owner may start anyway with a written reason.');
          }
          if (!(OVERRIDE_ROLES as readonly string[]).includes(t.role)) throw forbidden('Only a cellar master or the owner may start a run despite the start checks.');
        }
        const overridden = reasons.length > 0 && input.override;
        const startedAt = new Date();
        const run = await r.insertRun({
          wineryId: t.wineryId,
          startedAt,
          // the lot's readiness as judged now, kept so a later threshold change never rewrites the record
          readinessAtStart: await readinessAtStart(tx, t.wineryId, ctx.lot, startedAt),
          planId: ctx.plan.id,
          planLotId: input.planLotId,
          startedBy: t.userId,
          startedByName: t.userName ?? null,
          overrideReason: overridden ? input.override?.reason : null,
          overrideByName: overridden ? (t.userName ?? null) : null,
          overriddenChecks: overridden ? reasons : null,
        });
        const rows: Parameters<RunsRepository['insertStageCartridges']>[0] = [];
        stages.forEach((stage, index) => {
          const housing = housings.find((h) => h.id === stage.housingId);
          if (!housing) return;
          if (stages.findIndex((x) => x.housingId === stage.housingId) !== index) return;
          for (const { cartridge: c, type } of installed.filter((i) => i.cartridge.housingId === housing.id && i.cartridge.status === 'installed')) {
            rows.push({
              wineryId: t.wineryId,
              runId: run.id,
              stageIndex: index,
              housingId: housing.id,
              housingName: housing.name,
              cartridgeId: c.id,
              serial: c.serial,
              batch: c.batch || null,
              typeId: type.id,
              typeName: type.name,
              ratingUm: type.ratingUm,
              lengthIn: c.lengthIn,
              litresAtStart: c.litresFiltered,
              cyclesAtStart: cyclesOf(c),
              installedAtVolumeL: 0,
            });
          }
        });
        await r.insertStageCartridges(rows);
        await recordChange(tx, t, { action: 'start', kind: 'run', id: run.id });
        return run.id;
      });
      return detail(t.wineryId, id);
    },

    /**
     * "Plan with what is installed": sets a stage of the lot's chosen train to the one type
     * installed in its housing. The plan stays approved, re-approved by this person now.
     */
    async planWithInstalled(t: TenantContext, planLotId: string, stageIndex: number): Promise<RunStartCheckDto> {
      await db.transaction(async (tx) => {
        const r = createRunsRepository(tx);
        const ctx = await r.planLot(t.wineryId, planLotId);
        if (!ctx) throw notFound('Lot of a plan');
        if (!ctx.train) throw conflict('Choose a train for this lot in its plan first.');
        if (await r.runningFor(t.wineryId, planLotId)) throw conflict('This lot has a run going; its train cannot change now.', 'run_open');
        const stage = ctx.train.stages[stageIndex];
        if (!stage) throw badRequest('Check the highlighted fields.', { stageIndex: 'Choose a stage of this lot’s train.' });
        const installed = (await r.cartridgesIn(t.wineryId, [stage.housingId])).filter((i) => i.cartridge.status === 'installed');
        const typeIds = [...new Set(installed.map((i) => i.type.id))];
        if (typeIds.length !== 1) {
          throw conflict(
            typeIds.length === 0 ? 'The housing holds no cartridge to plan with.' : 'The housing holds cartridges of more than one type; install one type first.',
            'not_one_type',
          );
        }
        const stages = ctx.train.stages.map((s, i) => (i === stageIndex ? { ...s, cartridgeTypeId: typeIds[0] } : s));
        await r.updateTrainStages(t.wineryId, ctx.train.id, stages);
        if (ctx.plan.status === 'approved') await r.reapprove(t.wineryId, ctx.plan.id, t.userId, t.userName ?? null);
      });
      const ctx = await repo.planLot(t.wineryId, planLotId);
      const { reasons, stages } = await inspect(repo, t.wineryId, ctx?.train?.stages ?? []);
      return { planLotId, stages, reasons: reasons.map((x) => ({ ...x, overridable: isOverridable(x.code) })) };
    },

    /**
     * A cartridge change or an in-place regeneration on one stage during a run. A change moves
     * the cartridges physically (the cartridge's own history records it), closes the removed
     * cartridges' stints at atVolumeL and opens stints for those put in. A regeneration counts
     * a care cycle on the cartridges, keeps them in and splits their stints at atVolumeL.
     */
    async change(t: TenantContext, runId: string, input: RunChangeInput): Promise<RunDetailDto> {
      await db.transaction(async (tx) => {
        const r = createRunsRepository(tx);
        const cartridges = cartridgeMovesIn(tx, t);
        const run = await r.lockRun(t.wineryId, runId);
        if (!run) throw notFound('Run');
        if (run.status !== 'running') throw conflict('This run is closed; cartridges are changed during a run.', 'run_closed');
        const ctx = await r.planLot(t.wineryId, run.planLotId);
        const stage = ctx?.train?.stages[input.stageIndex];
        if (!stage) throw badRequest('Check the highlighted fields.', { stageIndex: 'Choose a stage of this run’s train.' });
        const stints = await r.stageCartridges(t.wineryId, runId);
        const open = stints.filter((c) => c.stageIndex === input.stageIndex && c.removedAtVolumeL === null);
        const lastChange = Math.max(0, ...stints.filter((c) => c.stageIndex === input.stageIndex).map((c) => c.installedAtVolumeL));
        if (input.atVolumeL < lastChange) {
          throw badRequest('Check the highlighted fields.', { atVolumeL: `Litres cannot go back: this stage last changed at ${litresText(lastChange)}.` });
        }
        const notIn = input.removedCartridgeIds.filter((id) => !open.some((c) => c.cartridgeId === id));
        if (notIn.length > 0) {
          throw badRequest('Check the highlighted fields.', { removedCartridgeIds: 'Choose cartridges that are in this stage of the run.' });
        }
        const housingName = open[0]?.housingName ?? (await r.housings(t.wineryId, [stage.housingId]))[0]?.name ?? '';
        const installedIds = input.kind === 'regeneration' ? input.removedCartridgeIds : input.installedCartridgeIds;
        const change = await r.insertChange({
          wineryId: t.wineryId,
          runId,
          stageIndex: input.stageIndex,
          kind: input.kind,
          atVolumeL: input.atVolumeL,
          removedCartridgeIds: input.removedCartridgeIds,
          installedCartridgeIds: installedIds,
          createdBy: t.userId,
          createdByName: t.userName ?? null,
        });
        await recordChange(tx, t, { action: 'change', kind: 'run', id: runId });
        for (const id of input.removedCartridgeIds) {
          const stint = open.find((c) => c.cartridgeId === id);
          if (stint) await r.endStint(t.wineryId, stint.id, input.atVolumeL);
        }
        if (input.kind === 'change') {
          for (const id of input.removedCartridgeIds) {
            const c = await cartridges.lock(id);
            if (c && c.status !== 'in-stock' && c.status !== 'retired') await cartridges.remove(c);
          }
          for (const id of input.installedCartridgeIds) {
            const c = await cartridges.lock(id);
            if (!c) throw badRequest('Check the highlighted fields.', { installedCartridgeIds: 'Choose cartridges from this winery’s inventory.' });
            await cartridges.install(c, { housingId: stage.housingId });
          }
        } else {
          const counter = CYCLE_COUNTERS[input.cycleKind];
          await r.countCycle(t.wineryId, input.removedCartridgeIds, counter);
          await r.insertEvents(
            input.removedCartridgeIds.map((id) => ({
              wineryId: t.wineryId,
              cartridgeId: id,
              kind: 'cycle' as const,
              actorId: t.userId,
              actorName: t.userName ?? null,
              housingId: stage.housingId,
              details: { kind: input.cycleKind, runId, atVolumeL: input.atVolumeL, inPlace: true },
            })),
          );
        }
        const fresh = await r.cartridgesById(t.wineryId, installedIds);
        await r.insertStageCartridges(
          installedIds.map((id) => {
            const row = fresh.find((f) => f.cartridge.id === id);
            if (!row) throw badRequest('Check the highlighted fields.', { installedCartridgeIds: 'Choose cartridges from this winery’s inventory.' });
            const earlier = stints.filter((s) => s.cartridgeId === id).reduce((sum, s) => sum + ((s.removedAtVolumeL ?? input.atVolumeL) - s.installedAtVolumeL), 0);
            return {
              wineryId: t.wineryId,
              runId,
              stageIndex: input.stageIndex,
              housingId: stage.housingId,
              housingName,
              cartridgeId: id,
              serial: row.cartridge.serial,
              batch: row.cartridge.batch || null,
              typeId: row.type.id,
              typeName: row.type.name,
              ratingUm: row.type.ratingUm,
              lengthIn: row.cartridge.lengthIn,
              // litres are added at close, so count what it already carried in this run
              litresAtStart: row.cartridge.litresFiltered + Math.max(0, earlier),
              cyclesAtStart: cyclesOf(row.cartridge),
              installedAtVolumeL: input.atVolumeL,
              changeId: change.id,
            };
          }),
        );
      });
      return detail(t.wineryId, runId);
    },

    /** Corrects a reading: a correction entry with the new values and why; the original row is kept. */
    async correctReading(t: TenantContext, runId: string, readingId: string, input: CorrectReadingInput): Promise<RunDetailDto> {
      if (input.downstreamBar > input.upstreamBar) {
        throw badRequest('Check the reading.', { downstreamBar: 'Downstream pressure cannot be above upstream; check the gauges.' });
      }
      const values = { volumeL: input.volumeL, upstreamBar: input.upstreamBar, downstreamBar: input.downstreamBar, flowLh: input.flowLh ?? null, tempC: input.tempC ?? null };
      return amendReading(t, runId, readingId, { kind: 'correct', reason: input.reason, values });
    },

    /** Voids a reading with a reason: it stays in the record, struck through, and leaves the fits. */
    async voidReading(t: TenantContext, runId: string, readingId: string, input: VoidReadingInput): Promise<RunDetailDto> {
      return amendReading(t, runId, readingId, { kind: 'void', reason: input.reason, values: {} });
    },

    /**
     * One reading, idempotent by its clientKey: one INSERT … ON CONFLICT DO NOTHING that checks
     * the run is open, the stage exists and the litres do not go down. A resend answers the
     * stored reading. With `withStage` the answer carries the stage's new figures.
     */
    async logReading(t: TenantContext, runId: string, input: LogReadingInput, opts: { withStage?: boolean } = {}): Promise<LoggedReadingDto> {
      if (input.downstreamBar > input.upstreamBar) {
        throw badRequest('Check the reading.', { downstreamBar: 'Downstream pressure cannot be above upstream; check the gauges.' });
      }
      const stored =
        (await storeReadingInTurn(t.wineryId, runId, t.userId, toNew(input))) ?? (await repo.readingByKey(t.wineryId, runId, input.clientKey));
      if (!stored) throw await refusal(t.wineryId, runId, input);
      const reading = presentReading(stored);
      if (!opts.withStage) return reading;
      const { summary, volumeToBottleL, stages } = await build(t.wineryId, runId, stored.stageIndex);
      return {
        ...reading,
        ...(stages[0] ? { stage: stages[0] } : {}),
        run: { currentVolumeL: summary.currentVolumeL, readingCount: summary.readingCount, volumeToBottleL },
      };
    },

    /**
     * Up to READINGS_BATCH_MAX readings, all checked before any is stored (one bad reading: 400
     * naming it, nothing stored). Keys already stored count as duplicates and are not checked
     * again, so a resent batch stores nothing twice, even after the run was closed.
     */
    async logReadingsBatch(t: TenantContext, runId: string, input: LogReadingsBatchInput): Promise<ReadingsBatchResultDto> {
      return readingTurns.run(turnKey(t.wineryId, runId), () => db.transaction(async (tx) => {
        const r = createRunsRepository(tx);
        const keys = input.readings.map((x) => x.clientKey);
        const ctx = await r.batchContext(t.wineryId, runId, keys);
        if (!ctx) throw notFound('Run');
        const seen = new Set<string>();
        const fresh: { i: number; x: LogReadingInput }[] = [];
        input.readings.forEach((x, i) => {
          if (ctx.storedKeys.has(x.clientKey) || seen.has(x.clientKey)) return;
          seen.add(x.clientKey);
          fresh.push({ i, x });
        });
        const duplicates = input.readings.length - fresh.length;
        if (fresh.length === 0) return { stored: 0, duplicates };
        if (ctx.status !== 'running') throw conflict(`This run is closed; it takes no more readings (${String(fresh.length)} not stored).`, 'run_closed');
        const fields: Record<string, string> = {};
        const last = new Map(ctx.lastVolume);
        for (const { i, x } of fresh) {
          const at = `readings.${String(i)}`;
          if (x.stageIndex >= ctx.stageCount) {
            fields[`${at}.stageIndex`] = 'Choose a stage of this run’s train.';
            continue;
          }
          if (x.downstreamBar > x.upstreamBar) fields[`${at}.downstreamBar`] = 'Downstream pressure cannot be above upstream; check the gauges.';
          const before = last.get(x.stageIndex);
          if (before !== undefined && x.volumeL < before) {
            fields[`${at}.volumeL`] = `Litres cannot go down: the reading before it on this stage was ${String(before)} L.`;
          } else last.set(x.stageIndex, x.volumeL);
        }
        const bad = Object.keys(fields).length;
        if (bad > 0) throw badRequest(`Check the readings: ${String(bad)} ${bad === 1 ? 'is' : 'are'} not right, so none was stored.`, fields);
        const now = new Date();
        const stored = await storeReadings(
          tx,
          fresh.map(({ x }) => ({ ...toNew(x), at: x.at ? new Date(x.at) : now, wineryId: t.wineryId, runId, createdBy: t.userId, createdByName: t.userName ?? null })),
        );
        return { stored, duplicates: input.readings.length - stored };
      }));
    },

    /**
     * Closes a run. Each cartridge gets exactly the litres it carried: per stint, from the
     * litres through the train when it went in to when it came out (or to the end of the run),
     * not whatever is installed at closing time.
     */
    async close(t: TenantContext, runId: string, input: CloseRunInput): Promise<RunDetailDto> {
      await db.transaction(async (tx) => {
        const r = createRunsRepository(tx);
        const run = await r.lockRun(t.wineryId, runId);
        if (!run) throw notFound('Run');
        if (run.status !== 'running') throw conflict('This run is already closed.', 'run_closed');
        const ctx = await r.planLot(t.wineryId, run.planLotId);
        // one connection in a transaction: one query after the other
        const raw = await r.readings(t.wineryId, runId);
        const corrections = await r.corrections(t.wineryId, runId);
        const stints = await r.stageCartridges(t.wineryId, runId);
        const counted = effectiveReadings(raw, corrections).filter((x) => !x.voided);
        const litres = runEndLitres(counted, stints);
        const before = await auditSnapshot(tx, 'run', t.wineryId, runId);
        await r.closeRun(t.wineryId, runId, t.userId, t.userName ?? null, input.notes);
        await recordChange(tx, t, { action: 'close', kind: 'run', id: runId, before });
        const at = new Date();
        const lotCode = ctx?.lot.code ?? '';
        if (stints.length === 0) {
          // A run started before runs were bound to cartridges: the old rule, what is in the housings now.
          const housingIds = [...new Set((ctx?.train?.stages ?? []).map((s) => s.housingId))];
          const installed = await r.installedIn(t.wineryId, housingIds);
          if (litres > 0 && installed.length > 0) {
            await r.addLitres(t.wineryId, installed.map((c) => c.id), litres);
            await r.insertEvents(
              installed.map((c) => ({ wineryId: t.wineryId, cartridgeId: c.id, kind: 'run' as const, actorId: t.userId, actorName: t.userName ?? null, housingId: c.housingId, position: c.position, at, details: { litres, runId, lotCode } })),
            );
          }
          return;
        }
        const carried = new Map<string, { litres: number; stint: RunStageCartridgeRow }>();
        for (const s of stints) {
          const v = stintLitres(s, litres);
          await r.setCarried(t.wineryId, s.id, v);
          const prev = carried.get(s.cartridgeId);
          carried.set(s.cartridgeId, { litres: (prev?.litres ?? 0) + v, stint: prev?.stint ?? s });
        }
        const current = await r.cartridgesById(t.wineryId, [...carried.keys()]);
        for (const [cartridgeId, { litres: v, stint }] of carried) {
          if (v <= 0) continue;
          await r.addLitresTo(t.wineryId, cartridgeId, v);
          const now = current.find((c) => c.cartridge.id === cartridgeId)?.cartridge;
          await r.insertEvents([
            {
              wineryId: t.wineryId,
              cartridgeId,
              kind: 'run',
              actorId: t.userId,
              actorName: t.userName ?? null,
              housingId: stint.housingId,
              position: now?.housingId === stint.housingId ? now.position : null,
              at,
              details: { litres: v, runId, lotCode, stageIndex: stint.stageIndex },
            },
          ]);
        }
      });
      return detail(t.wineryId, runId);
    },
  };
}
