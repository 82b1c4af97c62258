import type { Request, RequestHandler, Response } from 'express';
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
 * string and the headers must be well-formed text (no NUL, no lone surrogate). Routes that take
 * no input through withBody (or read a query without withQuery) are covered too.
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

/**
 * The typed handler idiom: the schema that checks the input is the one that types it.
 *
 *   router.patch('/tanks/:id', ...edit, withBody(tankPatchSchema, async (req, res, body) => { … }));
 *
 * `withBody` parses `req.body` (400 with field messages when it does not fit) and hands the parsed
 * value to the handler as its third argument, typed `z.output<typeof schema>`; `withQuery` does the
 * same for the query string. Nothing goes through `res.locals`, so a route and its schema cannot
 * drift apart without a type error (ESLint refuses `res.locals.body` and `res.locals.query`).
 */
export type TypedHandler<T> = (req: Request, res: Response, input: T) => unknown;

export function withBody<S extends ZodType>(schema: S, handler: TypedHandler<z.output<S>>): RequestHandler {
  return async (req, res) => {
    await handler(req, res, parseOrThrow(schema, req.body ?? {}));
  };
}

export function withQuery<S extends ZodType>(schema: S, handler: TypedHandler<z.output<S>>): RequestHandler {
  return async (req, res) => {
    await handler(req, res, parseOrThrow(schema, req.query ?? {}));
  };
}
