import {
  fitConstantFlow,
  forecastRunFromReadings,
  requiredFlowLh,
  runAlarm,
  volumeAtDp,
  type ConstantFlowFit,
} from '../../../shared/engine';
import type { CloseRunInput, LogReadingInput, LogReadingsBatchInput, StartRunInput } from '../../../shared/schemas/runs';
import type {
  LoggedReadingDto,
  ReadingsBatchResultDto,
  RunDetailDto,
  RunStageDto,
  RunStartOptionDto,
  RunSummaryDto,
} from '../../../shared/types/runs';
import type { Database } from '../../db/client';
import { badRequest, conflict, HttpError, notFound } from '../../lib/errors';
import type { TenantContext } from '../../middleware/authorize';
import { presentReading, presentRunSummary } from './runs.presenter';
import { createRunsRepository, type NewReading, type RunReadingRow } from './runs.repository';

export const RUN_LIST_LIMIT = 100;
/** Readings a stage needs before its ΔP curve is fitted. */
export const MIN_READINGS_FOR_FIT = 3;
const CURVE_POINTS = 40;

/** Points of the fitted curve from clean ΔP to terminal, by inverting the fit with the engine. */
function fittedCurve(fit: ConstantFlowFit, terminalDpBar: number, maxVolumeL: number) {
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

function stageFigures(p: {
  readings: RunReadingRow[];
  terminalDpBar: number;
  lineFlowLh: number | null;
  currentVolumeL: number;
  volumeToBottleL: number;
}): Pick<RunStageDto, 'fit' | 'curve' | 'forecast' | 'alarm' | 'flowLh' | 'note'> {
  const latestFlow = [...p.readings].reverse().find((r) => r.flowLh !== null && r.flowLh > 0)?.flowLh ?? null;
  const flowLh = latestFlow ?? p.lineFlowLh;
  const none = { fit: null, curve: [], forecast: null, alarm: null, flowLh };
  if (p.readings.length < MIN_READINGS_FOR_FIT) {
    const more = MIN_READINGS_FOR_FIT - p.readings.length;
    return { ...none, note: `Log ${String(more)} more reading${more === 1 ? '' : 's'} on this stage for a fit and a forecast (at least ${String(MIN_READINGS_FOR_FIT)}).` };
  }
  const points = p.readings.map((r) => ({ volumeL: r.volumeL, dpBar: r.upstreamBar - r.downstreamBar }));
  const maxV = Math.max(...points.map((q) => q.volumeL));
  if (flowLh === null) {
    const best = fitConstantFlow(points).find((f) => f.valid && f.kPerL > 0) ?? null;
    return {
      ...none,
      fit: best,
      curve: best ? fittedCurve(best, p.terminalDpBar, maxV) : [],
      note: best ? 'Log the flow with a reading (or give the plan a line) to forecast the time left.' : 'ΔP is not rising on these readings yet, so no forecast can be made.',
    };
  }
  try {
    const { forecast, fits } = forecastRunFromReadings({ points, terminalDpBar: p.terminalDpBar, flowLh, currentVolumeL: Math.max(p.currentVolumeL, maxV) });
    const fit = fits.find((f) => f.law === forecast.law && f.valid && f.kPerL > 0) ?? null;
    return {
      fit,
      curve: fit ? fittedCurve(fit, p.terminalDpBar, maxV) : [],
      forecast,
      alarm: runAlarm({ forecast, volumeToBottleL: p.volumeToBottleL }),
      flowLh,
      note: null,
    };
  } catch (e) {
    if (e instanceof RangeError) return { ...none, note: e.message };
    throw e;
  }
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

/** Runs: one planned lot filtered through its chosen train, followed by pressure readings per stage. */
export function createRunsService(db: Database) {
  const repo = createRunsRepository(db);

  /** The run's summary, plan context and the figures of its stages (all, or just one). */
  async function build(wineryId: string, id: string, onlyStage?: number) {
    const summary = await repo.summary(wineryId, id);
    if (!summary) throw notFound('Run');
    const ctx = await repo.planLot(wineryId, summary.run.planLotId);
    if (!ctx) throw notFound('Run');
    const all = ctx.train?.stages ?? [];
    const wanted = onlyStage === undefined ? all.map((_s, index) => index) : [onlyStage].filter((i) => i < all.length);
    const stages = wanted.map((index) => ({ index, s: all[index] }));
    const [types, housings, readings] = await Promise.all([
      repo.types(wineryId, [...new Set(stages.map(({ s }) => s.cartridgeTypeId))]),
      repo.housings(wineryId, [...new Set(stages.map(({ s }) => s.housingId))]),
      repo.readings(wineryId, id, onlyStage),
    ]);
    const lineFlowLh = ctx.line ? requiredFlowLh({ bottlesPerHour: ctx.line.bottlesPerHour, bottleMl: ctx.line.bottleMl }) : null;
    const volumeToBottleL = Math.max(0, summary.volumeL - summary.currentVolumeL);
    const stageDtos: RunStageDto[] = stages.map(({ s, index }) => {
      const type = types.find((t) => t.id === s.cartridgeTypeId);
      const housing = housings.find((h) => h.id === s.housingId);
      const own = readings.filter((r) => r.stageIndex === index);
      const terminalDpBar = type?.terminalDpBar ?? 0;
      const figures =
        terminalDpBar > 0
          ? stageFigures({ readings: own, terminalDpBar, lineFlowLh, currentVolumeL: summary.currentVolumeL, volumeToBottleL })
          : { fit: null, curve: [], forecast: null, alarm: null, flowLh: null, note: 'This stage’s cartridge type is no longer in the catalogue.' };
      return {
        index,
        name: s.name ?? `Stage ${String(index + 1)}`,
        cartridgeTypeId: s.cartridgeTypeId,
        cartridgeTypeName: type?.name ?? 'Unknown type',
        housingId: s.housingId,
        housingName: housing?.name ?? 'Unknown housing',
        terminalDpBar,
        readings: own.map(presentReading),
        ...figures,
      };
    });
    return { summary, ctx, lineFlowLh, volumeToBottleL, stages: stageDtos };
  }

  async function detail(wineryId: string, id: string): Promise<RunDetailDto> {
    const { summary, ctx, lineFlowLh, volumeToBottleL, stages } = await build(wineryId, id);
    const base = presentRunSummary(summary);
    return {
      ...base,
      notes: summary.run.notes,
      trainName: ctx.train?.name ?? '',
      lineName: ctx.line?.name ?? null,
      requiredFlowLh: lineFlowLh,
      volumeToBottleL,
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

  return {
    detail: (t: TenantContext, id: string) => detail(t.wineryId, id),

    async list(t: TenantContext): Promise<{ items: RunSummaryDto[]; total: number }> {
      const rows = await repo.list(t.wineryId, RUN_LIST_LIMIT);
      return { items: rows.map(presentRunSummary), total: rows.length };
    },

    async startOptions(t: TenantContext): Promise<{ items: RunStartOptionDto[] }> {
      const rows = await repo.startOptions(t.wineryId);
      return { items: rows.map((r) => ({ ...r, trainName: r.trainName })) };
    },

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
        const run = await r.insertRun({ wineryId: t.wineryId, planId: ctx.plan.id, planLotId: input.planLotId, startedBy: t.userId });
        return run.id;
      });
      return detail(t.wineryId, id);
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
        (await repo.insertReadingIfOpen(t.wineryId, runId, t.userId, toNew(input))) ?? (await repo.readingByKey(t.wineryId, runId, input.clientKey));
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
      return db.transaction(async (tx) => {
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
        const stored = await r.insertReadings(
          fresh.map(({ x }) => ({ ...toNew(x), at: x.at ? new Date(x.at) : now, wineryId: t.wineryId, runId, createdBy: t.userId })),
        );
        return { stored, duplicates: input.readings.length - stored };
      });
    },

    async close(t: TenantContext, runId: string, input: CloseRunInput): Promise<RunDetailDto> {
      await db.transaction(async (tx) => {
        const r = createRunsRepository(tx);
        const run = await r.lockRun(t.wineryId, runId);
        if (!run) throw notFound('Run');
        if (run.status !== 'running') throw conflict('This run is already closed.', 'run_closed');
        const ctx = await r.planLot(t.wineryId, run.planLotId);
        const litres = await r.maxVolume(t.wineryId, runId);
        await r.closeRun(t.wineryId, runId, t.userId, input.notes);
        const housingIds = [...new Set((ctx?.train?.stages ?? []).map((s) => s.housingId))];
        const installed = await r.installedIn(t.wineryId, housingIds);
        if (litres > 0 && installed.length > 0) {
          await r.addLitres(
            t.wineryId,
            installed.map((c) => c.id),
            litres,
          );
          const at = new Date();
          await r.insertEvents(
            installed.map((c) => ({
              wineryId: t.wineryId,
              cartridgeId: c.id,
              kind: 'run' as const,
              actorId: t.userId,
              housingId: c.housingId,
              position: c.position,
              at,
              details: { litres, runId, lotCode: ctx?.lot.code ?? '' },
            })),
          );
        }
      });
      return detail(t.wineryId, runId);
    },
  };
}
