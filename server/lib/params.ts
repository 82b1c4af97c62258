import type { Request } from 'express';
import { z } from 'zod';
import { notFound } from './errors';

const uuid = z.uuid();

/** A record id from the URL. Anything that is not a UUID cannot name a record: 404, like a missing one. */
export function idParam(req: Request, name = 'id', what = 'Record'): string {
  const value = req.params[name];
  if (typeof value !== 'string' || !uuid.safeParse(value).success) throw notFound(what);
  return value;
}
