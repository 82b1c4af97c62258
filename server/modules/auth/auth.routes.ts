import { Router } from 'express';
import {
  passwordResetConfirmInputSchema,
  passwordResetRequestInputSchema,
  signInInputSchema,
  signUpConfirmInputSchema,
  signUpInputSchema,
} from '../../../shared/schemas/auth';
import type { Auth } from '../../lib/auth';
import { authOf } from '../../middleware/authenticate';
import type { createAuthRateLimits } from '../../middleware/rate-limit';
import { withBody } from '../../middleware/validate';
import type { AuthService } from './auth.service';

export function authRoutes(deps: { auth: Auth; service: AuthService; limits: ReturnType<typeof createAuthRateLimits> }) {
  const { auth, service, limits } = deps;
  const router = Router();
  const setSession = (res: import('express').Response, sessionId: string) =>
    res.append('Set-Cookie', auth.createSessionCookie(sessionId).serialize());

  router.post('/sign-up', ...limits.signUp, withBody(signUpInputSchema, async (req, res, body) => {
    // The same answer, at once, for a new and a taken address; the mail is sent in the background.
    void service.requestSignUp(body).catch((err) => req.log?.error({ err }, 'sign-up mail failed'));
    res.status(202).json({ ok: true, checkMail: true });
  }));

  router.post('/sign-up/confirm', ...limits.passwordResetConfirm, withBody(signUpConfirmInputSchema, async (_req, res, body) => {
    const session = await service.confirmSignUp(body);
    setSession(res, session.id);
    res.status(201).json({ ok: true });
  }));

  router.post('/sign-in', ...limits.signIn, withBody(signInInputSchema, async (_req, res, body) => {
    const session = await service.signIn(body);
    setSession(res, session.id);
    res.json({ ok: true });
  }));

  router.post('/sign-out', async (_req, res) => {
    if (res.locals.auth) await auth.invalidateSession(authOf(res).session.id);
    res.append('Set-Cookie', auth.createBlankSessionCookie().serialize());
    res.status(204).end();
  });

  router.post('/password-reset/request', ...limits.passwordReset, withBody(passwordResetRequestInputSchema, async (req, res, body) => {
    // Answer once the reset and its mail job are committed (a crash after the answer loses no mail);
    // the service does the same work for an unknown address, so the time taken tells nothing.
    await service.requestPasswordReset(body.email).catch((err) => req.log?.error({ err }, 'reset mail failed'));
    res.status(202).json({ ok: true });
  }));

  router.post('/password-reset/confirm', ...limits.passwordResetConfirm, withBody(passwordResetConfirmInputSchema, async (_req, res, body) => {
    const session = await service.confirmPasswordReset(body);
    setSession(res, session.id);
    res.json({ ok: true });
  }));

  return router;
}
