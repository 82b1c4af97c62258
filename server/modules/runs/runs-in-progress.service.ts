import { requiredFlowLh } from '../../../shared/engine';
import type { RunInProgressDto } from '../../../shared/types/runs';
import type { Database } from '../../db/client';
import type { TenantContext } from '../../middleware/authorize';
import { gaugeResolutionFor } from '../winery-settings/winery-settings.service';
import { effectiveReadings } from './runs.presenter';
import type { ReadingCorrectionRow, RunReadingRow } from './runs.repository';
import { createRunsInProgressRepository, type InProgressRow } from './runs-in-progress.repository';
import { stageFigures } from './runs.service';

/** Stored readings and corrections in the shape the correction rules read (only the fields they use). */
function applyCorrections(row: InProgressRow) {
  const readings = row.readings.map(
    ([id, stageIndex, atMs, volumeL, upstreamBar, downstreamBar, flowLh, tempC]) =>
      ({ id, stageIndex, at: new Date(atMs), volumeL, upstreamBar, downstreamBar, flowLh, tempC }) as RunReadingRow,
  );
  const corrections = row.corrections.map(
    ([readingId, kind, volumeL, upstreamBar, downstreamBar, flowLh, tempC]) => ({ readingId, kind, volumeL, upstreamBar, downstreamBar, flowLh, tempC }) as ReadingCorrectionRow,
  );
  return effectiveReadings(readings, corrections);
}

/**
 * The runs in progress with each stage's latest ΔP, forecast and alarm: one query for all of
 * them, then the same engine figures as the run page (`stageFigures`), run by run in memory.
 */
export function createRunsInProgressService(db: Database) {
  const repo = createRunsInProgressRepository(db);
  return {
    async inProgress(tenant: TenantContext): Promise<RunInProgressDto[]> {
      const [rows, resolutionBar] = await Promise.all([repo.inProgress(tenant.wineryId), gaugeResolutionFor(db, tenant.wineryId)]);
      return rows.map((row) => {
        const readings = applyCorrections(row);
        const currentVolumeL = row.readings.reduce((m, r) => Math.max(m, r[3]), 0);
        const volumeToBottleL = Math.max(0, row.volumeL - currentVolumeL);
        const lineFlowLh = row.bottlesPerHour !== null && row.bottleMl !== null ? requiredFlowLh({ bottlesPerHour: row.bottlesPerHour, bottleMl: row.bottleMl }) : null;
        return {
          id: row.id,
          startedAt: new Date(row.startedAtMs).toISOString(),
          plan: { id: row.planId, name: row.planName, plannedDate: row.plannedDate },
          lot: { id: row.lotId, code: row.lotCode, name: row.lotName },
          volumeL: row.volumeL,
          currentVolumeL,
          stages: row.stages.map((s, index) => {
            const type = row.types.find((t) => t.id === s.cartridgeTypeId);
            const counted = readings.filter((r) => r.stageIndex === index && !r.voided);
            const terminalDpBar = type?.terminalDpBar ?? 0;
            const figures = stageFigures({
              readings: counted,
              terminalDpBar,
              lineFlowLh,
              currentVolumeL,
              volumeToBottleL,
              restartsAtL: row.changes.filter((c) => c.stageIndex === index).map((c) => c.atVolumeL),
              resolutionBar,
            });
            const last = counted[counted.length - 1];
            const f = figures.forecast;
            return {
              index,
              name: s.name ?? `Stage ${String(index + 1)}`,
              cartridgeTypeName: type?.name ?? 'Unknown type',
              terminalDpBar,
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
      });
    },
  };
}
