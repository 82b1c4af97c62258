import type { RequestHandler } from 'express';
import type { z, ZodError, ZodType } from 'zod';
import { findIllFormedText, textProblem } from '../../shared/schemas/text';
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

export function parseOrThrow<S extends ZodType>(schema: S, value: unknown): z.output<S> {
  // Iterative walk (no recursion, no path copies): NUL and lone surrogates are refused with the field named.
  const bad = findIllFormedText(value);
  if (bad) throw badRequest('Check the highlighted fields.', { [bad.path]: bad.message });
  const result = schema.safeParse(value);
  if (!result.success) throw badRequest('Check the highlighted fields.', zodFieldMessages(result.error));
  return result.data;
}

/**
 * Applied once to every API request, before any route: every string in the JSON body, the query
 * string and the headers must be well-formed text (no NUL, no lone surrogate). Routes that never
 * call validateBody (or read a query without validateQuery) are covered too.
 */
export const wellFormedInput: RequestHandler = (req, _res, next) => {
  const body = findIllFormedText(req.body);
  if (body) throw badRequest('Check the highlighted fields.', { [body.path]: body.message });
  const query = findIllFormedText(req.query);
  if (query) throw badRequest('Check the query string.', { [query.path]: query.message });
  for (const [name, value] of Object.entries(req.headers)) {
    const values = Array.isArray(value) ? value : [value ?? ''];
    for (const v of values) {
      const problem = textProblem(v);
      if (problem) throw badRequest('Check the request headers.', { [`header.${name}`]: problem });
    }
  }
  next();
};

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
