import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';
import { logger } from '../lib/logger';
import type { RateLimitRepository } from '../modules/auth/rate-limit.repository';
import { PostgresRateLimitStore } from './rate-limit-store';

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
 * never locked out by someone else's failures. Counts live in PostgreSQL for 15 minutes from
 * the first failure, shared by every server instance.
 */
function accountSlowdown(repo: RateLimitRepository, scale: number, namespace: string): RequestHandler {
  return async (req, res, next) => {
    const key = `${namespace}signin-account-failures:${emailOf(req)}`;
    const delay = accountDelayMs((await repo.get(key))?.hits ?? 0, scale);
    res.on('finish', () => {
      const write = res.statusCode === 401 ? repo.increment(key, FIFTEEN_MINUTES) : res.statusCode < 300 ? repo.reset(key) : null;
      void write?.catch((e: unknown) => logger.warn({ message: (e as Error).message }, 'sign-in failure count not stored'));
    });
    if (delay) await new Promise((r) => setTimeout(r, delay));
    next();
  };
}

/**
 * Limits on the endpoints that guess or send: failed sign-ins per address and per (account,
 * address) answer 429; per account alone only a growing delay (see accountSlowdown). Sign-ups
 * per address, reset requests per address and per account. `scale` multiplies every limit (test
 * servers that sign up hundreds of people use a large scale). Every counter lives in PostgreSQL
 * (`rate_limit_hits`), so the limits hold across any number of server instances.
 */
export function createAuthRateLimits(repo: RateLimitRepository, scale = 1, namespace = '') {
  const store = (prefix: string) => ({ store: new PostgresRateLimitStore(repo, namespace + prefix) });
  const common = { windowMs: FIFTEEN_MINUTES, standardHeaders: 'draft-7' as const, legacyHeaders: false };
  const failedMessage = 'Too many failed sign-ins. Wait 15 minutes, or reset your password.';
  return {
    signIn: [
      rateLimit({ ...common, ...store('signin-ip:'), limit: 30 * scale, skipSuccessfulRequests: true, keyGenerator: ipOf, handler: tooMany(failedMessage) }),
      rateLimit({
        ...common,
        ...store('signin-account-ip:'),
        limit: 10 * scale,
        skipSuccessfulRequests: true,
        keyGenerator: (req) => `account:${emailOf(req)}|${ipOf(req)}`,
        handler: tooMany(failedMessage),
      }),
      accountSlowdown(repo, scale, namespace),
    ],
    signUp: [
      rateLimit({ ...common, ...store('signup-ip:'), windowMs: 60 * 60 * 1000, limit: 20 * scale, keyGenerator: ipOf, handler: tooMany('Too many sign-ups from this address. Try again in an hour.') }),
    ],
    passwordResetConfirm: [
      rateLimit({ ...common, ...store('reset-confirm-ip:'), limit: 10 * scale, keyGenerator: ipOf, handler: tooMany('Too many attempts. Try again in 15 minutes.') }),
    ],
    passwordReset: [
      rateLimit({ ...common, ...store('reset-ip:'), limit: 10 * scale, keyGenerator: ipOf, handler: tooMany('Too many reset requests. Try again in 15 minutes.') }),
      rateLimit({ ...common, ...store('reset-account:'), limit: 5 * scale, keyGenerator: (req) => `account:${emailOf(req)}`, handler: tooMany('Too many reset requests for this account. Try again in 15 minutes.') }),
    ],
  };
}
