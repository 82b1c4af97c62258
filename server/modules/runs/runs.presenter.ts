import type { RunReadingDto, RunSummaryDto } from '../../../shared/types/runs';
import type { RunReadingRow, RunSummaryRow } from './runs.repository';

export function presentReading(r: RunReadingRow): RunReadingDto {
  return {
    id: r.id,
    clientKey: r.clientKey,
    stageIndex: r.stageIndex,
    at: r.at.toISOString(),
    volumeL: r.volumeL,
    upstreamBar: r.upstreamBar,
    downstreamBar: r.downstreamBar,
    dpBar: r.upstreamBar - r.downstreamBar,
    flowLh: r.flowLh,
    tempC: r.tempC,
    byName: r.byName ?? null,
  };
}

export function presentRunSummary(r: RunSummaryRow): RunSummaryDto {
  return {
    id: r.run.id,
    status: r.run.status,
    planId: r.run.planId,
    planName: r.planName,
    planLotId: r.run.planLotId,
    lotId: r.lotId,
    lotCode: r.lotCode,
    lotName: r.lotName,
    volumeL: r.volumeL,
    startedAt: r.run.startedAt.toISOString(),
    closedAt: r.run.closedAt ? r.run.closedAt.toISOString() : null,
    currentVolumeL: r.currentVolumeL,
    readingCount: r.readingCount,
  };
}
