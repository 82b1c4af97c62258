import { createHash } from 'node:crypto';
import type { RequestHandler, Response } from 'express';
import { LRUCache } from 'lru-cache';
import { authOf } from './authenticate';
import { tenantOf } from './authorize';

/**
 * Read answers kept in this process, keyed on everything they are worked out from:
 *
 * - the winery's data version, read with the session in the request's first (and on a reuse,
 *   only) round trip. Every commit that writes the winery's data raises it (triggers,
 *   migrations 0024–0025, whoever writes: the app on any instance, an import, psql), and the
 *   version is read before the answer's own queries, so an answer is never older than the
 *   version it is kept under. Another instance's write is seen on the next request here;
 * - the person, their role and the address with its query;
 * - the clock, in steps of `CLOCK_STEP_MS`: answers that say "overdue" or "due in 3 days"
 *   move on with time even when nothing is written.
 *
 * Nothing is written from here: a kept answer is a copy of what the handler answered, with its
 * ETag worked out once.
 */
export type AnswerCache = {
  /** Route middleware for GET answers worked out only from the winery's data, the person and the clock. */
  readonly reuse: RequestHandler;
  readonly stats: () => { entries: number; bytes: number; reused: number; stored: number };
};

/** How far the clock may move under a kept answer. */
export const CLOCK_STEP_MS = 10_000;

type Kept = { body: Buffer; etag: string };

/** Express's own (weak) ETag form: length and SHA-1 of the body. */
function weakTag(body: Buffer): string {
  return `W/"${body.length.toString(16)}-${createHash('sha1').update(body).digest('base64').slice(0, 27)}"`;
}

function sendKept(res: Response, kept: Kept) {
  res.set('ETag', kept.etag);
  res.type('json');
  res.send(kept.body);
}

export function createAnswerCache({ maxBytes, now = Date.now }: { maxBytes: number; now?: () => number }): AnswerCache {
  const kept = maxBytes > 0 ? new LRUCache<string, Kept>({ maxSize: maxBytes, sizeCalculation: (v, k) => v.body.length + k.length + 64 }) : null;
  let reused = 0;
  let stored = 0;
  const reuse: RequestHandler = (req, res, next) => {
    const { user } = authOf(res);
    const tenant = tenantOf(res);
    if (!kept || req.method !== 'GET' || user.dataVersion === null) return next();
    const key = `${tenant.wineryId} ${user.dataVersion} ${tenant.userId} ${tenant.role} ${String(Math.floor(now() / CLOCK_STEP_MS))} ${req.originalUrl}`;
    const hit = kept.get(key);
    if (hit) {
      reused++;
      return sendKept(res, hit);
    }
    const json = res.json.bind(res);
    res.json = (answer: unknown) => {
      if (res.statusCode !== 200) return json(answer);
      const body = Buffer.from(JSON.stringify(answer));
      const entry = { body, etag: weakTag(body) };
      kept.set(key, entry);
      stored++;
      sendKept(res, entry);
      return res;
    };
    next();
  };
  return {
    reuse,
    stats: () => ({ entries: kept?.size ?? 0, bytes: kept?.calculatedSize ?? 0, reused, stored }),
  };
}
