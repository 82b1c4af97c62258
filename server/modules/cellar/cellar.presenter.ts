import type { LabResultDto, LotDto, LotHeadDto, LotListItemDto, ReadinessDto, ReadinessThresholdsUsedDto, TankDto } from '../../../shared/types/cellar';
import type { LabAnalysis } from './lab-analysis';
import type { LabResultRow } from './lab-results.repository';
import type { LotRow } from './lots.repository';
import type { TankRow } from './tanks.repository';

const iso = (d: Date) => d.toISOString();

export const presentTank = (t: TankRow): TankDto => ({
  id: t.id,
  name: t.name,
  capacityL: t.capacityL,
  notes: t.notes,
  lotCount: Number(t.lotCount),
  lotVolumeL: Number(t.lotVolumeL),
  createdAt: iso(t.createdAt),
  updatedAt: iso(t.updatedAt),
});

const tankRef = (l: { tankId: string | null; tankName: string | null }) => (l.tankId && l.tankName !== null ? { id: l.tankId, name: l.tankName } : null);

const lotHead = (l: LotRow): LotHeadDto => ({
  id: l.id,
  code: l.code,
  name: l.name,
  style: l.style,
  vintage: l.vintage,
  volumeL: l.volumeL,
  tank: tankRef(l),
});

export const presentLabResult = (r: LabResultRow, a: LabAnalysis): LabResultDto => ({
  id: r.id,
  lotId: r.lotId,
  sampledAt: iso(r.sampledAt),
  turbidityNtu: r.turbidityNtu,
  t200s: r.t200s,
  t400s: r.t400s,
  cloggingIndex: a.cloggingIndex,
  cloggingIndexBand: a.cloggingIndexBand,
  disc: a.disc,
  freeSo2MgL: r.freeSo2MgL,
  notes: r.notes,
  createdBy: r.createdByName,
  createdAt: iso(r.createdAt),
  updatedAt: iso(r.updatedAt),
});

export const presentLotListItem = (
  l: LotRow,
  latest: { sampledAt: Date; turbidityNtu: number | null; analysis: LabAnalysis } | null,
  readiness: ReadinessDto,
): LotListItemDto => ({
  ...lotHead(l),
  latest: latest
    ? {
        sampledAt: iso(latest.sampledAt),
        turbidityNtu: latest.turbidityNtu,
        cloggingIndex: latest.analysis.cloggingIndex,
        cloggingIndexBand: latest.analysis.cloggingIndexBand,
      }
    : null,
  readiness,
});

export const presentLot = (
  l: LotRow & { labResultCount: number },
  latest: LabResultDto | null,
  readiness: ReadinessDto,
  thresholds: ReadinessThresholdsUsedDto,
): LotDto => ({
  ...lotHead(l),
  ethanolPctVol: l.ethanolPctVol,
  sugarGPerL: l.sugarGPerL,
  tempC: l.tempC,
  notes: l.notes,
  createdAt: iso(l.createdAt),
  updatedAt: iso(l.updatedAt),
  archivedAt: l.archivedAt ? iso(l.archivedAt) : null,
  labResultCount: Number(l.labResultCount),
  latestLabResult: latest,
  readiness,
  thresholds,
});
