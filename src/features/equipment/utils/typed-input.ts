// Reading what a person typed in a form, in their own units, into the stored (metric) value.
import { zodResolver } from '@hookform/resolvers/zod';
import type { FieldValues, Resolver } from 'react-hook-form';
import { z } from 'zod';
import { parseNumberText } from '@/lib/number-input';
import type { QuantityKind } from '@/lib/units';

/**
 * The number in a text field with the person's decimal mark (src/lib/number-input.ts): empty →
 * undefined, not a number → NaN.
 */
export function parseTyped(text: string | undefined | null): number | undefined {
  return parseNumberText(text) ?? undefined;
}

type FromInput = (kind: QuantityKind, typed: number) => number;

/** A typed quantity in the person's units → stored metric value (undefined when empty, NaN when not a number). */
export function typedQuantity(fromInput: FromInput, kind: QuantityKind, text: string | undefined) {
  const n = parseTyped(text);
  return n === undefined || Number.isNaN(n) ? n : fromInput(kind, n);
}

/** Like {@link typedQuantity}, but an empty field means "none" (null). */
export function typedOptionalQuantity(fromInput: FromInput, kind: QuantityKind, text: string | undefined) {
  return typedQuantity(fromInput, kind, text) ?? null;
}

/** A plain number (no unit); empty → undefined. */
export const typedNumber = (text: string | undefined) => parseTyped(text);

/** A plain number where empty means "none" (null). */
export const typedOptionalNumber = (text: string | undefined) => parseTyped(text) ?? null;

/**
 * A react-hook-form resolver that turns the typed strings into the request body, then checks it
 * with the shared request schema, so the form shows the same field messages as the server.
 */
export function bodyResolver<F extends FieldValues, O>(schema: z.ZodType<O>, toBody: (values: F) => unknown): Resolver<F, unknown, O> {
  const onForm = z.preprocess((values) => toBody(values as F), schema) as unknown as z.ZodType<O, F>;
  return zodResolver(onForm) as unknown as Resolver<F, unknown, O>;
}

/** The typed string for a form field from a stored metric value. */
export const inputText = (value: number | null | undefined) => (value === null || value === undefined ? '' : String(value));
