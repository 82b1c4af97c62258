import type { RequestHandler } from 'express';
import type { z, ZodError, ZodType } from 'zod';
import { badRequest } from '../lib/errors';

/** Field path → first message, the shape clients show beside each field. */
export function zodFieldMessages(error: ZodError): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_';
    fields[key] ??= issue.message;
  }
  return fields;
}

/** The path of the first string holding a NUL character (PostgreSQL text cannot store it). */
function nulPath(value: unknown, path: string[] = []): string[] | null {
  if (typeof value === 'string') return value.includes('\u0000') ? path : null;
  if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      const found = nulPath(v, [...path, k]);
      if (found) return found;
    }
  }
  return null;
}

export function parseOrThrow<S extends ZodType>(schema: S, value: unknown): z.output<S> {
  const nul = nulPath(value);
  if (nul) throw badRequest('Check the highlighted fields.', { [nul.join('.') || '_']: 'Remove the control character (NUL) from this text.' });
  const result = schema.safeParse(value);
  if (!result.success) throw badRequest('Check the highlighted fields.', zodFieldMessages(result.error));
  return result.data;
}

/** Validates `req.body` with a shared zod schema and stores the parsed value in `res.locals.body`. */
export function validateBody<S extends ZodType>(schema: S): RequestHandler {
  return (req, res, next) => {
    res.locals.body = parseOrThrow(schema, req.body ?? {});
    next();
  };
}

export function validateQuery<S extends ZodType>(schema: S): RequestHandler {
  return (req, res, next) => {
    res.locals.query = parseOrThrow(schema, req.query ?? {});
    next();
  };
}
