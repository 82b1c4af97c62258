import type { RequestHandler, Response } from 'express';
import type { Session, User } from 'lucia';
import type { Auth } from '../lib/auth';
import { unauthorized } from '../lib/errors';

export type AuthContext = { user: User; session: Session };

/** Reads the session cookie (if any), validates it and refreshes it when Lucia says so. */
export function authenticate(auth: Auth): RequestHandler {
  return async (req, res, next) => {
    const sessionId = auth.readSessionCookie(req.headers.cookie ?? '');
    if (!sessionId) return next();
    const { session, user } = await auth.validateSession(sessionId);
    if (!session) {
      res.append('Set-Cookie', auth.createBlankSessionCookie().serialize());
      return next();
    }
    if (session.fresh) res.append('Set-Cookie', auth.createSessionCookie(session.id).serialize());
    res.locals.auth = { user, session } satisfies AuthContext;
    next();
  };
}

/** 401 unless signed in. */
export const requireSignedIn: RequestHandler = (_req, res, next) => {
  if (!res.locals.auth) throw unauthorized();
  next();
};

export function authOf(res: Response): AuthContext {
  const auth = res.locals.auth as AuthContext | undefined;
  if (!auth) throw unauthorized();
  return auth;
}
