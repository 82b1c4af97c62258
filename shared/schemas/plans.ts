// Request schemas of bottling-day plans, and the one mapping from stored plan rows to the
// engine's train-sizing input (used by the server for the saved result and by the browser for
// live what-if, so both size the same train the same way). Values are metric/SI.
import { z } from 'zod';
import {
  DEFAULT_HOSE_ROUGHNESS_MM,
  capacityFromPastRuns,
  sizeTrain,
  type PastRunStageOutcome,
  type SizingWarningCode,
  type TrainSizingInput,
  type TrainSizingResult,
} from '../engine';
import type { WineStyle } from '../engine/readiness';
import { listQuerySchema } from './list';

export const PLAN_NAME_MAX = 120;
export const PLAN_NOTES_MAX = 2000;
export const TRAIN_NAME_MAX = 60;
export const STAGE_NAME_MAX = 60;
export const STAGES_MAX = 6;
export const HOSES_MAX = 10;
export const HOUSING_COUNT_MAX = 12;
export const PLAN_LOT_VOLUME_MAX_L = 2_000_000;
export const CAPACITY_MAX_L_PER_M2 = 1_000_000;

export const planStatuses = ['draft', 'approved', 'done'] as const;
export type PlanStatus = (typeof planStatuses)[number];
export const planStatusLabels: Record<PlanStatus, string> = { draft: 'draft', approved: 'approved', done: 'done' };

export const sanitationKinds = ['hot-water', 'steam'] as const;
export type PlanSanitationKind = (typeof sanitationKinds)[number];
export const sanitationKindLabels: Record<PlanSanitationKind, string> = { 'hot-water': 'Hot water', steam: 'Steam' };

/**
 * Warnings that stop a plan from being approved: limits of the equipment itself (pressure and
 * temperature ratings, sanitation included), a stage that cannot filter the wine at all, and one
 * housing in two stages. Flux and clean-ΔP warnings are advice and leave the choice to the planner.
 */
export const BLOCKING_WARNING_CODES: readonly SizingWarningCode[] = [
  'inlet-pressure-above-housing-rating',
  'stage-dp-above-cartridge-max-dp',
  'stage-infeasible',
  'housing-in-two-stages',
  'temp-above-cartridge-max',
  'temp-above-housing-max',
  'sanitation-above-cartridge-max',
  'sanitation-above-housing-max',
];

const id = (what: string) => z.uuid({ error: `Choose ${what}.` });

const nameSchema = z
  .string({ error: 'Enter a name for the plan.' })
  .trim()
  .min(1, { error: 'Enter a name for the plan.' })
  .max(PLAN_NAME_MAX, { error: `Names are at most ${PLAN_NAME_MAX} characters.` });

const dateSchema = z
  .string({ error: 'Enter the bottling date.' })
  .regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Enter the bottling date as YYYY-MM-DD.' })
  .refine((s) => {
    const d = new Date(`${s}T00:00:00Z`);
    return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
  }, { error: 'That date does not exist.' });

const timeSchema = z
  .string({ error: 'Enter the start time as HH:MM.' })
  .regex(/^([01]\d|2[0-3]):[0-5]\d$/, { error: 'Enter the start time as HH:MM (24-hour), e.g. 07:00.' });

const sanitationSchema = z.enum(sanitationKinds, { error: 'Choose hot water or steam.' });
const notesSchema = z.string({ error: 'Notes are text.' }).trim().max(PLAN_NOTES_MAX, { error: `Notes are at most ${PLAN_NOTES_MAX} characters.` });

const planShape = {
  name: nameSchema,
  plannedDate: dateSchema,
  lineId: id('a bottling line'),
  startTime: timeSchema.default('07:00'),
  sanitationKind: sanitationSchema.default('hot-water'),
  notes: notesSchema.default(''),
};

export const createPlanInputSchema = z.object(planShape);
export type CreatePlanInput = z.input<typeof createPlanInputSchema>;
export type PlanValues = z.output<typeof createPlanInputSchema>;

export const updatePlanInputSchema = z
  .object({
    name: nameSchema,
    plannedDate: dateSchema,
    lineId: id('a bottling line'),
    startTime: timeSchema,
    sanitationKind: sanitationSchema,
    notes: notesSchema,
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'Change at least one field.' });
export type UpdatePlanInput = z.input<typeof updatePlanInputSchema>;

export const APPROVAL_REASON_MAX = 1000;

/** Approving a plan; a written reason is needed only to accept cautions (flux above design, a lot not ready, a stock shortfall). */
export const approvePlanInputSchema = z.object({
  reason: z
    .string({ error: 'The reason is text.' })
    .trim()
    .max(APPROVAL_REASON_MAX, { error: `Reasons are at most ${APPROVAL_REASON_MAX} characters.` })
    .optional(),
});
export type ApprovePlanInput = z.input<typeof approvePlanInputSchema>;

export const planSortKeys = ['plannedDate', 'name', 'status', 'createdAt'] as const;
export type PlanSortKey = (typeof planSortKeys)[number];
export const planListQuerySchema = listQuerySchema(planSortKeys, 'plannedDate').extend({
  status: z.enum(planStatuses, { error: 'Status is draft, approved or done.' }).optional(),
});
export type PlanListQuery = z.output<typeof planListQuerySchema>;

const volumeSchema = z
  .number({ error: 'Enter the volume to bottle.' })
  .refine(Number.isFinite, { error: 'Enter the volume to bottle.' })
  .refine((v) => v > 0, { error: 'The volume to bottle must be more than 0.' })
  .refine((v) => v <= PLAN_LOT_VOLUME_MAX_L, { error: 'That volume is larger than any lot; check the figure and its unit.' });

export const addPlanLotInputSchema = z.object({
  lotId: id('a lot from the cellar'),
  /** Defaults to the lot's volume. */
  volumeL: volumeSchema.optional(),
});
export type AddPlanLotInput = z.input<typeof addPlanLotInputSchema>;

export const updatePlanLotInputSchema = z
  .object({
    volumeL: volumeSchema,
    /** 1-based place in the day; the other lots move up or down. */
    position: z.number({ error: 'The position is a whole number.' }).int({ error: 'The position is a whole number.' }).min(1, { error: 'Positions start at 1.' }),
    chosenTrainId: id('a train').nullable(),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'Change at least one field.' });
export type UpdatePlanLotInput = z.input<typeof updatePlanLotInputSchema>;

export const trainStageSchema = z.object({
  name: z.string({ error: 'Stage names are text.' }).trim().max(STAGE_NAME_MAX, { error: `Stage names are at most ${STAGE_NAME_MAX} characters.` }).optional(),
  cartridgeTypeId: id('a cartridge type'),
  housingId: id('a housing'),
  housingCount: z
    .number({ error: 'Enter how many housings in parallel.' })
    .int({ error: 'The number of housings is a whole number.' })
    .min(1, { error: 'At least one housing.' })
    .max(HOUSING_COUNT_MAX, { error: `At most ${HOUSING_COUNT_MAX} housings in parallel.` })
    .default(1),
  capacityLPerM2: z
    .number({ error: 'Enter the capacity as a number, or leave it empty.' })
    .refine((v) => Number.isFinite(v) && v > 0, { error: 'The capacity must be more than 0, or left empty.' })
    .refine((v) => v <= CAPACITY_MAX_L_PER_M2, { error: 'That capacity looks too large; check the figure and its unit.' })
    .nullable()
    .optional(),
});
export type TrainStageInput = z.input<typeof trainStageSchema>;

export const trainHoseSchema = z.object({
  diameterMm: z.number({ error: 'Enter the hose diameter.' }).refine((v) => Number.isFinite(v) && v > 0 && v <= 500, { error: 'The hose diameter must be more than 0 and at most 500 mm.' }),
  lengthM: z.number({ error: 'Enter the hose length.' }).refine((v) => Number.isFinite(v) && v > 0 && v <= 1000, { error: 'The hose length must be more than 0 and at most 1,000 m.' }),
  roughnessMm: z.number().refine((v) => Number.isFinite(v) && v >= 0 && v <= 10, { error: 'The roughness must be 0–10 mm.' }).nullable().optional(),
  sumK: z.number().refine((v) => Number.isFinite(v) && v >= 0 && v <= 1000, { error: 'The fitting losses must be 0–1,000.' }).nullable().optional(),
});
export type TrainHoseInput = z.input<typeof trainHoseSchema>;

const trainNameSchema = z
  .string({ error: 'Enter a name for the train, e.g. "Option A".' })
  .trim()
  .min(1, { error: 'Enter a name for the train, e.g. "Option A".' })
  .max(TRAIN_NAME_MAX, { error: `Train names are at most ${TRAIN_NAME_MAX} characters.` });
const stagesSchema = z
  .array(trainStageSchema, { error: 'Add at least one stage.' })
  .min(1, { error: 'Add at least one stage.' })
  .max(STAGES_MAX, { error: `At most ${STAGES_MAX} stages.` });
const hosesSchema = z.array(trainHoseSchema).max(HOSES_MAX, { error: `At most ${HOSES_MAX} hoses.` }).nullable();

export const createTrainInputSchema = z.object({ name: trainNameSchema, stages: stagesSchema, hoses: hosesSchema.optional() });
export type CreateTrainInput = z.input<typeof createTrainInputSchema>;
export type TrainValues = z.output<typeof createTrainInputSchema>;

export const updateTrainInputSchema = z
  .object({ name: trainNameSchema, stages: stagesSchema, hoses: hosesSchema })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { error: 'Change at least one field.' });
export type UpdateTrainInput = z.input<typeof updateTrainInputSchema>;

// ---------------------------------------------------------------------------------------
// From stored rows to the engine's input
// ---------------------------------------------------------------------------------------

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
 * regenerable during the lot), capacity per m² from the stage's typed figure, else (in the
 * engine) the lot's Vmax test, else the winery's closed runs of similar wines, else unknown.
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

/** "07:00" + minutes → wall-clock "HH:MM" (with "+1 d" past midnight), from ms on the plan's own clock. */
export function planClock(ms: number): string {
  const d = new Date(ms);
  return `${String(d.getUTCHours()).padStart(2, '0')}:${String(d.getUTCMinutes()).padStart(2, '0')}`;
}

/**
 * Start of the day on the plan's own wall clock, ms: the date and HH:MM read as UTC, so
 * times come back unchanged whatever the server's or browser's time zone.
 */
export function planStartMs(plannedDate: string, startTime: string): number {
  const [y, m, d] = plannedDate.split('-').map(Number);
  const [hh, mm] = startTime.split(':').map(Number);
  return Date.UTC(y, m - 1, d, hh, mm);
}
