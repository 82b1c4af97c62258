import { z } from 'zod';
import { isTimeZone } from '../engine';
import { textSchema } from './text';

/** Largest logger file taken, bytes (100,000 rows of a dozen columns fit with room to spare). */
export const LOGGER_FILE_MAX_BYTES = 20 * 1024 * 1024;
/** Most data rows one logger file may hold. */
export const LOGGER_MAX_ROWS = 100_000;
export const LOGGER_PROFILE_NAME_MAX = 80;
export const LOGGER_COLUMN_MAX = 120;
/** Profiles one winery may keep. */
export const LOGGER_PROFILES_MAX = 200;

/** Units a logger column may be in, as the engine's `convert` writes them. */
export const loggerVolumeUnits = ['L', 'hL', 'gal'] as const;
export const loggerFlowUnits = ['L/h', 'gal/min'] as const;
export const loggerPressureUnits = ['bar', 'psi', 'kPa'] as const;
export const loggerTempUnits = ['degC', 'degF'] as const;

/** What people see for each unit. */
export const loggerUnitLabels: Record<string, string> = {
  L: 'L',
  hL: 'hL',
  gal: 'US gal',
  'L/h': 'L/h',
  'gal/min': 'US gal/min',
  bar: 'bar',
  psi: 'psi',
  kPa: 'kPa',
  degC: '°C',
  degF: '°F',
};

/**
 * Date-time formats offered by name; any other pattern of the tokens YYYY, YY, MM, M, DD, D,
 * HH, H, hh, h, mm, ss, SSS, A (AM/PM) is taken too. `auto` reads ISO 8601 and day-first or
 * month-first dates (decided from the file), `epoch-s` / `epoch-ms` Unix time.
 */
export const loggerTimeFormats = [
  'auto',
  'YYYY-MM-DD HH:mm:ss',
  'DD.MM.YYYY HH:mm:ss',
  'DD/MM/YYYY HH:mm:ss',
  'MM/DD/YYYY hh:mm:ss A',
  'MM/DD/YYYY HH:mm:ss',
  'epoch-s',
  'epoch-ms',
] as const;

export const LOGGER_TIME_FORMAT_PATTERN = /^(auto|epoch-s|epoch-ms|[YMDHhmsSA .:/T,_-]{2,40})$/;


const columnSchema = textSchema({ error: 'Choose the column by its header.' })
  .trim()
  .min(1, { error: 'Choose the column by its header.' })
  .max(LOGGER_COLUMN_MAX, { error: `Column names are at most ${String(LOGGER_COLUMN_MAX)} characters.` });

const unitOf = <T extends readonly [string, ...string[]]>(units: T, what: string) =>
  z.enum(units, { error: `Choose the ${what} unit: ${units.map((u) => loggerUnitLabels[u] ?? u).join(', ')}.` });

/**
 * How to read one logger's export: columns named by their header text, each with its unit.
 * Either litres (volume or totaliser) or a flow to integrate over time, and either upstream
 * with downstream pressure or ΔP, must be given.
 */
export const loggerMappingSchema = z
  .object({
    delimiter: z.enum([',', ';', '\t'], { error: 'Columns are separated by comma, semicolon or tab.' }).optional(),
    decimal: z.enum(['.', ','], { error: 'Choose the decimal mark: point or comma.' }),
    timeZone: textSchema()
      .max(64)
      .refine(isTimeZone, { error: 'Choose a time zone such as Europe/Vienna or America/Los_Angeles.' })
      .optional(),
    time: z.object(
      {
        column: columnSchema,
        format: textSchema()
          .trim()
          .max(40)
          .regex(LOGGER_TIME_FORMAT_PATTERN, { error: 'Use a date-time format such as DD.MM.YYYY HH:mm:ss.' })
          .optional(),
      },
      { error: 'Choose the date-time column.' },
    ),
    volume: z.object({ column: columnSchema, unit: unitOf(loggerVolumeUnits, 'volume'), kind: z.enum(['volume', 'totaliser'], { error: 'Litres through the train, or a totaliser.' }) }).optional(),
    flow: z.object({ column: columnSchema, unit: unitOf(loggerFlowUnits, 'flow') }).optional(),
    upstream: z.object({ column: columnSchema, unit: unitOf(loggerPressureUnits, 'pressure') }).optional(),
    downstream: z.object({ column: columnSchema, unit: unitOf(loggerPressureUnits, 'pressure') }).optional(),
    dp: z.object({ column: columnSchema, unit: unitOf(loggerPressureUnits, 'pressure') }).optional(),
    temp: z.object({ column: columnSchema, unit: unitOf(loggerTempUnits, 'temperature') }).optional(),
  })
  .superRefine((m, ctx) => {
    if (!m.volume && !m.flow) {
      ctx.addIssue({ code: 'custom', path: ['volume'], message: 'Map the litres (through the train or a totaliser), or a flow to add up over time.' });
      ctx.addIssue({ code: 'custom', path: ['flow'], message: 'Map a flow column, or the litres.' });
    }
    if (!m.dp && !(m.upstream && m.downstream)) {
      if (!m.upstream) ctx.addIssue({ code: 'custom', path: ['upstream'], message: 'Map the upstream pressure (with downstream), or the ΔP.' });
      if (!m.downstream) ctx.addIssue({ code: 'custom', path: ['downstream'], message: 'Map the downstream pressure (with upstream), or the ΔP.' });
      ctx.addIssue({ code: 'custom', path: ['dp'], message: 'Map the ΔP, or upstream and downstream pressures.' });
    }
  });
export type LoggerMapping = z.infer<typeof loggerMappingSchema>;

const profileNameSchema = textSchema({ error: 'Name the profile.' })
  .trim()
  .min(1, { error: 'Name the profile, e.g. the logger’s make and model.' })
  .max(LOGGER_PROFILE_NAME_MAX, { error: `Keep the name under ${String(LOGGER_PROFILE_NAME_MAX)} characters.` });

export const loggerProfileInputSchema = z.object({ name: profileNameSchema, mapping: loggerMappingSchema });
export type LoggerProfileInput = z.infer<typeof loggerProfileInputSchema>;

export const loggerProfilePatchSchema = z
  .object({ name: profileNameSchema.optional(), mapping: loggerMappingSchema.optional() })
  .refine((p) => p.name !== undefined || p.mapping !== undefined, { error: 'Change the name or the mapping.', path: ['name'] });
export type LoggerProfilePatch = z.infer<typeof loggerProfilePatchSchema>;

/** The mapping travels in a multipart form as JSON text. */
const mappingFromText = z
  .string()
  .max(20_000, { error: 'The mapping is too long.' })
  .transform((s, ctx) => {
    try {
      return JSON.parse(s) as unknown;
    } catch {
      ctx.addIssue({ code: 'custom', message: 'The mapping is not valid JSON.' });
      return z.NEVER;
    }
  })
  .pipe(loggerMappingSchema);

/** The text fields of the import form: the stage, and a saved profile or a mapping. */
export const loggerImportFieldsSchema = z
  .object({
    stageIndex: z.coerce.number({ error: 'Choose the stage.' }).int({ error: 'Choose the stage.' }).min(0, { error: 'Choose the stage.' }).max(20, { error: 'Choose the stage.' }),
    profileId: z.uuid({ error: 'Choose a saved logger profile.' }).optional(),
    mapping: mappingFromText.optional(),
  })
  .superRefine((v, ctx) => {
    if (!v.profileId && !v.mapping) ctx.addIssue({ code: 'custom', path: ['mapping'], message: 'Choose a logger profile or map the columns.' });
  });
export type LoggerImportFields = z.infer<typeof loggerImportFieldsSchema>;

export const loggerImportQuerySchema = z.object({
  dryRun: z.enum(['true', 'false', '1', '0'], { error: 'dryRun is true or false.' }).optional(),
});
