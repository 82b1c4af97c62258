import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit } from 'express-rate-limit';

const FIFTEEN_MINUTES = 15 * 60 * 1000;

function tooMany(message: string): RequestHandler {
  return (_req, res) => {
    res.status(429).json({ error: { code: 'rate_limited', message } });
  };
}

const emailOf = (req: Request) => String(req.body?.email ?? '').trim().toLowerCase() || 'none';
const ipOf = (req: Request) => ipKeyGenerator(req.ip ?? '0.0.0.0');

/**
 * Limits on the endpoints that guess or send: failed sign-ins per address and per account,
 * sign-ups per address, reset requests per address and per account. `scale` multiplies every
 * limit (test servers that sign up hundreds of people use a large scale).
 */
export function createAuthRateLimits(scale = 1) {
  const common = { windowMs: FIFTEEN_MINUTES, standardHeaders: 'draft-7' as const, legacyHeaders: false };
  const failedMessage = 'Too many failed sign-ins. Wait 15 minutes, or reset your password.';
  return {
    signIn: [
      rateLimit({ ...common, limit: 10 * scale, skipSuccessfulRequests: true, keyGenerator: ipOf, handler: tooMany(failedMessage) }),
      rateLimit({
        ...common,
        limit: 10 * scale,
        skipSuccessfulRequests: true,
        keyGenerator: (req) => `account:${emailOf(req)}`,
        handler: tooMany(failedMessage),
      }),
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
