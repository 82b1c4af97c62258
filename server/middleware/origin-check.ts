import type { RequestHandler } from 'express';
import { HttpError } from '../lib/errors';

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request protection: a state-changing request must carry an Origin header naming
 * this server (its Host) or one of the configured origins.
 */
export function originCheck(allowedOrigins: string[]): RequestHandler {
  const allowed = new Set(allowedOrigins.map((o) => o.replace(/\/$/, '')));
  return (req, _res, next) => {
    if (safeMethods.has(req.method)) return next();
    const origin = req.headers.origin;
    if (origin) {
      let host: string | null = null;
      try {
        host = new URL(origin).host;
      } catch {
        host = null;
      }
      if (allowed.has(origin) || (host && host === req.headers.host)) return next();
    }
    next(new HttpError(403, 'bad_origin', 'This request did not come from the Porewise app (Origin check failed).'));
  };
}
