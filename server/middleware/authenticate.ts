import type { RequestHandler, Response } from 'express';
import type { Session, User } from 'lucia';
import type { Auth } from '../lib/auth';
import { unauthorized } from '../lib/errors';

export type AuthContext = { user: User; session: Session };

/** Reads the session cookie (if any), validates it and refreshes it when Lucia says so. */
export function authenticate(auth: Auth): RequestHandler {
  return async (req, res, next) => {
    const sessionId = readSessionId(auth, req.headers.cookie ?? '');
    if (sessionId === MALFORMED) {
      // A malformed cookie (bad escape, NUL, wrong alphabet) is simply "signed out", and cleared.
      res.append('Set-Cookie', auth.createBlankSessionCookie().serialize());
      return next();
    }
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

const MALFORMED = Symbol('malformed session cookie');
/** Session ids are Lucia's lowercase base32 ids; anything else cannot name a session. */
const SESSION_ID = /^[a-z0-9]{20,128}$/;

function readSessionId(auth: Auth, cookieHeader: string): string | null | typeof MALFORMED {
  let id: string | null;
  try {
    id = auth.readSessionCookie(cookieHeader);
  } catch {
    return MALFORMED;
  }
  if (id === null) return null;
  return SESSION_ID.test(id) ? id : MALFORMED;
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
