import { z } from 'zod';
import { uuidSchema, yearInRange, yearRangeMessage } from './common';
import { listQuerySchema } from './list';

export const CARTRIDGE_LENGTHS_IN = [10, 20, 30, 40] as const;
export type CartridgeLengthIn = (typeof CARTRIDGE_LENGTHS_IN)[number];
export const cartridgeStatusValues = ['in-stock', 'installed', 'regenerating', 'retired'] as const;
export type CartridgeStatus = (typeof cartridgeStatusValues)[number];
export const cartridgeEventKindValues = ['registered', 'installed', 'removed', 'retired', 'run', 'cycle', 'integrity', 'note', 'run-correction'] as const;
export type CartridgeEventKind = (typeof cartridgeEventKindValues)[number];

export const SERIAL_MAX = 60;
export const BATCH_MAX = 60;
export const CARTRIDGE_NOTES_MAX = 2000;
export const RETIRE_REASON_MAX = 500;
/** Most rows one delivery file may hold. */
export const IMPORT_MAX_ROWS = 5000;
/** Largest delivery file accepted, bytes. */
export const IMPORT_MAX_BYTES = 2 * 1024 * 1024;
/** Columns of a delivery file, in the order of the template. */
export const IMPORT_COLUMNS = ['serial', 'batch', 'type', 'length', 'received'] as const;

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

/** A calendar date YYYY-MM-DD that exists (2025-02-30 is refused). */
export const isoDateSchema = z
  .string({ error: 'Enter a date as YYYY-MM-DD.' })
  .trim()
  .regex(ISO_DATE, { error: 'Enter a date as YYYY-MM-DD.' })
  .refine(
    (v) => {
      const d = new Date(`${v}T00:00:00Z`);
      return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === v;
    },
    { error: 'That date does not exist.' },
  )
  .refine(yearInRange, { error: yearRangeMessage });

// eslint-disable-next-line no-control-regex -- the point is to find control characters
const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f]/;

export const serialSchema = z
  .string({ error: 'Enter the serial number.' })
  .trim()
  .min(1, { error: 'Enter the serial number.' })
  .max(SERIAL_MAX, { error: `Serial numbers are at most ${SERIAL_MAX} characters.` })
  .refine((v) => !CONTROL_CHARACTERS.test(v), { error: 'Serial numbers cannot hold line breaks, tabs or other control characters.' });

export const batchSchema = z
  .string({ error: 'Enter the batch as text.' })
  .trim()
  .max(BATCH_MAX, { error: `Batches are at most ${BATCH_MAX} characters.` })
  .refine((v) => !CONTROL_CHARACTERS.test(v), { error: 'Batches cannot hold line breaks, tabs or other control characters.' });

const isLength = (v: number): v is CartridgeLengthIn => (CARTRIDGE_LENGTHS_IN as readonly number[]).includes(v);

export const lengthInSchema = z.coerce
  .number({ error: 'Choose a length: 10, 20, 30 or 40 inches.' })
  .refine((v): v is CartridgeLengthIn => (CARTRIDGE_LENGTHS_IN as readonly number[]).includes(v), {
    error: 'Length is 10, 20, 30 or 40 inches.',
  });

const notesSchema = z.string().trim().max(CARTRIDGE_NOTES_MAX, { error: `Notes are at most ${CARTRIDGE_NOTES_MAX} characters.` });

/** An empty field means "no date". */
const optionalDateSchema = z.preprocess((v) => (v === '' ? null : v), isoDateSchema.nullable().optional());

export const createCartridgeInputSchema = z.object({
  serial: serialSchema,
  batch: batchSchema.default(''),
  typeId: z.uuid({ error: 'Choose a cartridge type.' }),
  lengthIn: lengthInSchema,
  receivedAt: optionalDateSchema,
  notes: notesSchema.default(''),
});
export type CreateCartridgeInput = z.infer<typeof createCartridgeInputSchema>;

export const updateCartridgeInputSchema = z
  .object({
    batch: batchSchema.optional(),
    receivedAt: optionalDateSchema,
    notes: notesSchema.optional(),
  })
  .strict();
export type UpdateCartridgeInput = z.infer<typeof updateCartridgeInputSchema>;

export const installCartridgeInputSchema = z.object({
  housingId: z.uuid({ error: 'Choose a housing.' }),
  position: z.preprocess(
    (v) => (v === '' || v === null ? undefined : v),
    z.coerce.number({ error: 'Position is a round number.' }).int({ error: 'Position is a whole number.' }).min(1, { error: 'Rounds start at 1.' }).optional(),
  ),
});
export type InstallCartridgeInput = z.infer<typeof installCartridgeInputSchema>;

export const retireCartridgeInputSchema = z.object({
  reason: z
    .string({ error: 'Say why the cartridge is retired.' })
    .trim()
    .min(1, { error: 'Say why the cartridge is retired.' })
    .max(RETIRE_REASON_MAX, { error: `Reasons are at most ${RETIRE_REASON_MAX} characters.` }),
});
export type RetireCartridgeInput = z.infer<typeof retireCartridgeInputSchema>;

export const cartridgeSortKeys = ['serial', 'batch', 'type', 'lengthIn', 'status', 'housing', 'receivedAt', 'litresFiltered', 'createdAt'] as const;
export type CartridgeSortKey = (typeof cartridgeSortKeys)[number];

const optionalUuid = z.preprocess((v) => (v === '' ? undefined : v), uuidSchema.optional());

export const cartridgeListQuerySchema = listQuerySchema(cartridgeSortKeys, 'serial').extend({
  status: z.preprocess((v) => (v === '' ? undefined : v), z.enum(cartridgeStatusValues, { error: 'Status is in-stock, installed, regenerating or retired.' }).optional()),
  typeId: optionalUuid,
  housingId: optionalUuid,
  batch: z.preprocess((v) => (v === '' ? undefined : v), batchSchema.optional()),
  lengthIn: z.preprocess((v) => (v === '' ? undefined : v), lengthInSchema.optional()),
});
export type CartridgeListQuery = z.infer<typeof cartridgeListQuerySchema>;

export const importQuerySchema = z.object({
  dryRun: z
    .enum(['true', 'false', '1', '0'], { error: 'dryRun is true or false.' })
    .optional()
    .transform((v) => v === 'true' || v === '1'),
});

/** One row of a delivery file, as read from the CSV (strings), checked field by field. */
export const importRowSchema = z.object({
  serial: serialSchema,
  batch: batchSchema,
  type: z.string({ error: 'Enter the cartridge type name.' }).trim().min(1, { error: 'Enter the cartridge type name.' }).max(120),
  length: z
    .string({ error: 'Enter the length in inches.' })
    .trim()
    .min(1, { error: 'Enter the length in inches: 10, 20, 30 or 40.' })
    // "30", "30in", "30 inch" and 30" all mean 30 inches.
    .transform((v) => v.replace(/\s*(in|inch|inches|")$/i, ''))
    .pipe(z.string().regex(/^\d+$/, { error: 'Length is 10, 20, 30 or 40 inches.' }))
    .transform(Number)
    .pipe(z.number().refine(isLength, { error: 'Length is 10, 20, 30 or 40 inches.' })),
  received: z.preprocess((v) => (typeof v === 'string' && v.trim() === '' ? undefined : v), isoDateSchema.optional()),
});
export type ImportRow = z.infer<typeof importRowSchema>;
