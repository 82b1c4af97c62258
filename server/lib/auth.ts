import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import type { Database } from '../db/client';
import { sessionsTable, usersTable } from '../db/schema';

export const SESSION_COOKIE = 'porewise_session';

/** Lucia sessions stored in PostgreSQL. Kept small so the session layer can be swapped later. */
export function createAuth(db: Database, opts: { secureCookies: boolean }) {
  const adapter = new DrizzlePostgreSQLAdapter(db, sessionsTable, usersTable);
  return new Lucia(adapter, {
    sessionExpiresIn: new TimeSpan(30, 'd'),
    sessionCookie: {
      name: SESSION_COOKIE,
      expires: true,
      attributes: { secure: opts.secureCookies, sameSite: 'lax', path: '/' },
    },
    getUserAttributes: (row) => ({
      email: row.email,
      name: row.name,
      units: row.units,
      activeWineryId: row.activeWineryId,
    }),
  });
}

export type Auth = ReturnType<typeof createAuth>;

declare module 'lucia' {
  interface Register {
    Lucia: Auth;
    DatabaseUserAttributes: {
      email: string;
      name: string;
      units: 'metric' | 'us';
      activeWineryId: string | null;
    };
  }
}
