import { cartridgeTypeFigures, housingElementEquivalents, lineFigures } from '../../../shared/adapters/equipment';
import { cartridgeTypeWarnings, type HousingLengthIn } from '../../../shared/schemas/equipment';
import type { CartridgeTypeDto, HousingDto, LineDto } from '../../../shared/types/equipment';
import type { CartridgeTypeRow, HousingRow, LineRow, TypeCounts } from './equipment.repository';

export const presentHousing = ({ housing: h, installedCount }: { housing: HousingRow; installedCount: number }): HousingDto => ({
  id: h.id,
  name: h.name,
  rounds: h.rounds,
  lengthIn: h.lengthIn as HousingLengthIn,
  maxPressureBar: h.maxPressureBar,
  maxTempC: h.maxTempC,
  holdUpL: h.holdUpL,
  upstreamGasVolumeL: h.upstreamGasVolumeL,
  notes: h.notes,
  elementEquivalents: housingElementEquivalents(h) ?? 0,
  installedCount,
  createdAt: h.createdAt.toISOString(),
  updatedAt: h.updatedAt.toISOString(),
  archivedAt: h.archivedAt ? h.archivedAt.toISOString() : null,
});

export const presentLine = (l: LineRow): LineDto => {
  const figures = lineFigures(l);
  return {
    id: l.id,
    name: l.name,
    bottlesPerHour: l.bottlesPerHour,
    bottleMl: l.bottleMl,
    notes: l.notes,
    fillerFlowLh: figures?.fillerFlowLh ?? 0,
    requiredFlowLh: figures?.requiredFlowLh ?? 0,
    flowMarginPct: figures?.marginPct ?? 0,
    createdAt: l.createdAt.toISOString(),
    updatedAt: l.updatedAt.toISOString(),
  };
};

export const presentCartridgeType = ({ type: t, counts }: { type: CartridgeTypeRow; counts: TypeCounts }): CartridgeTypeDto => {
  const figures = cartridgeTypeFigures(t);
  return {
    id: t.id,
    name: t.name,
    kind: t.kind,
    media: t.media,
    ratingUm: t.ratingUm,
    areaM2Per10in: t.areaM2Per10in,
    waterFlowLhPer10in: t.waterFlowLhPer10in,
    waterDpBar: t.waterDpBar,
    maxDpForwardBar: t.maxDpForwardBar,
    maxDpReverseBar: t.maxDpReverseBar,
    maxTempC: t.maxTempC,
    terminalDpBar: t.terminalDpBar,
    designFluxLhPer10in: t.designFluxLhPer10in,
    nominalCapacityLPerM2: t.nominalCapacityLPerM2,
    ratedSteamCycles: t.ratedSteamCycles,
    ratedHotWaterCycles: t.ratedHotWaterCycles,
    ratedChemicalCycles: t.ratedChemicalCycles,
    flowRecoveryMinPct: t.flowRecoveryMinPct,
    bubblePointMinBar: t.bubblePointMinBar,
    diffusionMaxMlMinPer10in: t.diffusionMaxMlMinPer10in,
    pricePer10in: t.pricePer10in,
    currency: t.currency,
    certificateAttachmentId: t.certificateAttachmentId,
    notes: t.notes,
    cleanWater: figures
      ? { resistancePerM: figures.resistancePerM, specTempC: figures.specTempC, dpBarAtDesignFlux: figures.cleanWaterDpBarAtDesignFlux }
      : null,
    counts,
    warnings: cartridgeTypeWarnings(t),
    createdAt: t.createdAt.toISOString(),
    updatedAt: t.updatedAt.toISOString(),
    archivedAt: t.archivedAt ? t.archivedAt.toISOString() : null,
  };
};
