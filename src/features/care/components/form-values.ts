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

/** Parses typed text the way the forms do, for live previews. */
export const parseTyped = (s: string | undefined) => decimalText.parse(s ?? '');

/** Converts a parsed number from the person's units to metric; leaves null and NaN for the schema to judge. */
export function toMetricOrKeep(fromInput: (kind: QuantityKind, v: number) => number, kind: QuantityKind, v: number | null) {
  return v === null || !Number.isFinite(v) ? v : fromInput(kind, v);
}

/** A finite number or undefined. */
export const finite = (v: number | null | undefined) => (v !== null && v !== undefined && Number.isFinite(v) ? v : undefined);

/** A request schema as the last step of a form schema: the form's own step converts, this one validates like the server. */
export const requestSchema = <S extends z.ZodType>(schema: S) => schema as unknown as z.ZodType<z.output<S>, any>;

/** "yyyy-MM-ddTHH:mm" in local time, for a datetime-local field. */
export function localDateTime(d: Date) {
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

/** A datetime-local value as ISO, or undefined (now) when empty. */
export function isoOrNow(local: string) {
  if (!local) return undefined;
  const d = new Date(local);
  return Number.isNaN(d.getTime()) ? local : d.toISOString();
}
