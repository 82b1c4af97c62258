// Request schemas of the cellar: tanks, wine lots and their lab results. Values are metric/SI
// (L, °C, bar, mm); the client converts from the person's units before validating with these.
import { z } from 'zod';
import { yearInRange, yearRangeMessage } from './common';
import { WINE_STYLES, type WineStyle } from '../engine';
import { listQuerySchema } from './list';
import { patchSchemaOf } from './patch';

export const TANK_NAME_MAX = 80;
export const LOT_CODE_MAX = 40;
export const LOT_NAME_MAX = 120;
export const NOTES_MAX = 2000;
export const VINTAGE_MIN = 1900;
export const VINTAGE_MAX = 2100;
export const TANK_CAPACITY_MAX_L = 2_000_000;
export const LOT_VOLUME_MAX_L = 2_000_000;
export const ETHANOL_MAX_PCT = 25;
export const SUGAR_MAX_G_PER_L = 500;
export const TEMP_MIN_C = -5;
export const TEMP_MAX_C = 40;
export const TURBIDITY_MAX_NTU = 4000;
export const TEST_TIME_MAX_S = 86_400;
export const DISC_POINTS_MAX = 60;
export const DISC_DIAMETER_MIN_MM = 5;
export const DISC_DIAMETER_MAX_MM = 300;
export const DISC_PRESSURE_MAX_BAR = 10;
export const FREE_SO2_MAX_MG_L = 200;

// In a module of its own, without zod, so pages that only show the words need not load the validator.
export { wineStyleLabels } from './cellar-labels';

/** A required number with plain messages for a missing and a non-numeric value. */
const num = (what: string) =>
  z.number({ error: (issue) => (issue.input === undefined || issue.input === null || issue.input === '' ? `Enter ${what}.` : `Enter ${what} as a number.`) });

/** A number that may be left out (chain .nullable().optional()): null or absent means "not measured". */
const optionalNum = (what: string) => z.number({ error: `Enter ${what} as a number, or leave it empty.` });

const notesSchema = z.string().trim().max(NOTES_MAX, { error: `Notes are at most ${NOTES_MAX} characters.` }).default('');

export const wineStyleSchema = z.enum(WINE_STYLES as [WineStyle, ...WineStyle[]], { error: 'Choose white, rosé, red, sweet or sparkling.' });

// ---------------------------------------------------------------------------
// Tanks
// ---------------------------------------------------------------------------

export const tankInputSchema = z.object({
  name: z
    .string({ error: 'Enter the tank name.' })
    .trim()
    .min(1, { error: 'Enter the tank name.' })
    .max(TANK_NAME_MAX, { error: `Tank names are at most ${TANK_NAME_MAX} characters.` }),
  capacityL: num('the capacity')
    .positive({ error: 'The capacity must be more than zero.' })
    .max(TANK_CAPACITY_MAX_L, { error: 'That capacity is larger than any cellar tank.' }),
  notes: notesSchema,
});
export type TankInput = z.infer<typeof tankInputSchema>;
/** PATCH /api/tanks/:id: any subset of the fields; the merged tank is checked as a whole. */
export const tankPatchSchema = patchSchemaOf(tankInputSchema);
export type TankPatch = z.output<typeof tankPatchSchema>;

export const tankSortKeys = ['name', 'capacityL', 'lotCount'] as const;
export const tanksListQuerySchema = listQuerySchema(tankSortKeys, 'name');
export type TanksListQuery = z.infer<typeof tanksListQuerySchema>;

// ---------------------------------------------------------------------------
// Lots
// ---------------------------------------------------------------------------

export const lotInputSchema = z.object({
  code: z
    .string({ error: 'Enter the lot code.' })
    .trim()
    .min(1, { error: 'Enter the lot code.' })
    .max(LOT_CODE_MAX, { error: `Lot codes are at most ${LOT_CODE_MAX} characters.` }),
  name: z
    .string({ error: 'Enter the lot name.' })
    .trim()
    .min(1, { error: 'Enter the lot name.' })
    .max(LOT_NAME_MAX, { error: `Lot names are at most ${LOT_NAME_MAX} characters.` }),
  style: wineStyleSchema,
  vintage: z
    .number({ error: 'Enter the vintage as a year, or leave it empty for a non-vintage blend.' })
    .int({ error: 'Enter the vintage as a year, such as 2024.' })
    .min(VINTAGE_MIN, { error: `Vintages start at ${VINTAGE_MIN}.` })
    .max(VINTAGE_MAX, { error: `Vintages end at ${VINTAGE_MAX}.` })
    .nullable()
    .optional(),
  volumeL: num('the volume')
    .positive({ error: 'The volume must be more than zero.' })
    .max(LOT_VOLUME_MAX_L, { error: 'That volume is larger than any cellar holds.' }),
  tankId: z.uuid({ error: 'Choose one of your tanks.' }).nullable().optional(),
  ethanolPctVol: num('the alcohol strength')
    .min(0, { error: 'Alcohol strength cannot be negative.' })
    .max(ETHANOL_MAX_PCT, { error: `Alcohol strength is at most ${ETHANOL_MAX_PCT} % vol.` }),
  sugarGPerL: num('the residual sugar')
    .min(0, { error: 'Residual sugar cannot be negative.' })
    .max(SUGAR_MAX_G_PER_L, { error: `Residual sugar is at most ${SUGAR_MAX_G_PER_L} g/L.` })
    .default(0),
  tempC: num('the temperature at filtration')
    .min(TEMP_MIN_C, { error: `The temperature at filtration must be between ${TEMP_MIN_C} °C and ${TEMP_MAX_C} °C (23–104 °F).` })
    .max(TEMP_MAX_C, { error: `The temperature at filtration must be between ${TEMP_MIN_C} °C and ${TEMP_MAX_C} °C (23–104 °F).` }),
  notes: notesSchema,
});
export type LotInput = z.infer<typeof lotInputSchema>;
/** PATCH /api/lots/:id: any subset of the fields; the merged lot is checked as a whole. */
export const lotPatchSchema = patchSchemaOf(lotInputSchema);
export type LotPatch = z.output<typeof lotPatchSchema>;

export const lotSortKeys = ['code', 'name', 'style', 'vintage', 'volumeL', 'tank', 'sampledAt', 'turbidityNtu'] as const;
export type LotSortKey = (typeof lotSortKeys)[number];

export const lotsListQuerySchema = listQuerySchema(lotSortKeys, 'code').extend({
  style: wineStyleSchema.optional(),
  tankId: z.uuid({ error: 'Not a valid tank.' }).optional(),
});
export type LotsListQuery = z.infer<typeof lotsListQuerySchema>;

// ---------------------------------------------------------------------------
// Lab results
// ---------------------------------------------------------------------------

export const discPointSchema = z.object({
  timeS: num('the time')
    .min(0, { error: 'Times start at 0 s.' })
    .max(TEST_TIME_MAX_S, { error: 'A disc test lasts less than a day.' }),
  volumeMl: num('the volume').min(0, { error: 'Volumes cannot be negative.' }).max(1_000_000, { error: 'That volume is too large for a disc test.' }),
});

export const labResultInputSchema = z
  .object({
    sampledAt: z.iso.datetime({ offset: true, error: 'Enter when the sample was taken.' }).refine(yearInRange, { error: yearRangeMessage }),
    turbidityNtu: optionalNum('the turbidity')
        .min(0, { error: 'Turbidity cannot be negative.' })
        .max(TURBIDITY_MAX_NTU, { error: `Turbidity is at most ${TURBIDITY_MAX_NTU} NTU.` })
        .nullable()
        .optional(),
    t200s: optionalNum('the time to 200 mL').positive({ error: 'The time to 200 mL must be more than 0 s.' }).max(TEST_TIME_MAX_S).nullable().optional(),
    t400s: optionalNum('the time to 400 mL').positive({ error: 'The time to 400 mL must be more than 0 s.' }).max(TEST_TIME_MAX_S).nullable().optional(),
    discPoints: z
      .array(discPointSchema, { error: 'Disc test points are a list of time and volume.' })
      .max(DISC_POINTS_MAX, { error: `At most ${DISC_POINTS_MAX} disc test points.` })
      .nullable()
      .optional(),
    discDiameterMm: optionalNum('the disc diameter')
        .min(DISC_DIAMETER_MIN_MM, { error: `The disc diameter is at least ${DISC_DIAMETER_MIN_MM} mm.` })
        .max(DISC_DIAMETER_MAX_MM, { error: `The disc diameter is at most ${DISC_DIAMETER_MAX_MM} mm.` })
        .nullable()
        .optional(),
    discPressureBar: optionalNum('the test pressure')
        .positive({ error: 'The test pressure must be more than zero.' })
        .max(DISC_PRESSURE_MAX_BAR, { error: `The test pressure is at most ${DISC_PRESSURE_MAX_BAR} bar.` })
        .nullable()
        .optional(),
    freeSo2MgL: optionalNum('the free SO₂')
        .min(0, { error: 'Free SO₂ cannot be negative.' })
        .max(FREE_SO2_MAX_MG_L, { error: `Free SO₂ is at most ${FREE_SO2_MAX_MG_L} mg/L.` })
        .nullable()
        .optional(),
    notes: notesSchema,
  })
  .superRefine((v, ctx) => {
    const has = (x: number | null | undefined) => x !== null && x !== undefined;
    if (has(v.t200s) !== has(v.t400s)) {
      ctx.addIssue({
        code: 'custom',
        path: [has(v.t200s) ? 't400s' : 't200s'],
        message: 'Enter both times of the clogging test (200 mL and 400 mL), or neither.',
      });
    } else if (has(v.t200s) && has(v.t400s) && v.t400s! <= v.t200s!) {
      ctx.addIssue({
        code: 'custom',
        path: ['t400s'],
        message: 'The time to 400 mL must be longer than the time to 200 mL: both count from the start of the test.',
      });
    }
    const points = v.discPoints ?? [];
    if (points.length > 0) {
      if (!has(v.discDiameterMm)) ctx.addIssue({ code: 'custom', path: ['discDiameterMm'], message: 'Enter the disc diameter of the test.' });
      if (points.length < 3) ctx.addIssue({ code: 'custom', path: ['discPoints'], message: 'A disc test needs at least 3 points.' });
    }
    const hasTest = has(v.turbidityNtu) || has(v.t200s) || points.length > 0 || has(v.freeSo2MgL) || v.notes.trim() !== '';
    if (!hasTest) {
      ctx.addIssue({ code: 'custom', path: ['turbidityNtu'], message: 'Enter at least one result: turbidity, clogging test, disc test, free SO₂ or a note.' });
    }
  });
export type LabResultInput = z.infer<typeof labResultInputSchema>;
/** PATCH of a lab result: any subset of the fields; the merged result is checked as a whole (both clogging times, disc diameter…). */
export const labResultPatchSchema = patchSchemaOf(labResultInputSchema);
export type LabResultPatch = z.output<typeof labResultPatchSchema>;
