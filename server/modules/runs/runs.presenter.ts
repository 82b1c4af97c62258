import type { RunChangeDto, RunReadingDto, RunStageCartridgeDto, RunSummaryDto } from '../../../shared/types/runs';
import type { ReadingCorrectionRow, RunChangeRow, RunReadingRow, RunStageCartridgeRow, RunSummaryRow } from './runs.repository';

/** A reading with its latest correction applied; the original values are kept beside it. */
export type EffectiveReading = RunReadingRow & {
  voided: boolean;
  original: RunReadingDto['original'];
  corrections: ReadingCorrectionRow[];
};

/**
 * Applies corrections to readings: the latest correction of a reading wins; a void keeps the
 * reading (with its last values) but marks it out of the fits. The stored reading rows are
 * never changed. Answers in stage, volume, time order of the corrected values.
 */
export function effectiveReadings(readings: RunReadingRow[], corrections: ReadingCorrectionRow[]): EffectiveReading[] {
  const byReading = new Map<string, ReadingCorrectionRow[]>();
  for (const c of corrections) {
    const list = byReading.get(c.readingId);
    if (list) list.push(c);
    else byReading.set(c.readingId, [c]);
  }
  const none: ReadingCorrectionRow[] = [];
  const out = readings.map((r): EffectiveReading => {
    const own = byReading.get(r.id);
    // Most readings are never corrected: they stay as stored, with no copy of their values.
    if (!own) return Object.assign({}, r, { voided: false, original: null, corrections: none });
    const original = { volumeL: r.volumeL, upstreamBar: r.upstreamBar, downstreamBar: r.downstreamBar, flowLh: r.flowLh, tempC: r.tempC };
    let values = original;
    let voided = false;
    for (const c of own) {
      if (c.kind === 'void') {
        voided = true;
      } else {
        voided = false;
        values = {
          volumeL: c.volumeL ?? values.volumeL,
          upstreamBar: c.upstreamBar ?? values.upstreamBar,
          downstreamBar: c.downstreamBar ?? values.downstreamBar,
          flowLh: c.flowLh,
          tempC: c.tempC,
        };
      }
    }
    const changed = own.some((c) => c.kind === 'correct');
    return { ...r, ...values, voided, original: changed ? original : null, corrections: own };
  });
  // Stored readings come in this order already; only corrected litres can move one.
  if (corrections.length === 0 && isOrdered(out)) return out;
  return out.sort(byStageVolumeTime);
}

function byStageVolumeTime(a: EffectiveReading, b: EffectiveReading): number {
  return a.stageIndex - b.stageIndex || a.volumeL - b.volumeL || a.at.getTime() - b.at.getTime();
}

function isOrdered(list: EffectiveReading[]): boolean {
  for (let i = 1; i < list.length; i++) if (byStageVolumeTime(list[i - 1], list[i]) > 0) return false;
  return true;
}

export function presentReading(r: EffectiveReading | RunReadingRow): RunReadingDto {
  const e = 'voided' in r ? r : { ...r, voided: false, original: null, corrections: [] as ReadingCorrectionRow[] };
  return {
    id: e.id,
    clientKey: e.clientKey,
    stageIndex: e.stageIndex,
    at: e.at.toISOString(),
    volumeL: e.volumeL,
    upstreamBar: e.upstreamBar,
    downstreamBar: e.downstreamBar,
    dpBar: e.upstreamBar - e.downstreamBar,
    flowLh: e.flowLh,
    tempC: e.tempC,
    createdByName: e.createdByName,
    byName: e.createdByName ?? e.byName ?? null,
    original: e.original,
    voided: e.voided,
    corrections: e.corrections.map((c) => ({
      id: c.id,
      kind: c.kind,
      volumeL: c.volumeL,
      upstreamBar: c.upstreamBar,
      downstreamBar: c.downstreamBar,
      flowLh: c.flowLh,
      tempC: c.tempC,
      reason: c.reason,
      byName: c.createdByName,
      at: c.createdAt.toISOString(),
    })),
  };
}

export function presentStageCartridge(c: RunStageCartridgeRow): RunStageCartridgeDto {
  return {
    id: c.id,
    cartridgeId: c.cartridgeId,
    serial: c.serial,
    batch: c.batch,
    typeId: c.typeId,
    typeName: c.typeName,
    ratingUm: c.ratingUm,
    lengthIn: c.lengthIn,
    housingId: c.housingId,
    housingName: c.housingName,
    litresAtStart: c.litresAtStart,
    cyclesAtStart: c.cyclesAtStart,
    installedAtVolumeL: c.installedAtVolumeL,
    removedAtVolumeL: c.removedAtVolumeL,
    litresCarried: c.litresCarried,
  };
}

export function presentChange(c: RunChangeRow, serialOf: Map<string, string>): RunChangeDto {
  return {
    id: c.id,
    stageIndex: c.stageIndex,
    kind: c.kind,
    atVolumeL: c.atVolumeL,
    removedSerials: c.removedCartridgeIds.map((id) => serialOf.get(id) ?? id),
    installedSerials: c.installedCartridgeIds.map((id) => serialOf.get(id) ?? id),
    byName: c.createdByName,
    at: c.createdAt.toISOString(),
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
