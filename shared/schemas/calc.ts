// Request bodies of the calculation API (/api/calc/*): the engine's inputs, validated.
import { z } from 'zod';

export const MAX_RUN_POINTS = 20_000;
export const MAX_DISC_POINTS = 2_000;
export const MAX_STAGES = 8;
export const MAX_HOSES = 20;
export const MAX_CARE_CYCLES = 5_000;

const num = (label: string) => z.number({ error: `${label} must be a number.` }).refine(Number.isFinite, { error: `${label} must be a finite number.` });
const positive = (label: string) => num(label).refine((v) => v > 0, { error: `${label} must be greater than 0.` });
const nonNegative = (label: string) => num(label).refine((v) => v >= 0, { error: `${label} cannot be negative.` });

export const wineInputSchema = z.object({
  tempC: num('Wine temperature (°C)').refine((v) => v >= 0 && v <= 60, { error: 'Wine temperature must be between 0 and 60 °C.' }),
  ethanolPctVol: num('Ethanol (% vol)').refine((v) => v >= 0 && v <= 25, { error: 'Ethanol must be between 0 and 25 % vol.' }),
  sugarGPerL: nonNegative('Residual sugar (g/L)').optional(),
  extractFactor: num('Extract factor').refine((v) => v >= 1 && v <= 1.2, { error: 'The extract factor is between 1.00 and 1.20.' }).optional(),
});

export const cartridgeTypeSizingSchema = z.object({
  kind: z.enum(['prefilter', 'membrane'], { error: 'Kind is prefilter or membrane.' }),
  ratingUm: positive('Rating (µm)'),
  areaM2Per10in: positive('Area per 10-inch module (m²)'),
  waterFlowLhPer10in: positive('Clean-water flow per 10-inch (L/h)'),
  waterDpBar: positive('Clean-water ΔP (bar)'),
  waterSpecTempC: num('Clean-water test temperature (°C)').optional(),
  maxDpForwardBar: positive('Maximum forward ΔP (bar)'),
  maxTempC: positive('Maximum temperature (°C)').optional(),
  terminalDpBar: positive('Terminal ΔP (bar)'),
  designFluxLhPer10in: positive('Design flux per 10-inch (L/h)'),
  capacityLPerM2: positive('Capacity to terminal ΔP (L/m²)').optional(),
  regenerable: z.boolean().optional(),
  maxRegenerationsPerLot: z.number().int().min(0).optional(),
  pricePer10in: nonNegative('Price per 10-inch module').optional(),
  currency: z.string().trim().length(3, { error: 'Use a three-letter currency code, e.g. EUR.' }).optional(),
});

export const housingSizingSchema = z.object({
  rounds: z.number().int({ error: 'Rounds is a whole number.' }).min(1).max(200),
  lengthIn: z.union([z.literal(10), z.literal(20), z.literal(30), z.literal(40)], { error: 'Cartridge length is 10, 20, 30 or 40 inches.' }),
  maxPressureBar: positive('Housing pressure rating (bar)'),
  maxTempC: positive('Housing maximum temperature (°C)').optional(),
  holdUpL: nonNegative('Hold-up (L)'),
});

export const sizeTrainInputSchema = z.object({
  wine: wineInputSchema,
  line: z.object({
    bottlesPerHour: positive('Bottles per hour'),
    bottleMl: positive('Bottle volume (mL)'),
    marginPct: nonNegative('Flow margin (%)').optional(),
  }),
  batchL: positive('Lot volume (L)'),
  lineLosses: z
    .object({
      hoses: z
        .array(
          z.object({
            diameterMm: positive('Hose diameter (mm)'),
            lengthM: nonNegative('Hose length (m)'),
            roughnessMm: nonNegative('Roughness (mm)').optional(),
            sumK: nonNegative('Fittings ΣK').optional(),
          }),
        )
        .max(MAX_HOSES),
      staticHeadBar: num('Static head (bar)').optional(),
      fillerInletBar: nonNegative('Filler inlet pressure (bar)').optional(),
    })
    .optional(),
  stages: z
    .array(
      z.object({
        name: z.string().max(80).optional(),
        cartridgeType: cartridgeTypeSizingSchema,
        housing: housingSizingSchema,
        housingCount: z.number().int().min(1).max(20).optional(),
      }),
    )
    .min(1, { error: 'Add at least one stage.' })
    .max(MAX_STAGES, { error: `At most ${MAX_STAGES} stages.` }),
});
export type SizeTrainInput = z.infer<typeof sizeTrainInputSchema>;

export const fitRunInputSchema = z.object({
  points: z
    .array(
      z.object({
        volumeL: nonNegative('Volume (L)'),
        dpBar: positive('ΔP (bar)'),
        flowLh: positive('Flow (L/h)').optional(),
        tempC: num('Temperature (°C)').refine((v) => v >= 0 && v <= 100, { error: 'Temperature must be from 0 to 100 °C.' }).optional(),
      }),
    )
    .min(3, { error: 'At least three readings are needed to fit.' })
    .max(MAX_RUN_POINTS, { error: `At most ${MAX_RUN_POINTS} readings.` }),
  terminalDpBar: positive('Terminal ΔP (bar)').optional(),
  flowLh: positive('Flow (L/h)').optional(),
  currentVolumeL: nonNegative('Current volume (L)').optional(),
  volumeToBottleL: nonNegative('Volume still to bottle (L)').optional(),
  nowMs: num('Time (ms)').optional(),
  tempC: num('Temperature (°C)').refine((v) => v >= 0 && v <= 100, { error: 'Temperature must be from 0 to 100 °C.' }).optional(),
  /** Gauge resolution of the stage, bar (default 0.02). */
  resolutionBar: nonNegative('Gauge resolution (bar)').refine((v) => v <= 1, { error: 'Gauge resolution must be at most 1 bar.' }).optional(),
  /** Run volumes at which the stage was regenerated or changed, L. */
  restartsAtL: z.array(nonNegative('Restart volume (L)')).max(50).optional(),
});
export type FitRunInput = z.infer<typeof fitRunInputSchema>;

export const filterabilityInputSchema = z
  .object({
    t200s: positive('Time for 200 mL (s)').optional(),
    t400s: positive('Time for 400 mL (s)').optional(),
    t600s: positive('Time for 600 mL (s)').optional(),
    disc: z
      .object({
        diameterMm: positive('Disc diameter (mm)'),
        points: z
          .array(z.object({ timeS: nonNegative('Time (s)'), volumeMl: nonNegative('Volume (mL)') }))
          .min(3, { error: 'At least three disc readings are needed.' })
          .max(MAX_DISC_POINTS),
      })
      .optional(),
    sizing: z
      .object({
        batchL: positive('Lot volume (L)'),
        hours: positive('Filtration time (h)'),
        safetyFactor: num('Safety factor').refine((v) => v >= 1, { error: 'The safety factor is at least 1.' }),
        elementAreaM2: positive('Element area (m²)').optional(),
      })
      .optional(),
  })
  .refine((v) => (v.t200s !== undefined) === (v.t400s !== undefined), { path: ['t400s'], error: 'Give both the 200 mL and the 400 mL times.' })
  .refine((v) => v.t200s !== undefined || v.disc !== undefined, { path: ['t200s'], error: 'Give the 200/400 mL times, a disc test, or both.' })
  .refine((v) => !v.sizing || v.disc, { path: ['sizing'], error: 'Sizing by Vmax needs a disc test.' });
export type FilterabilityInput = z.infer<typeof filterabilityInputSchema>;

export const cartridgeLifeInputSchema = z.object({
  ratings: z.object({
    ratedSteamCycles: z.number().int().min(0).optional(),
    ratedHotWaterCycles: z.number().int().min(0).optional(),
    ratedChemicalCycles: z.number().int().min(0).optional(),
    ratedLitres: positive('Rated litres').optional(),
    flowRecoveryMinPct: num('Minimum flow recovery (%)').refine((v) => v > 0 && v <= 100, { error: 'Minimum flow recovery is between 0 and 100 %.' }),
    ratedSteamMinutes: positive('Rated steam minutes').optional(),
  }),
  history: z.object({
    litresFiltered: nonNegative('Litres filtered'),
    waterFlowNewLh: positive('Clean-water flow when new (L/h)').optional(),
    cycles: z
      .array(
        z.object({
          kind: z.enum(['steam', 'hot-water', 'chemical', 'backflush'], { error: 'Cycle kind is steam, hot-water, chemical or backflush.' }),
          tempC: num('Cycle temperature (°C)').optional(),
          durationMin: nonNegative('Duration (min)').optional(),
          agent: z.string().max(120).optional(),
          waterFlowBeforeLh: nonNegative('Flow before (L/h)').optional(),
          waterFlowAfterLh: nonNegative('Flow after (L/h)').optional(),
          seq: z.number().int().optional(),
          atMs: num('Time (ms)').optional(),
        }),
      )
      .max(MAX_CARE_CYCLES),
    integrity: z.array(z.object({ pass: z.boolean(), atMs: num('Time (ms)').optional() })).max(MAX_CARE_CYCLES).optional(),
  }),
  options: z
    .object({
      cyclesPerWeek: positive('Cycles per week').optional(),
      nowMs: num('Time (ms)').optional(),
      integrityRule: z.enum(['latest', 'any']).optional(),
    })
    .optional(),
});
export type CartridgeLifeInput = z.infer<typeof cartridgeLifeInputSchema>;
