// From stored plan rows to the engine's train-sizing input: the one mapping, used by the server
// for the saved result and by the browser for live what-if, so both size the same train the same
// way. Values are metric/SI.
import {
  capacityFromPastRuns,
  DEFAULT_HOSE_ROUGHNESS_MM,
  sizeTrain,
  type PastRunStageOutcome,
  type TrainSizingInput,
  type TrainSizingResult,
  type WineStyle,
} from '../engine';
import { BLOCKING_WARNING_CODES, type PlanSanitationKind, type TrainHoseInput, type TrainStageInput } from '../schemas/plans';

/** The catalogue fields of a cartridge type the sizing reads. */
export type SizingCatalogueType = {
  id: string;
  name: string;
  kind: 'prefilter' | 'membrane';
  ratingUm: number;
  areaM2Per10in: number;
  waterFlowLhPer10in: number;
  waterDpBar: number;
  maxDpForwardBar: number;
  /** null when the type may not be backwashed (then a blocked set is changed, not regenerated). */
  maxDpReverseBar: number | null;
  maxTempC: number;
  terminalDpBar: number;
  designFluxLhPer10in: number;
  pricePer10in: number | null;
  currency: string;
  /** Rated hot-water regeneration cycles of the type, or null when the maker gives none. */
  ratedHotWaterCycles?: number | null;
  /** The type's nominal capacity to terminal ΔP for an average wine, L/m² (the last capacity source), or null when not given. */
  nominalCapacityLPerM2?: number | null;
};

/** The fields of a housing the sizing reads. */
export type SizingCatalogueHousing = {
  id: string;
  name: string;
  rounds: number;
  lengthIn: number;
  maxPressureBar: number;
  maxTempC: number;
  holdUpL: number;
};

export type SizingWineSource = {
  tempC: number;
  ethanolPctVol: number;
  sugarGPerL: number;
  vmaxLPerM2?: number | null;
  /** The lot's style, latest clogging index (s) and turbidity (NTU): how similar past runs are picked. */
  style?: WineStyle;
  cloggingIndexS?: number | null;
  turbidityNtu?: number | null;
  /** The winery's closed runs of wines of this style, stage by stage (capacity when nothing is typed and no Vmax test applies). */
  pastRuns?: readonly PastRunStageOutcome[];
};
export type SizingLineSource = { bottlesPerHour: number; bottleMl: number };

/** What a train needs to be sized: the lot's wine and volume, the plan's line, the stages and the catalogue. */
export type TrainSizingSource = {
  wine: SizingWineSource;
  volumeL: number;
  line: SizingLineSource | null;
  stages: TrainStageInput[];
  hoses?: TrainHoseInput[] | null;
  types: readonly SizingCatalogueType[];
  housings: readonly SizingCatalogueHousing[];
  /** The plan's sanitation before the wine, checked against every rating. */
  sanitationKind?: PlanSanitationKind;
};

export type TrainSizingOutcome = { ok: true; input: TrainSizingInput; result: TrainSizingResult } | { ok: false; error: string };

/**
 * The engine's input for one train: wine from the lot (°C, % vol, g/L), flow from the line, one
 * engine stage per stored stage from the catalogue rows (a backwashable type counts as
 * regenerable during the lot), capacity per m² from the stage's figure, else (in the engine) the lot's Vmax test, the winery's past runs, the type's nominal figure, or unknown.
 */
export function buildTrainSizingInput(src: TrainSizingSource): { ok: true; input: TrainSizingInput } | { ok: false; error: string } {
  if (!src.line) return { ok: false, error: 'Choose a bottling line for the plan first.' };
  if (src.stages.length === 0) return { ok: false, error: 'Add at least one stage.' };
  const types = new Map(src.types.map((t) => [t.id, t]));
  const housings = new Map(src.housings.map((h) => [h.id, h]));
  const stages: TrainSizingInput['stages'] = [];
  for (let i = 0; i < src.stages.length; i++) {
    const s = src.stages[i];
    const label = s.name ? s.name : `Stage ${i + 1}`;
    const t = types.get(s.cartridgeTypeId);
    if (!t) return { ok: false, error: `${label}: choose a cartridge type from the catalogue.` };
    const h = housings.get(s.housingId);
    if (!h) return { ok: false, error: `${label}: choose a housing.` };
    const count = s.housingCount ?? 1;
    if (!Number.isInteger(count) || count < 1) return { ok: false, error: `${label}: the number of housings is a whole number, 1 or more.` };
    const regenerable = t.maxDpReverseBar !== null;
    const pastRuns =
      src.wine.style && src.wine.pastRuns && src.wine.pastRuns.length > 0
        ? capacityFromPastRuns(src.wine.pastRuns, { style: src.wine.style, cartridgeTypeId: t.id, cloggingIndexS: src.wine.cloggingIndexS, turbidityNtu: src.wine.turbidityNtu })
        : null;
    stages.push({
      name: label,
      housingId: h.id,
      housingCount: count,
      housing: { rounds: h.rounds, lengthIn: h.lengthIn as 10 | 20 | 30 | 40, maxPressureBar: h.maxPressureBar, maxTempC: h.maxTempC, holdUpL: h.holdUpL },
      cartridgeType: {
        kind: t.kind,
        ratingUm: t.ratingUm,
        areaM2Per10in: t.areaM2Per10in,
        waterFlowLhPer10in: t.waterFlowLhPer10in,
        waterDpBar: t.waterDpBar,
        maxDpForwardBar: t.maxDpForwardBar,
        maxTempC: t.maxTempC,
        terminalDpBar: t.terminalDpBar,
        designFluxLhPer10in: t.designFluxLhPer10in,
        capacityLPerM2: s.capacityLPerM2 ?? undefined,
        ...(pastRuns ? { pastRuns } : {}),
        ...(t.nominalCapacityLPerM2 ? { nominalCapacityLPerM2: t.nominalCapacityLPerM2 } : {}),
        regenerable,
        // A regenerable set serves its rated regeneration cycles + 1 loads over its life.
        serviceLifeLoads: regenerable && t.ratedHotWaterCycles ? t.ratedHotWaterCycles + 1 : undefined,
        pricePer10in: t.pricePer10in ?? undefined,
        currency: t.currency,
      },
    });
  }
  const hoses = (src.hoses ?? []).map((h) => ({
    diameterMm: h.diameterMm,
    lengthM: h.lengthM,
    roughnessMm: h.roughnessMm ?? DEFAULT_HOSE_ROUGHNESS_MM,
    sumK: h.sumK ?? 0,
  }));
  return {
    ok: true,
    input: {
      wine: {
        tempC: src.wine.tempC,
        ethanolPctVol: src.wine.ethanolPctVol,
        sugarGPerL: src.wine.sugarGPerL,
        ...(src.wine.vmaxLPerM2 ? { vmaxLPerM2: src.wine.vmaxLPerM2 } : {}),
      },
      line: { bottlesPerHour: src.line.bottlesPerHour, bottleMl: src.line.bottleMl },
      batchL: src.volumeL,
      lineLosses: hoses.length > 0 ? { hoses } : undefined,
      stages,
      sanitation: src.sanitationKind ? { kind: src.sanitationKind } : undefined,
    },
  };
}

/** Sizes one train with the engine; an input outside the engine's range becomes a plain error. */
export function sizePlanTrain(src: TrainSizingSource): TrainSizingOutcome {
  const built = buildTrainSizingInput(src);
  if (!built.ok) return built;
  try {
    return { ok: true, input: built.input, result: sizeTrain(built.input) };
  } catch (error) {
    if (error instanceof RangeError) return { ok: false, error: error.message };
    throw error;
  }
}

/** The reasons a train may not be approved: no sizing, or a limit of the equipment broken. */
export function blockingReasons(outcome: TrainSizingOutcome): string[] {
  if (!outcome.ok) return [outcome.error];
  return outcome.result.warnings.filter((w) => BLOCKING_WARNING_CODES.includes(w.code)).map((w) => w.message);
}
