import { z } from 'zod';

/**
 * The PATCH body of a create schema: every field optional and without its default, so a field
 * left out stays as stored (a `.partial()` would fill defaults and, on a refined object, throws).
 * Each field present is checked by its own rule; the cross-field rules run on the merged record,
 * which the service checks again with the full schema (see `cellar.service.ts`, `patchTank`).
 */
export function patchSchemaOf<Shape extends z.ZodRawShape>(schema: z.ZodObject<Shape>): z.ZodType<Partial<z.output<z.ZodObject<Shape>>>> {
  const fields = Object.fromEntries(
    Object.entries(schema.shape).map(([key, field]) => [key, ((field instanceof z.ZodDefault ? field.removeDefault() : field) as z.ZodType).optional()]),
  );
  return z.object(fields) as unknown as z.ZodType<Partial<z.output<z.ZodObject<Shape>>>>;
}

/** The fields of a parsed patch that were sent (an absent key never overwrites a stored value). */
export function sentFields<T extends object>(patch: T): Partial<T> {
  return Object.fromEntries(Object.entries(patch).filter(([, v]) => v !== undefined)) as Partial<T>;
}
