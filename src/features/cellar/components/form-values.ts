// Form text → request values: numbers typed with a decimal point or comma, in the person's units.
import { z } from 'zod';
import type { QuantityKind } from '@shared/engine';
import { parseNumberText } from '@/lib/number-input';

/**
 * Typed text → number with the person's decimal mark (src/lib/number-input.ts); empty → null;
 * anything else → NaN, which the request schema rejects with its message.
 */
export const decimalText = z
  .string()
  .trim()
  .transform((s) => parseNumberText(s));

/** Converts a parsed number from the person's units to metric; leaves null and NaN for the schema to judge. */
export function toMetricOrKeep(fromInput: (kind: QuantityKind, v: number) => number, kind: QuantityKind, v: number | null) {
  return v === null || !Number.isFinite(v) ? v : fromInput(kind, v);
}

/** A number as form text (empty for null). */
export const numberText = (v: number | null | undefined) => (v === null || v === undefined ? '' : String(v));

/**
 * A request schema as the last step of a form schema (`.pipe(…)`): the form's own step turns text
 * in the person's units into metric numbers, this step validates them exactly like the server does.
 */
export const requestSchema = <S extends z.ZodType>(schema: S) => schema as unknown as z.ZodType<z.output<S>, any>;
