import { z } from 'zod';
import { WINE_STYLES, type WineStyle } from '../engine';
import { isoDateSchema, serialSchema, batchSchema } from './cartridges';
import { uuidSchema } from './common';
import { PAGE_SIZE_DEFAULT, PAGE_SIZE_MAX, SEARCH_MAX } from './list';

/** Paper sizes of the PDF record. */
export const RECORD_PAPERS = ['a4', 'letter'] as const;
export type RecordPaper = (typeof RECORD_PAPERS)[number];

const blankToUndefined = (v: unknown) => (v === '' ? undefined : v);

/** `GET /api/records/lots`: bottled lots, filtered by bottling date, text, style, cartridge serial or batch. */
export const recordLotsQuerySchema = z
  .object({
    from: z.preprocess(blankToUndefined, isoDateSchema.optional()),
    to: z.preprocess(blankToUndefined, isoDateSchema.optional()),
    q: z.preprocess(blankToUndefined, z.string().trim().max(SEARCH_MAX, { error: `Search text is at most ${SEARCH_MAX} characters.` }).optional()),
    style: z.preprocess(blankToUndefined, z.enum(WINE_STYLES as [WineStyle, ...WineStyle[]], { error: `Style is one of: ${WINE_STYLES.join(', ')}.` }).optional()),
    serial: z.preprocess(blankToUndefined, serialSchema.optional()),
    batch: z.preprocess(blankToUndefined, batchSchema.optional()),
    page: z.coerce.number({ error: 'Page is a number.' }).int().min(1, { error: 'Pages start at 1.' }).default(1),
    pageSize: z.coerce.number({ error: 'Page size is a number.' }).int().min(1).max(PAGE_SIZE_MAX, { error: `At most ${PAGE_SIZE_MAX} per page.` }).default(PAGE_SIZE_DEFAULT),
  })
  .refine((v) => !v.from || !v.to || v.from <= v.to, { path: ['to'], error: 'The end date is before the start date.' });
export type RecordLotsQuery = z.infer<typeof recordLotsQuerySchema>;

export const recordPdfQuerySchema = z.object({
  paper: z.preprocess(blankToUndefined, z.enum(RECORD_PAPERS, { error: 'Paper is a4 or letter.' }).default('a4')),
});

/** A SHA-256 fingerprint as printed: 64 hexadecimal characters (spaces and case ignored). */
export const fingerprintSchema = z
  .string({ error: 'Enter the fingerprint printed on the record.' })
  .transform((v) => v.replace(/\s+/g, '').toLowerCase())
  .pipe(z.string().regex(/^[0-9a-f]{64}$/, { error: 'A fingerprint is 64 characters, 0–9 and a–f.' }));

export const verifyRecordInputSchema = z.object({
  lotId: uuidSchema,
  fingerprint: fingerprintSchema,
});
export type VerifyRecordInput = z.infer<typeof verifyRecordInputSchema>;
