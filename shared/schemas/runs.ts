import { z } from 'zod';
import { uuidSchema, yearInRange, yearRangeMessage } from './common';

export const CLIENT_KEY_MAX = 100;
export const RUN_NOTES_MAX = 2000;

export const startRunInputSchema = z.object({
  planLotId: uuidSchema,
});
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
