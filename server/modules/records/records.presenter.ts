import type { CycleKind, IntegrityTestKind } from '../../../shared/schemas/care';
import type {
  RecordCartridgeDto,
  RecordChangeDto,
  RecordCyclesDto,
  RecordIntegrityTestDto,
  RecordLotListItemDto,
  RecordReadingDto,
  RecordSanitationDto,
} from '../../../shared/types/records';
import type { ReadingCorrectionRow, RecordEventRow, RecordReadingRow, RunChangeRow, StageCartridgeRow } from './records.repository';

const num = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);
const str = (v: unknown): string | null => (typeof v === 'string' && v !== '' ? v : null);

export function presentCartridge(c: StageCartridgeRow, start: { litresAtStart: number; cyclesAtStart: RecordCyclesDto }): RecordCartridgeDto {
  return {
    cartridgeId: c.cartridgeId,
    serial: c.serial,
    batch: c.batch,
    typeName: c.typeName,
    kind: c.kind,
    ratingUm: c.ratingUm,
    lengthIn: c.lengthIn,
    litresCarried: c.litresCarried,
    litresAtStart: start.litresAtStart,
    cyclesAtStart: start.cyclesAtStart,
    installedAtVolumeL: c.installedAtVolumeL,
    removedAtVolumeL: c.removedAtVolumeL,
  };
}

export function presentChange(c: RunChangeRow): RecordChangeDto {
  return {
    kind: c.kind,
    atVolumeL: c.atVolumeL,
    removedSerials: [...c.removedSerials].sort(),
    installedSerials: [...c.installedSerials].sort(),
    byName: c.byName,
    at: c.at.toISOString(),
  };
}

/** An integrity test event, read from its stored details (see the care service). */
export function presentIntegrityTest(serial: string, e: RecordEventRow): RecordIntegrityTestDto {
  const d = e.details;
  const test = (str(d.test) ?? 'bubble-point') as IntegrityTestKind;
  const base = { serial, test, pass: d.pass === true, byName: e.byName, at: e.at.toISOString() };
  if (test === 'bubble-point') return { ...base, measured: num(d.measuredBar), limit: num(d.minBar), limitKind: 'min', unit: 'bar' };
  if (test === 'diffusion') return { ...base, measured: num(d.measuredMlMin), limit: num(d.maxMlMin), limitKind: 'max', unit: 'mL/min' };
  return { ...base, measured: num(d.measuredDecayMbar), limit: num(d.maxDecayMbar), limitKind: 'max', unit: 'mbar' };
}

export function presentSanitation(serial: string, e: RecordEventRow): RecordSanitationDto {
  const d = e.details;
  return {
    serial,
    kind: (str(d.kind) ?? 'hot-water') as CycleKind,
    tempC: num(d.tempC),
    durationMin: num(d.durationMin),
    agent: str(d.agent),
    byName: e.byName,
    at: e.at.toISOString(),
  };
}

/** A reading with its corrections; `effective` is what fits use (null when voided). */
export function presentReading(
  r: RecordReadingRow,
  corrections: ReadingCorrectionRow[],
): RecordReadingDto & { stageIndex: number; effective: { volumeL: number; dpBar: number } | null } {
  const x = r.reading;
  const ordered = [...corrections].sort((a, b) => a.at.getTime() - b.at.getTime());
  const latest = ordered.at(-1) ?? null;
  const voided = latest?.kind === 'void';
  const volumeL = latest?.kind === 'correct' ? (latest.volumeL ?? x.volumeL) : x.volumeL;
  const up = latest?.kind === 'correct' ? (latest.upstreamBar ?? x.upstreamBar) : x.upstreamBar;
  const down = latest?.kind === 'correct' ? (latest.downstreamBar ?? x.downstreamBar) : x.downstreamBar;
  return {
    id: x.id,
    stageIndex: x.stageIndex,
    at: x.at.toISOString(),
    volumeL: x.volumeL,
    upstreamBar: x.upstreamBar,
    downstreamBar: x.downstreamBar,
    dpBar: x.upstreamBar - x.downstreamBar,
    flowLh: x.flowLh,
    tempC: x.tempC,
    byName: r.byName,
    corrections: ordered.map((c) => ({
      kind: c.kind,
      volumeL: c.volumeL,
      upstreamBar: c.upstreamBar,
      downstreamBar: c.downstreamBar,
      flowLh: c.flowLh,
      tempC: c.tempC,
      reason: c.reason,
      byName: c.byName,
      at: c.at.toISOString(),
    })),
    voided,
    effective: voided ? null : { volumeL, dpBar: up - down },
  };
}

export function presentLotListItem(r: {
  lotId: string;
  code: string;
  name: string;
  style: RecordLotListItemDto['style'];
  volumeL: number;
  runCount: number;
  volumeFilteredL: number;
  lastBottledAt: Date;
  planNames: string[];
}): RecordLotListItemDto {
  return {
    lotId: r.lotId,
    code: r.code,
    name: r.name,
    style: r.style,
    volumeL: r.volumeL,
    runCount: r.runCount,
    volumeFilteredL: Number.isFinite(r.volumeFilteredL) ? r.volumeFilteredL : 0,
    lastBottledAt: r.lastBottledAt.toISOString(),
    planNames: [...(r.planNames ?? [])].filter((n) => n !== null).sort(),
  };
}
