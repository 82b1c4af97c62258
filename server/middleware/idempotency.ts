import { and, eq } from 'drizzle-orm';
import type { RequestHandler } from 'express';
import type { Database } from '../db/client';
import { idempotencyKeysTable } from '../db/schema';
import { HttpError } from '../lib/errors';

const KEY_PATTERN = /^[A-Za-z0-9_.:-]{8,100}$/;

/**
 * Retried writes: a POST sent with an `Idempotency-Key` header is carried out once per person
 * and key; a retry gets the first answer again instead of a second record. Without the header
 * the request runs as usual.
 */
export function idempotent(db: Database): RequestHandler {
  return async (req, res, next) => {
    const key = req.get('idempotency-key');
    const userId = (res.locals.auth as { user?: { id: string } } | undefined)?.user?.id;
    if (!key || !userId) return next();
    if (!KEY_PATTERN.test(key)) {
      return next(new HttpError(400, 'invalid_input', 'Idempotency-Key must be 8–100 letters, digits or - _ . :'));
    }
    const route = `${req.method} ${req.baseUrl}${req.path}`;
    const [seen] = await db
      .select()
      .from(idempotencyKeysTable)
      .where(and(eq(idempotencyKeysTable.userId, userId), eq(idempotencyKeysTable.key, key)));
    if (seen) {
      if (seen.route !== route) return next(new HttpError(422, 'idempotency_key_reused', 'This Idempotency-Key was used for another request.'));
      res.set('Idempotent-Replay', 'true');
      return res.status(seen.status).json(seen.body);
    }
    const json = res.json.bind(res);
    // The answer is stored before it is sent, so a retry can never overtake it.
    res.json = (body: unknown) => {
      if (res.statusCode < 200 || res.statusCode >= 300) return json(body);
      db.insert(idempotencyKeysTable)
        .values({ userId, key, route, status: res.statusCode, body: body as object })
        .onConflictDoNothing()
        .then(
          () => json(body),
          () => json(body),
        );
      return res;
    };
    next();
  };
}
