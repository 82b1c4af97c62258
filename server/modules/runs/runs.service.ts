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
import type { CloseRunInput, LogReadingInput, StartRunInput } from '../../../shared/schemas/runs';
import type { RunDetailDto, RunReadingDto, RunStageDto, RunStartOptionDto, RunSummaryDto } from '../../../shared/types/runs';
import type { Database } from '../../db/client';
import { badRequest, conflict, notFound } from '../../lib/errors';
import type { TenantContext } from '../../middleware/authorize';
import { presentReading, presentRunSummary } from './runs.presenter';
import { createRunsRepository, type RunReadingRow } from './runs.repository';

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
  restartsAtL?: number[];
}): Pick<RunStageDto, 'fit' | 'curve' | 'forecast' | 'alarm' | 'flowLh' | 'note' | 'flatWarning'> {
  const latestFlow = [...p.readings].reverse().find((r) => r.flowLh !== null && r.flowLh > 0)?.flowLh ?? null;
  const flowLh = latestFlow ?? p.lineFlowLh;
  const dpPoints = p.readings.map((r) => ({ volumeL: r.volumeL, dpBar: r.upstreamBar - r.downstreamBar }));
  const flat = detectFlatDp(dpPoints.filter((q) => q.volumeL >= Math.max(0, ...(p.restartsAtL ?? []))));
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
      best = fitConstantFlow(dpPoints).find((f) => foulingCheck(f).fouling) ?? null;
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

/** Runs: one planned lot filtered through its chosen train, followed by pressure readings per stage. */
export function createRunsService(db: Database) {
  const repo = createRunsRepository(db);

  async function detail(wineryId: string, id: string): Promise<RunDetailDto> {
    const summary = await repo.summary(wineryId, id);
    if (!summary) throw notFound('Run');
    const ctx = await repo.planLot(wineryId, summary.run.planLotId);
    if (!ctx) throw notFound('Run');
    const stages = ctx.train?.stages ?? [];
    const [types, housings, readings] = await Promise.all([
      repo.types(wineryId, [...new Set(stages.map((s) => s.cartridgeTypeId))]),
      repo.housings(wineryId, [...new Set(stages.map((s) => s.housingId))]),
      repo.readings(wineryId, id),
    ]);
    const lineFlowLh = ctx.line ? requiredFlowLh({ bottlesPerHour: ctx.line.bottlesPerHour, bottleMl: ctx.line.bottleMl }) : null;
    const volumeToBottleL = Math.max(0, summary.volumeL - summary.currentVolumeL);
    const base = presentRunSummary(summary);
    return {
      ...base,
      notes: summary.run.notes,
      trainName: ctx.train?.name ?? '',
      lineName: ctx.line?.name ?? null,
      requiredFlowLh: lineFlowLh,
      volumeToBottleL,
      stages: stages.map((s, index) => {
        const type = types.find((t) => t.id === s.cartridgeTypeId);
        const housing = housings.find((h) => h.id === s.housingId);
        const own = readings.filter((r) => r.stageIndex === index);
        const terminalDpBar = type?.terminalDpBar ?? 0;
        const figures =
          terminalDpBar > 0
            ? stageFigures({ readings: own, terminalDpBar, lineFlowLh, currentVolumeL: summary.currentVolumeL, volumeToBottleL })
            : { fit: null, curve: [], forecast: null, alarm: null, flowLh: null, flatWarning: null, note: 'This stage’s cartridge type is no longer in the catalogue.' };
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
      }),
    };
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

    async logReading(t: TenantContext, runId: string, input: LogReadingInput): Promise<RunReadingDto> {
      return db.transaction(async (tx) => {
        const r = createRunsRepository(tx);
        const run = await r.lockRun(t.wineryId, runId);
        if (!run) throw notFound('Run');
        const existing = await r.readingByKey(t.wineryId, runId, input.clientKey);
        if (existing) return presentReading(existing);
        if (run.status !== 'running') throw conflict('This run is closed; it takes no more readings.', 'run_closed');
        const ctx = await r.planLot(t.wineryId, run.planLotId);
        const stageCount = ctx?.train?.stages.length ?? 0;
        if (input.stageIndex >= stageCount) throw badRequest('Check the reading.', { stageIndex: 'Choose a stage of this run’s train.' });
        if (input.downstreamBar > input.upstreamBar) {
          throw badRequest('Check the reading.', { downstreamBar: 'Downstream pressure cannot be above upstream; check the gauges.' });
        }
        const last = await r.lastReading(t.wineryId, runId, input.stageIndex);
        if (last && input.volumeL < last.volumeL) {
          throw badRequest('Check the reading.', { volumeL: `Litres cannot go down: the last reading of this stage was ${String(last.volumeL)} L.` });
        }
        await r.insertReading({
          wineryId: t.wineryId,
          runId,
          stageIndex: input.stageIndex,
          volumeL: input.volumeL,
          upstreamBar: input.upstreamBar,
          downstreamBar: input.downstreamBar,
          flowLh: input.flowLh ?? null,
          tempC: input.tempC ?? null,
          at: input.at ? new Date(input.at) : new Date(),
          clientKey: input.clientKey,
          createdBy: t.userId,
        });
        const stored = await r.readingByKey(t.wineryId, runId, input.clientKey);
        if (!stored) throw conflict('The reading could not be stored; send it again.');
        return presentReading(stored);
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
