import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';

const FIFTEEN_MINUTES = 15 * 60 * 1000;

function tooMany(message: string): RequestHandler {
  return (_req, res) => {
    res.status(429).json({ error: { code: 'rate_limited', message } });
  };
}

/** The e-mail of an unvalidated body, only if it is a string (never String() of client input). */
const emailOf = (req: Request) => {
  const email: unknown = (req.body as { email?: unknown } | undefined)?.email;
  return (typeof email === 'string' ? email.trim().toLowerCase().slice(0, 320) : '') || 'none';
};
const ipOf = (req: Request) => ipKeyGenerator(req.ip ?? '0.0.0.0');

/** Failures per account (any address) before sign-ins for it start to slow down. */
export const ACCOUNT_SLOWDOWN_AFTER = 5;
export const ACCOUNT_DELAY_START_MS = 100;
export const ACCOUNT_DELAY_MAX_MS = 5_000;

/** The delay before answering a sign-in for an account with `failures` recent failures. */
export function accountDelayMs(failures: number, scale = 1): number {
  const over = failures - ACCOUNT_SLOWDOWN_AFTER * scale;
  if (over <= 0) return 0;
  return Math.min(ACCOUNT_DELAY_MAX_MS, ACCOUNT_DELAY_START_MS * 2 ** Math.min(over - 1, 20));
}

/**
 * Per account alone, failed sign-ins only slow answers down (a growing delay, at most 5 s), so
 * someone guessing from many addresses is slowed while the person with the right password is
 * never locked out by someone else's failures. Counts live in memory for 15 minutes.
 */
function accountSlowdown(scale: number): RequestHandler {
  const failures = new Map<string, { count: number; since: number }>();
  const MAX_ENTRIES = 100_000;
  return async (req, res, next) => {
    const key = emailOf(req);
    const now = Date.now();
    let entry = failures.get(key);
    if (entry && now - entry.since > FIFTEEN_MINUTES) {
      failures.delete(key);
      entry = undefined;
    }
    const delay = accountDelayMs(entry?.count ?? 0, scale);
    res.on('finish', () => {
      if (res.statusCode === 401) {
        const current = failures.get(key);
        if (current) current.count += 1;
        else {
          if (failures.size >= MAX_ENTRIES) failures.delete(failures.keys().next().value!);
          failures.set(key, { count: 1, since: Date.now() });
        }
      } else if (res.statusCode < 300) failures.delete(key);
    });
    if (delay) await new Promise((r) => setTimeout(r, delay));
    next();
  };
}

/**
 * Limits on the endpoints that guess or send: failed sign-ins per address and per (account,
 * address) answer 429; per account alone only a growing delay (see accountSlowdown). Sign-ups
 * per address, reset requests per address and per account. `scale` multiplies every limit (test
 * servers that sign up hundreds of people use a large scale).
 */
export function createAuthRateLimits(scale = 1) {
  const common = { windowMs: FIFTEEN_MINUTES, standardHeaders: 'draft-7' as const, legacyHeaders: false };
  const failedMessage = 'Too many failed sign-ins. Wait 15 minutes, or reset your password.';
  return {
    signIn: [
      rateLimit({ ...common, limit: 30 * scale, skipSuccessfulRequests: true, keyGenerator: ipOf, handler: tooMany(failedMessage) }),
      rateLimit({
        ...common,
        limit: 10 * scale,
        skipSuccessfulRequests: true,
        keyGenerator: (req) => `account:${emailOf(req)}|${ipOf(req)}`,
        handler: tooMany(failedMessage),
      }),
      accountSlowdown(scale),
    ],
    signUp: [
      rateLimit({ ...common, windowMs: 60 * 60 * 1000, limit: 20 * scale, keyGenerator: ipOf, handler: tooMany('Too many sign-ups from this address. Try again in an hour.') }),
    ],
    passwordResetConfirm: [
      rateLimit({ ...common, limit: 10 * scale, keyGenerator: ipOf, handler: tooMany('Too many attempts. Try again in 15 minutes.') }),
    ],
    passwordReset: [
      rateLimit({ ...common, limit: 10 * scale, keyGenerator: ipOf, handler: tooMany('Too many reset requests. Try again in 15 minutes.') }),
      rateLimit({ ...common, limit: 5 * scale, keyGenerator: (req) => `account:${emailOf(req)}`, handler: tooMany('Too many reset requests for this account. Try again in 15 minutes.') }),
    ],
  };
}
