import type { RequestHandler } from 'express';
import { HttpError } from '../lib/errors';

const safeMethods = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Cross-site request protection: a state-changing request must carry an Origin header naming
 * one of the configured origins (APP_URL and ALLOWED_ORIGINS). The Host header is not trusted.
 */
export function originCheck(allowedOrigins: string[]): RequestHandler {
  const allowed = new Set(allowedOrigins.map((o) => o.replace(/\/$/, '')));
  return (req, _res, next) => {
    if (safeMethods.has(req.method)) return next();
    const origin = req.headers.origin;
    if (origin && allowed.has(origin)) return next();
    next(new HttpError(403, 'bad_origin', 'This request did not come from the Porewise app (Origin check failed).'));
  };
}

/**
 * DNS-rebinding protection: the API answers only requests addressed to one of its own host
 * names (those of APP_URL and ALLOWED_ORIGINS).
 */
export function hostCheck(allowedOrigins: string[]): RequestHandler {
  const hosts = new Set(
    allowedOrigins.flatMap((o) => {
      try {
        return [new URL(o).host.toLowerCase()];
      } catch {
        return [];
      }
    }),
  );
  return (req, _res, next) => {
    const host = (req.headers.host ?? '').toLowerCase();
    if (hosts.has(host)) return next();
    next(new HttpError(421, 'bad_host', 'This server does not answer for that host name. Use the address in APP_URL.'));
  };
}
