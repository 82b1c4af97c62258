import { requiredFlowLh } from '../../../shared/engine';
import type { RunInProgressDto, RunInProgressStageDto } from '../../../shared/types/runs';
import type { Database } from '../../db/client';
import type { TenantContext } from '../../middleware/authorize';
import { gaugeResolutionFor } from '../winery-settings/winery-settings.service';
import { effectiveReadings } from './runs.presenter';
import type { ReadingCorrectionRow, RunReadingRow } from './runs.repository';
import { createRunsInProgressRepository, type InProgressData } from './runs-in-progress.repository';
import { RUN_FIGURES_REVISION, stageFigures } from './runs.service';

/** Stored readings and corrections in the shape the correction rules read (only the fields they use). */
function applyCorrections(data: InProgressData) {
  const readings = data.readings.map(
    ([id, stageIndex, atMs, volumeL, upstreamBar, downstreamBar, flowLh, tempC]) =>
      ({ id, stageIndex, at: new Date(atMs), volumeL, upstreamBar, downstreamBar, flowLh, tempC }) as RunReadingRow,
  );
  const corrections = data.corrections.map(
    ([readingId, kind, volumeL, upstreamBar, downstreamBar, flowLh, tempC]) => ({ readingId, kind, volumeL, upstreamBar, downstreamBar, flowLh, tempC }) as ReadingCorrectionRow,
  );
  return effectiveReadings(readings, corrections);
}

/**
 * Everything a run's figures on Today are worked out from besides its readings, corrections and
 * changes: small, read on every visit, and kept as the stored entry's key (an entry worked out
 * with other inputs is not used). `todayFigures` reads nothing else.
 */
export type TodayFigureInputs = {
  revision: typeof RUN_FIGURES_REVISION;
  volumeL: number;
  lineFlowLh: number | null;
  resolutionBar: number;
  /** Per stage of the train (its length is the stage count). */
  terminalDpBars: number[];
};

type StageTodayFigures = Pick<RunInProgressStageDto, 'dpBar' | 'readingCount' | 'forecast' | 'alarm' | 'note' | 'flatWarning'>;
/** The part of a run on Today worked out from its readings (what `run_figures.today` keeps). */
export type TodayFigures = { currentVolumeL: number; stages: StageTodayFigures[] };

/** Each stage's latest ΔP, forecast and alarm: the run page's own `stageFigures`, with Today's litres (the highest stored reading). */
export function todayFigures(inputs: TodayFigureInputs, data: InProgressData): TodayFigures {
  const readings = applyCorrections(data);
  const currentVolumeL = data.readings.reduce((m, r) => Math.max(m, r[3]), 0);
  const volumeToBottleL = Math.max(0, inputs.volumeL - currentVolumeL);
  return {
    currentVolumeL,
    stages: inputs.terminalDpBars.map((terminalDpBar, index) => {
      const counted = readings.filter((r) => r.stageIndex === index && !r.voided);
      const figures = stageFigures({
        readings: counted,
        terminalDpBar,
        lineFlowLh: inputs.lineFlowLh,
        currentVolumeL,
        volumeToBottleL,
        restartsAtL: data.changes.filter((c) => c.stageIndex === index).map((c) => c.atVolumeL),
        resolutionBar: inputs.resolutionBar,
      });
      const last = counted[counted.length - 1];
      const f = figures.forecast;
      return {
        dpBar: last ? last.upstreamBar - last.downstreamBar : null,
        readingCount: counted.length,
        forecast: f
          ? { volumeLeftL: f.volumeLeftL, hoursLeft: f.hoursLeft, timeLeft: f.timeLeft, reachedTerminal: f.reachedTerminal, beyondReadings: f.beyondReadings, volumeSeenL: f.volumeSeenL }
          : null,
        alarm: figures.alarm,
        note: figures.note,
        flatWarning: figures.flatWarning,
      };
    }),
  };
}

/**
 * The runs in progress with each stage's latest ΔP, forecast and alarm: one query for all of
 * them with their stored entries (`run_figures.today`); the runs whose entry is missing, of an
 * older version or worked out with other inputs are worked out again (the same engine figures
 * as the run page, `stageFigures`), from their readings read in one more query, and stored.
 * When nothing changed since the last visit, no reading is read.
 */
export function createRunsInProgressService(db: Database) {
  const repo = createRunsInProgressRepository(db);
  return {
    async inProgress(tenant: TenantContext): Promise<RunInProgressDto[]> {
      // First: the versions are read before anything the figures are worked out from.
      const [rows, resolutionBar] = await Promise.all([repo.inProgress(tenant.wineryId), gaugeResolutionFor(db, tenant.wineryId)]);
      const runs = rows.map((row) => {
        const inputs: TodayFigureInputs = {
          revision: RUN_FIGURES_REVISION,
          volumeL: row.volumeL,
          lineFlowLh: row.bottlesPerHour !== null && row.bottleMl !== null ? requiredFlowLh({ bottlesPerHour: row.bottlesPerHour, bottleMl: row.bottleMl }) : null,
          resolutionBar,
          terminalDpBars: row.stages.map((s) => row.types.find((t) => t.id === s.cartridgeTypeId)?.terminalDpBar ?? 0),
        };
        const key = JSON.stringify(inputs);
        return { row, inputs, key, figures: row.today !== null && row.todayKey === key ? (row.today as TodayFigures) : null };
      });
      const stale = runs.filter((r) => r.figures === null);
      if (stale.length > 0) {
        const data = await repo.dataOf(stale.map((r) => r.row.id));
        const entries: { runId: string; version: number; key: string; today: string }[] = [];
        for (const r of stale) {
          const figures = todayFigures(r.inputs, data.get(r.row.id) ?? { readings: [], corrections: [], changes: [] });
          r.figures = figures;
          entries.push({ runId: r.row.id, version: r.row.figuresVersion, key: r.key, today: JSON.stringify(figures) });
        }
        await repo.storeToday(entries);
      }
      return runs.map(({ row, inputs, figures }) => {
        const f = figures as TodayFigures;
        return {
          id: row.id,
          startedAt: new Date(row.startedAtMs).toISOString(),
          plan: { id: row.planId, name: row.planName, plannedDate: row.plannedDate },
          lot: { id: row.lotId, code: row.lotCode, name: row.lotName },
          volumeL: row.volumeL,
          currentVolumeL: f.currentVolumeL,
          stages: row.stages.map((s, index) => ({
            index,
            name: s.name ?? `Stage ${String(index + 1)}`,
            cartridgeTypeName: row.types.find((t) => t.id === s.cartridgeTypeId)?.name ?? 'Unknown type',
            terminalDpBar: inputs.terminalDpBars[index],
            ...f.stages[index],
          })),
        };
      });
    },
  };
}
