import { z } from 'zod';
import { uuidSchema, yearInRange, yearRangeMessage } from './common';

export const CLIENT_KEY_MAX = 100;
export const RUN_NOTES_MAX = 2000;

export const OVERRIDE_REASON_MAX = 1000;
export const CORRECTION_REASON_MAX = 1000;
export const RUN_CHANGE_CARTRIDGES_MAX = 60;

const reasonSchema = (what: string, max: number) =>
  z
    .string({ error: `Write why ${what}.` })
    .trim()
    .min(3, { error: `Write why ${what} (a few words at least).` })
    .max(max, { error: `Keep the reason under ${String(max)} characters.` });

export const startRunInputSchema = z.object({
  planLotId: uuidSchema,
  /** A cellar master's or owner's written reason to start despite type mismatch, partial fill or spent cartridges. */
  override: z.object({ reason: reasonSchema('the run starts anyway', OVERRIDE_REASON_MAX) }).optional(),
});

/** The start checks: codes a run can be blocked by, and which of them a cellar master or owner may override. */
export const runBlockCodes = ['housing_empty', 'housing_partial', 'type_mismatch', 'housing_shared', 'cartridge_retired', 'cartridge_spent', 'integrity_failed', 'no_housing'] as const;
export type RunBlockCode = (typeof runBlockCodes)[number];
export const overridableBlockCodes: readonly RunBlockCode[] = ['housing_partial', 'type_mismatch', 'cartridge_spent'];
export type RunBlockReason = { stageIndex: number; code: RunBlockCode; message: string };
export type StartRunInput = z.infer<typeof startRunInputSchema>;

const bar = (what: string) =>
  z
    .number({ error: `Enter the ${what} pressure in bar.` })
    .min(-1, { error: `The ${what} pressure cannot be below −1 bar.` })
    .max(100, { error: `The ${what} pressure looks too high (over 100 bar).` });

export const logReadingInputSchema = z.object({
  clientKey: z.string({ error: 'The reading needs its key.' }).trim().min(1, { error: 'The reading needs its key.' }).max(CLIENT_KEY_MAX),
  stageIndex: z.number({ error: 'Choose the stage.' }).int({ error: 'Choose the stage.' }).min(0, { error: 'Choose the stage.' }).max(20),
  volumeL: z.number({ error: 'Enter the litres through the train so far.' }).min(0, { error: 'Litres cannot be negative.' }).max(10_000_000),
  upstreamBar: bar('upstream'),
  downstreamBar: bar('downstream'),
  flowLh: z.number({ error: 'Enter the flow as a number, or leave it empty.' }).positive({ error: 'Flow must be above zero.' }).max(1_000_000).nullish(),
  tempC: z.number({ error: 'Enter the temperature as a number, or leave it empty.' }).min(-10).max(150).nullish(),
  at: z.iso
    .datetime({ offset: true, error: 'Enter when it was read as a date and time.' })
    .refine(yearInRange, { error: yearRangeMessage })
    .optional(),
});
export type LogReadingInput = z.infer<typeof logReadingInputSchema>;

const cartridgeIdsSchema = z.array(uuidSchema).max(RUN_CHANGE_CARTRIDGES_MAX).default([]);

export const runChangeInputSchema = z
  .object({
    stageIndex: z.number({ error: 'Choose the stage.' }).int({ error: 'Choose the stage.' }).min(0, { error: 'Choose the stage.' }).max(20),
    atVolumeL: z.number({ error: 'Enter the litres through the train at the change.' }).min(0, { error: 'Litres cannot be negative.' }).max(10_000_000),
    removedCartridgeIds: cartridgeIdsSchema,
    installedCartridgeIds: cartridgeIdsSchema,
    kind: z.enum(['change', 'regeneration'], { error: 'Choose a change or a regeneration.' }),
    /** For a regeneration: the care cycle it was (counted on the cartridges). */
    cycleKind: z.enum(['hot-water', 'steam', 'chemical', 'backflush'], { error: 'Choose how they were regenerated.' }).default('hot-water'),
  })
  .superRefine((v, ctx) => {
    if (v.kind === 'change' && v.removedCartridgeIds.length + v.installedCartridgeIds.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['removedCartridgeIds'], message: 'Choose the cartridges that came out or went in.' });
    }
    if (v.kind === 'regeneration' && v.removedCartridgeIds.length === 0) {
      ctx.addIssue({ code: 'custom', path: ['removedCartridgeIds'], message: 'Choose the cartridges that were regenerated in place.' });
    }
    if (new Set(v.removedCartridgeIds).size !== v.removedCartridgeIds.length || new Set(v.installedCartridgeIds).size !== v.installedCartridgeIds.length) {
      ctx.addIssue({ code: 'custom', path: ['installedCartridgeIds'], message: 'Each cartridge once.' });
    }
    if (v.kind === 'change' && v.installedCartridgeIds.some((id) => v.removedCartridgeIds.includes(id))) {
      ctx.addIssue({ code: 'custom', path: ['installedCartridgeIds'], message: 'A cartridge cannot come out and go in at the same change.' });
    }
  });
export type RunChangeInput = z.infer<typeof runChangeInputSchema>;

export const correctReadingInputSchema = z.object({
  volumeL: z.number({ error: 'Enter the litres through the train.' }).min(0, { error: 'Litres cannot be negative.' }).max(10_000_000),
  upstreamBar: bar('upstream'),
  downstreamBar: bar('downstream'),
  flowLh: z.number({ error: 'Enter the flow as a number, or leave it empty.' }).positive({ error: 'Flow must be above zero.' }).max(1_000_000).nullish(),
  tempC: z.number({ error: 'Enter the temperature as a number, or leave it empty.' }).min(-10).max(150).nullish(),
  reason: reasonSchema('the reading is corrected', CORRECTION_REASON_MAX),
});
export type CorrectReadingInput = z.infer<typeof correctReadingInputSchema>;

export const voidReadingInputSchema = z.object({
  reason: reasonSchema('the reading is voided', CORRECTION_REASON_MAX),
});
export type VoidReadingInput = z.infer<typeof voidReadingInputSchema>;

/** Readings one batch request may carry (a phone's waiting readings, a logger's stretch). */
export const READINGS_BATCH_MAX = 1000;

export const logReadingsBatchInputSchema = z.object({
  readings: z
    .array(logReadingInputSchema)
    .min(1, { error: 'Send at least one reading.' })
    .max(READINGS_BATCH_MAX, { error: `Send at most ${READINGS_BATCH_MAX.toLocaleString('en')} readings in one request.` }),
});
export type LogReadingsBatchInput = z.infer<typeof logReadingsBatchInputSchema>;

export const closeRunInputSchema = z.object({
  notes: z.string().trim().max(RUN_NOTES_MAX).optional(),
});
export type CloseRunInput = z.infer<typeof closeRunInputSchema>;

/** Readings a page of a run's readings table holds at most. */
export const RUN_READINGS_PAGE_MAX = 100;

/** `GET /api/runs/:id/readings?stage=&page=&pageSize=`: one stage (or all when left out), newest first. */
export const runReadingsQuerySchema = z.object({
  stage: z.coerce.number({ error: 'Stage is a number.' }).int({ error: 'Stage is a whole number.' }).min(0, { error: 'Stages start at 0.' }).max(20, { error: 'A train has at most 21 stages.' }).optional(),
  page: z.coerce.number({ error: 'Page is a number.' }).int({ error: 'Page is a whole number.' }).min(1, { error: 'Pages start at 1.' }).max(100_000, { error: 'That page is too far.' }).default(1),
  pageSize: z.coerce
    .number({ error: 'Page size is a number.' })
    .int({ error: 'Page size is a whole number.' })
    .min(1, { error: 'At least 1 per page.' })
    .max(RUN_READINGS_PAGE_MAX, { error: `At most ${String(RUN_READINGS_PAGE_MAX)} per page.` })
    .default(10),
});
export type RunReadingsQuery = z.output<typeof runReadingsQuerySchema>;
