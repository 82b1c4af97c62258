import { z } from 'zod';
import { listQuerySchema } from './list';

// ---------------------------------------------------------------------------------------
// Limits
// ---------------------------------------------------------------------------------------

export const EQUIPMENT_NAME_MAX = 120;
export const EQUIPMENT_NOTES_MAX = 2000;
export const HOUSING_LENGTHS_IN = [10, 20, 30, 40] as const;
export type HousingLengthIn = (typeof HOUSING_LENGTHS_IN)[number];
export const HOUSING_ROUNDS_MAX = 200;
export const PRESSURE_MAX_BAR = 100;
export const TEMP_MIN_C = -20;
export const TEMP_MAX_C = 200;
export const VOLUME_MAX_L = 10_000;
export const BOTTLES_PER_HOUR_MAX = 200_000;
export const BOTTLE_ML_MIN = 50;
export const BOTTLE_ML_MAX = 30_000;
export const RATING_UM_MAX = 500;
export const AREA_PER_10IN_MAX_M2 = 10;
export const FLOW_PER_10IN_MAX_LH = 50_000;
export const CYCLES_MAX = 100_000;
export const PRICE_MAX = 1_000_000;
/**
 * Largest nominal capacity of a cartridge type, L/m² to terminal ΔP. Wine cartridges hold a few
 * hundred to a few thousand L/m²; 100,000 leaves room for a very clean wine on a coarse prefilter
 * and still catches a figure typed in the wrong unit (common practice, no source).
 */
export const NOMINAL_CAPACITY_MAX_L_PER_M2 = 100_000;
/** Water-flow recovery below which a regenerated cartridge is retired when the type names none, % (common practice). */
export const FLOW_RECOVERY_MIN_PCT_DEFAULT = 70;

export const cartridgeKinds = ['prefilter', 'membrane'] as const;
export type CartridgeKind = (typeof cartridgeKinds)[number];
export const cartridgeMedia = ['polypropylene', 'glass fibre', 'PES', 'PVDF', 'nylon', 'other'] as const;
export type CartridgeMedia = (typeof cartridgeMedia)[number];

// ---------------------------------------------------------------------------------------
// Field builders (one message per field, saying what to enter)
// ---------------------------------------------------------------------------------------

const nameSchema = (what: string) =>
  z
    .string({ error: `Enter a name for the ${what}.` })
    .trim()
    .min(1, { error: `Enter a name for the ${what}.` })
    .max(EQUIPMENT_NAME_MAX, { error: `Names are at most ${EQUIPMENT_NAME_MAX} characters.` });

const notesSchema = z
  .string({ error: 'Notes are text.' })
  .max(EQUIPMENT_NOTES_MAX, { error: `Notes are at most ${EQUIPMENT_NOTES_MAX} characters.` })
  .default('');

/** A finite number > 0 and ≤ max. */
const positive = (label: string, max: number) =>
  z
    .number({ error: `Enter the ${label}.` })
    .refine(Number.isFinite, { error: `Enter the ${label}.` })
    .refine((v) => v > 0, { error: `The ${label} must be more than 0.` })
    .refine((v) => v <= max, { error: `The ${label} looks too large; check the figure and its unit.` });

/** A finite number ≥ 0 and ≤ max. */
const nonNegative = (label: string, max: number) =>
  z
    .number({ error: `Enter the ${label}.` })
    .refine(Number.isFinite, { error: `Enter the ${label}.` })
    .refine((v) => v >= 0, { error: `The ${label} cannot be negative.` })
    .refine((v) => v <= max, { error: `The ${label} looks too large; check the figure and its unit.` });

const temperature = (label: string) =>
  z
    .number({ error: `Enter the ${label}.` })
    .refine(Number.isFinite, { error: `Enter the ${label}.` })
    .refine((v) => v >= TEMP_MIN_C && v <= TEMP_MAX_C, { error: `The ${label} must be between ${TEMP_MIN_C} and ${TEMP_MAX_C} °C.` });

const cycleCount = (label: string) =>
  z
    .number({ error: `Enter the ${label} as a whole number, or leave it empty.` })
    .int({ error: `The ${label} is a whole number.` })
    .min(0, { error: `The ${label} cannot be negative.` })
    .max(CYCLES_MAX, { error: `The ${label} looks too large.` });

const flowRecoveryPct = z
  .number({ error: 'Enter the lowest water-flow recovery, %.' })
  .refine((v) => Number.isFinite(v) && v > 0 && v <= 100, { error: 'Flow recovery is a percentage above 0 and at most 100.' });

const currencyCode = z
  .string({ error: 'Enter a three-letter currency code, such as EUR.' })
  .trim()
  .toUpperCase()
  .regex(/^[A-Z]{3}$/, { error: 'Enter a three-letter currency code, such as EUR or USD.' });

// ---------------------------------------------------------------------------------------
// Housings
// ---------------------------------------------------------------------------------------

const housingShape = {
  name: nameSchema('housing'),
  rounds: z
    .number({ error: 'Enter the number of rounds (cartridge positions).' })
    .int({ error: 'Rounds are a whole number of cartridge positions.' })
    .min(1, { error: 'A housing has at least 1 round.' })
    .max(HOUSING_ROUNDS_MAX, { error: `At most ${HOUSING_ROUNDS_MAX} rounds.` }),
  lengthIn: z
    .number({ error: 'Choose the cartridge length: 10, 20, 30 or 40 inches.' })
    .refine((v): v is HousingLengthIn => (HOUSING_LENGTHS_IN as readonly number[]).includes(v), {
      error: 'Cartridge length is 10, 20, 30 or 40 inches.',
    }),
  maxPressureBar: positive('maximum working pressure', PRESSURE_MAX_BAR),
  maxTempC: temperature('maximum temperature'),
  holdUpL: nonNegative('hold-up volume', VOLUME_MAX_L),
  upstreamGasVolumeL: nonNegative('upstream gas volume', VOLUME_MAX_L).nullable().default(null),
  notes: notesSchema,
};

export const createHousingInputSchema = z.object(housingShape);
export type CreateHousingInput = z.input<typeof createHousingInputSchema>;
export type HousingValues = z.output<typeof createHousingInputSchema>;

/** PATCH: any subset of the fields; the merged record is checked again as a whole. */
export const updateHousingInputSchema = z
  .object({
    name: housingShape.name,
    rounds: housingShape.rounds,
    lengthIn: housingShape.lengthIn,
    maxPressureBar: housingShape.maxPressureBar,
    maxTempC: housingShape.maxTempC,
    holdUpL: housingShape.holdUpL,
    upstreamGasVolumeL: nonNegative('upstream gas volume', VOLUME_MAX_L).nullable(),
    notes: z.string().max(EQUIPMENT_NOTES_MAX, { error: `Notes are at most ${EQUIPMENT_NOTES_MAX} characters.` }),
  })
  .partial();
export type UpdateHousingInput = z.input<typeof updateHousingInputSchema>;

export const housingSortKeys = ['name', 'rounds', 'lengthIn', 'maxPressureBar', 'maxTempC', 'holdUpL', 'installedCount', 'createdAt'] as const;
export type HousingSortKey = (typeof housingSortKeys)[number];
export const housingListQuerySchema = listQuerySchema(housingSortKeys, 'name');

// ---------------------------------------------------------------------------------------
// Bottling lines
// ---------------------------------------------------------------------------------------

const lineShape = {
  name: nameSchema('bottling line'),
  bottlesPerHour: positive('filler speed in bottles per hour', BOTTLES_PER_HOUR_MAX),
  bottleMl: z
    .number({ error: 'Enter the bottle size in mL.' })
    .refine(Number.isFinite, { error: 'Enter the bottle size in mL.' })
    .refine((v) => v >= BOTTLE_ML_MIN && v <= BOTTLE_ML_MAX, { error: `The bottle size is between ${BOTTLE_ML_MIN} and ${BOTTLE_ML_MAX.toLocaleString('en-US')} mL.` }),
  notes: notesSchema,
};

export const createLineInputSchema = z.object(lineShape);
export type CreateLineInput = z.input<typeof createLineInputSchema>;
export type LineValues = z.output<typeof createLineInputSchema>;

export const updateLineInputSchema = z
  .object({
    name: lineShape.name,
    bottlesPerHour: lineShape.bottlesPerHour,
    bottleMl: lineShape.bottleMl,
    notes: z.string().max(EQUIPMENT_NOTES_MAX, { error: `Notes are at most ${EQUIPMENT_NOTES_MAX} characters.` }),
  })
  .partial();
export type UpdateLineInput = z.input<typeof updateLineInputSchema>;

export const lineSortKeys = ['name', 'bottlesPerHour', 'bottleMl', 'createdAt'] as const;
export type LineSortKey = (typeof lineSortKeys)[number];
export const lineListQuerySchema = listQuerySchema(lineSortKeys, 'name');

// ---------------------------------------------------------------------------------------
// Cartridge types
// ---------------------------------------------------------------------------------------

const cartridgeTypeFields = {
  name: nameSchema('cartridge type'),
  kind: z.enum(cartridgeKinds, { error: 'Choose prefilter or membrane.' }),
  media: z.enum(cartridgeMedia, { error: `Choose the media: ${cartridgeMedia.join(', ')}.` }),
  ratingUm: positive('micron rating', RATING_UM_MAX),
  areaM2Per10in: positive('filter area per 10-inch module', AREA_PER_10IN_MAX_M2),
  waterFlowLhPer10in: positive('clean-water flow per 10-inch module', FLOW_PER_10IN_MAX_LH),
  waterDpBar: positive('ΔP at that clean-water flow', PRESSURE_MAX_BAR),
  maxDpForwardBar: positive('maximum forward ΔP', PRESSURE_MAX_BAR),
  maxDpReverseBar: positive('maximum reverse ΔP', PRESSURE_MAX_BAR).nullable().default(null),
  maxTempC: temperature('maximum temperature'),
  terminalDpBar: positive('terminal ΔP', PRESSURE_MAX_BAR),
  designFluxLhPer10in: positive('design flow per 10-inch module', FLOW_PER_10IN_MAX_LH),
  nominalCapacityLPerM2: positive('nominal capacity to terminal ΔP', NOMINAL_CAPACITY_MAX_L_PER_M2).nullable().default(null),
  ratedSteamCycles: cycleCount('rated steam cycles').nullable().default(null),
  ratedHotWaterCycles: cycleCount('rated hot-water cycles').nullable().default(null),
  ratedChemicalCycles: cycleCount('rated chemical cycles').nullable().default(null),
  flowRecoveryMinPct: flowRecoveryPct.default(FLOW_RECOVERY_MIN_PCT_DEFAULT),
  bubblePointMinBar: positive('minimum bubble point', PRESSURE_MAX_BAR).nullable().default(null),
  diffusionMaxMlMinPer10in: positive('diffusion limit per 10-inch module', 10_000).nullable().default(null),
  pricePer10in: nonNegative('price per 10-inch module', PRICE_MAX).nullable().default(null),
  currency: currencyCode.default('EUR'),
  certificateAttachmentId: z.uuid({ error: 'Not a valid attachment.' }).nullable().default(null),
  notes: notesSchema,
};

type CartridgeTypeLimits = { terminalDpBar?: number; maxDpForwardBar?: number; waterDpBar?: number };

/** The cross-field rules of a cartridge type, with the field each message belongs to. */
function checkCartridgeType(v: CartridgeTypeLimits, ctx: z.RefinementCtx) {
  if (v.terminalDpBar !== undefined && v.maxDpForwardBar !== undefined && v.terminalDpBar > v.maxDpForwardBar) {
    ctx.addIssue({ code: 'custom', path: ['terminalDpBar'], message: 'The terminal ΔP must not exceed the maximum forward ΔP.' });
  }
  if (v.waterDpBar !== undefined && v.maxDpForwardBar !== undefined && v.waterDpBar > v.maxDpForwardBar) {
    ctx.addIssue({ code: 'custom', path: ['waterDpBar'], message: 'The clean-water ΔP of the spec cannot exceed the maximum forward ΔP.' });
  }
}

export const createCartridgeTypeInputSchema = z.object(cartridgeTypeFields).superRefine(checkCartridgeType);
export type CreateCartridgeTypeInput = z.input<typeof createCartridgeTypeInputSchema>;
export type CartridgeTypeValues = z.output<typeof createCartridgeTypeInputSchema>;

/** PATCH: any subset; the service checks the merged record with {@link createCartridgeTypeInputSchema}. */
export const updateCartridgeTypeInputSchema = z
  .object({
    name: cartridgeTypeFields.name,
    kind: cartridgeTypeFields.kind,
    media: cartridgeTypeFields.media,
    ratingUm: cartridgeTypeFields.ratingUm,
    areaM2Per10in: cartridgeTypeFields.areaM2Per10in,
    waterFlowLhPer10in: cartridgeTypeFields.waterFlowLhPer10in,
    waterDpBar: cartridgeTypeFields.waterDpBar,
    maxDpForwardBar: cartridgeTypeFields.maxDpForwardBar,
    maxDpReverseBar: positive('maximum reverse ΔP', PRESSURE_MAX_BAR).nullable(),
    maxTempC: cartridgeTypeFields.maxTempC,
    terminalDpBar: cartridgeTypeFields.terminalDpBar,
    designFluxLhPer10in: cartridgeTypeFields.designFluxLhPer10in,
    nominalCapacityLPerM2: positive('nominal capacity to terminal ΔP', NOMINAL_CAPACITY_MAX_L_PER_M2).nullable(),
    ratedSteamCycles: cycleCount('rated steam cycles').nullable(),
    ratedHotWaterCycles: cycleCount('rated hot-water cycles').nullable(),
    ratedChemicalCycles: cycleCount('rated chemical cycles').nullable(),
    flowRecoveryMinPct: flowRecoveryPct,
    bubblePointMinBar: positive('minimum bubble point', PRESSURE_MAX_BAR).nullable(),
    diffusionMaxMlMinPer10in: positive('diffusion limit per 10-inch module', 10_000).nullable(),
    pricePer10in: nonNegative('price per 10-inch module', PRICE_MAX).nullable(),
    currency: currencyCode,
    certificateAttachmentId: z.uuid({ error: 'Not a valid attachment.' }).nullable(),
    notes: z.string().max(EQUIPMENT_NOTES_MAX, { error: `Notes are at most ${EQUIPMENT_NOTES_MAX} characters.` }),
  })
  .partial()
  .superRefine(checkCartridgeType);
export type UpdateCartridgeTypeInput = z.input<typeof updateCartridgeTypeInputSchema>;

export const cartridgeTypeSortKeys = ['name', 'kind', 'media', 'ratingUm', 'areaM2Per10in', 'maxTempC', 'pricePer10in', 'cartridgeCount', 'createdAt'] as const;
export type CartridgeTypeSortKey = (typeof cartridgeTypeSortKeys)[number];
export const cartridgeTypeListQuerySchema = listQuerySchema(cartridgeTypeSortKeys, 'name').extend({
  kind: z.enum(cartridgeKinds, { error: 'Kind is prefilter or membrane.' }).optional(),
});
export type CartridgeTypeListQuery = z.output<typeof cartridgeTypeListQuerySchema>;

/** A note about a cartridge type that is accepted but worth a second look. */
export type CartridgeTypeWarning = { field: string; message: string };

/**
 * Accepted-but-doubtful entries of a cartridge type (shown on the form and the record,
 * never a reason to refuse): a membrane without an integrity-test limit cannot be checked
 * before and after bottling.
 */
export function cartridgeTypeWarnings(v: {
  kind?: CartridgeKind;
  bubblePointMinBar?: number | null;
  diffusionMaxMlMinPer10in?: number | null;
}): CartridgeTypeWarning[] {
  const warnings: CartridgeTypeWarning[] = [];
  if (v.kind === 'membrane' && (v.bubblePointMinBar ?? null) === null && (v.diffusionMaxMlMinPer10in ?? null) === null) {
    warnings.push({
      field: 'bubblePointMinBar',
      message: 'A membrane needs a minimum bubble point or a diffusion limit, or its integrity tests cannot be judged pass or fail.',
    });
  }
  return warnings;
}
