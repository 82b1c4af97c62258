import { createHash } from 'node:crypto';
import type { RequestHandler } from 'express';
import type { Database } from '../db/client';
import { HttpError } from '../lib/errors';
import { createIdempotencyRepository } from './idempotency.repository';

const KEY_PATTERN = /^[A-Za-z0-9_.:-]{8,100}$/;
/** Status stored while the first request with a key is still being carried out. */
const PENDING = 0;

/**
 * Retried writes: a POST sent with an `Idempotency-Key` header is carried out once per person
 * and key; a retry gets the first answer again instead of a second record. The key is bound to
 * the request (method, path, active winery and body): reusing it for anything else is a 422,
 * and a retry that arrives while the first request is still running is a 409. Without the
 * header the request runs as usual.
 */
export function idempotent(db: Database): RequestHandler {
  const keys = createIdempotencyRepository(db);
  return async (req, res, next) => {
    const key = req.get('idempotency-key');
    const user = (res.locals.auth as { user?: { id: string; activeWineryId: string | null } } | undefined)?.user;
    if (!key || !user) return next();
    if (!KEY_PATTERN.test(key)) {
      return next(new HttpError(400, 'invalid_input', 'Idempotency-Key must be 8–100 letters, digits or - _ . :'));
    }
    const bodyHash = createHash('sha256').update(JSON.stringify(req.body ?? null)).digest('hex');
    const route = `${req.method} ${req.baseUrl}${req.path} winery=${user.activeWineryId ?? '-'} body=${bodyHash}`;

    // Claim the key first, so two copies of the same request cannot both run.
    const claimed = await keys.claim(user.id, key, route, PENDING);
    if (!claimed) {
      const seen = await keys.find(user.id, key);
      if (!seen || seen.route !== route) {
        return next(new HttpError(422, 'idempotency_key_reused', 'This Idempotency-Key was used for a different request.'));
      }
      if (seen.status === PENDING) {
        return next(new HttpError(409, 'request_in_progress', 'The same request is still being carried out. Try again in a moment.'));
      }
      res.set('Idempotent-Replay', 'true');
      return res.status(seen.status).json(seen.body);
    }

    let stored = false;
    const json = res.json.bind(res);
    // A successful answer is stored before it is sent, so a retry can never overtake it.
    res.json = (body: unknown) => {
      if (res.statusCode < 200 || res.statusCode >= 300) return json(body);
      stored = true;
      keys
        .storeAnswer(user.id, key, res.statusCode, body as object)
        .then(
          () => json(body),
          () => json(body),
        );
      return res;
    };
    // Anything else (an error, a refusal) frees the key, so the request may be sent again.
    res.on('finish', () => {
      if (!stored) void keys.release(user.id, key).catch(() => undefined);
    });
    next();
  };
}
