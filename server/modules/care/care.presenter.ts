import type { CareEventDto, CareTargetDto } from '../../../shared/types/care';
import { elementEquivalents } from '../../../shared/engine';
import type { CareCartridgeRow, CareEventRow, CareHousingRow, CareTypeRow } from './care.repository';

export const presentCareEvent = (r: CareEventRow): CareEventDto => ({
  id: r.id,
  kind: r.kind === 'integrity' ? 'integrity' : 'cycle',
  at: r.at.toISOString(),
  cartridgeId: r.cartridgeId,
  serial: r.serial,
  typeName: r.typeName,
  actorName: r.actorName ?? null,
  housingName: r.housingName ?? null,
  details: r.details ?? {},
});

export const presentCareTarget = (
  c: CareCartridgeRow,
  t: CareTypeRow,
  h: CareHousingRow | null,
  flowBasis: CareTargetDto['flowBasis'],
  housingElementEquivalents: number | null = null,
): CareTargetDto => ({
  id: c.id,
  serial: c.serial,
  batch: c.batch,
  typeName: t.name,
  typeKind: t.kind,
  status: c.status,
  lengthIn: c.lengthIn,
  elementEquivalents: elementEquivalents({ cartridges: 1, lengthIn: c.lengthIn }),
  housingElementEquivalents: c.status === 'installed' && h ? housingElementEquivalents : null,
  housingId: c.status === 'installed' && h ? h.id : null,
  housingName: c.status === 'installed' && h ? h.name : null,
  upstreamGasVolumeL: c.status === 'installed' && h ? h.upstreamGasVolumeL : null,
  maxTempC: t.maxTempC,
  bubblePointMinBar: t.bubblePointMinBar,
  diffusionMaxMlMinPer10in: t.diffusionMaxMlMinPer10in,
  flowRecoveryMinPct: t.flowRecoveryMinPct,
  waterDpBar: t.waterDpBar,
  flowBasis,
  steamCycles: c.steamCycles,
  hotWaterCycles: c.hotWaterCycles,
  chemicalCycles: c.chemicalCycles,
});
