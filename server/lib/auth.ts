import { DrizzlePostgreSQLAdapter } from '@lucia-auth/adapter-drizzle';
import DataLoader from 'dataloader';
import { and, eq, sql } from 'drizzle-orm';
import { Lucia, TimeSpan, type Adapter, type DatabaseSession, type DatabaseUser } from 'lucia';
import type { Role } from '../../shared/permissions';
import type { Database } from '../db/client';
import { dataVersionOf } from '../db/winery-changes';
import { membershipsTable, sessionsTable, usersTable } from '../db/schema';

export const SESSION_COOKIE = 'porewise_session';

/**
 * The Drizzle adapter, with the per-request lookup replaced by one prepared query: the
 * session, the person (never the password hash), their role in their active winery and its
 * data version.
 */
function sessionAdapter(db: Database): Adapter {
  const base = new DrizzlePostgreSQLAdapter(db, sessionsTable, usersTable);
  // The sessions asked for while the process reads one round of incoming requests are looked up
  // together, in one query (`= any($1)`), when that round is done (setImmediate): under load, a
  // few round trips carry many requests' sessions; alone, a request waits no longer than one
  // turn of the event loop. Nothing is cached: each request still reads its session, role and
  // data version after it arrived.
  const lookupMany = db
    .select({
      id: sessionsTable.id,
      userId: sessionsTable.userId,
      expiresAt: sessionsTable.expiresAt,
      email: usersTable.email,
      name: usersTable.name,
      units: usersTable.units,
      activeWineryId: usersTable.activeWineryId,
      activeRole: membershipsTable.role,
      // The active winery's data version (migrations 0024–0025), read in this same round trip: it
      // keys the stored answers (server/middleware/answer-cache.ts).
      dataVersion: dataVersionOf(usersTable.activeWineryId),
    })
    .from(sessionsTable)
    .innerJoin(usersTable, eq(usersTable.id, sessionsTable.userId))
    .leftJoin(membershipsTable, and(eq(membershipsTable.userId, usersTable.id), eq(membershipsTable.wineryId, usersTable.activeWineryId)))
    .where(sql`${sessionsTable.id} = any(${sql.placeholder('ids')}::text[])`)
    .prepare('porewise_session_lookup_many');
  type Row = Awaited<ReturnType<typeof lookupMany.execute>>[number];
  const sessions = new DataLoader<string, Row | null>(
    async (ids) => {
      const rows = await lookupMany.execute({ ids: [...ids] });
      const byId = new Map(rows.map((r) => [r.id, r]));
      return ids.map((id) => byId.get(id) ?? null);
    },
    { cache: false, maxBatchSize: 200, batchScheduleFn: (dispatch) => setImmediate(dispatch) },
  );
  return {
    getUserSessions: (userId) => base.getUserSessions(userId),
    setSession: (session) => base.setSession(session),
    updateSessionExpiration: (id, expiresAt) => base.updateSessionExpiration(id, expiresAt),
    deleteSession: (id) => base.deleteSession(id),
    deleteUserSessions: (userId) => base.deleteUserSessions(userId),
    deleteExpiredSessions: () => base.deleteExpiredSessions(),
    async getSessionAndUser(id): Promise<[DatabaseSession | null, DatabaseUser | null]> {
      const row = await sessions.load(id);
      if (!row) return [null, null];
      return [
        { id: row.id, userId: row.userId, expiresAt: row.expiresAt, attributes: {} },
        {
          id: row.userId,
          attributes: { email: row.email, name: row.name, units: row.units, activeWineryId: row.activeWineryId, activeRole: row.activeRole, dataVersion: row.dataVersion },
        },
      ];
    },
  };
}

/** Lucia sessions stored in PostgreSQL. Kept small so the session layer can be swapped later. */
export function createAuth(db: Database, opts: { secureCookies: boolean }) {
  return new Lucia(sessionAdapter(db), {
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
      activeRole: row.activeRole,
      dataVersion: row.dataVersion,
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
      /** The person's role in their active winery, read with the session (null if not a member). */
      activeRole: Role | null;
      /** The active winery's data version, read with the session (null without an active winery). */
      dataVersion: string | null;
    };
  }
}
