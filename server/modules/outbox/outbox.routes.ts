import { timingSafeEqual } from 'node:crypto';
import { Router, type Request, type RequestHandler, type Response } from 'express';
import type { OutboxMessageDto } from '../../../shared/types/api';
import type { Database } from '../../db/client';
import { HttpError } from '../../lib/errors';
import type { FakeSmtp } from '../../lib/fake-services';
import { authorize } from '../../middleware/authorize';

/** Header alternative to `?key=` for scripts. */
export const OUTBOX_KEY_HEADER = 'x-outbox-key';

const noSuchEndpoint = () => new HttpError(404, 'not_found', 'No such endpoint.');

function sameKey(given: unknown, key: string | undefined): boolean {
  if (!key || typeof given !== 'string' || given.length !== key.length) return false;
  return timingSafeEqual(Buffer.from(given), Buffer.from(key));
}

/** Runs a middleware and reports whether it let the request through. */
function passes(handler: RequestHandler, req: Request, res: Response): Promise<boolean> {
  return new Promise((resolve) => {
    // A middleware may refuse by calling next(err), by rejecting, or by throwing at once.
    try {
      Promise.resolve(handler(req, res, (err?: unknown) => resolve(!err))).catch(() => resolve(false));
    } catch {
      resolve(false);
    }
  });
}

/**
 * Development only: the messages the local fake SMTP server received, newest first. Mounted only
 * when the fake mail server is in use, never with a real SMTP relay. It holds reset links, so it
 * opens only for a signed-in owner, or with the secret key `npm start` prints beside the URL
 * (`?key=` or the X-Outbox-Key header); everyone else gets the same 404 as a missing endpoint.
 */
export function outboxRoutes({ outbox, db, key }: { outbox: FakeSmtp; db: Database; key?: string }) {
  const router = Router();
  const ownerOnly = authorize(db, 'mail-outbox:read');
  router.get('/', async (req, res) => {
    const keyOk = sameKey(req.query.key, key) || sameKey(req.get(OUTBOX_KEY_HEADER), key);
    if (!keyOk && !(res.locals.auth && (await passes(ownerOnly, req, res)))) throw noSuchEndpoint();
    const items: OutboxMessageDto[] = outbox.messages
      .slice(-200)
      .reverse()
      .map((m) => ({ id: m.id, to: m.to, subject: m.subject, text: m.text, receivedAt: m.receivedAt.toISOString() }));
    res.json({ items, total: items.length });
  });
  return router;
}
