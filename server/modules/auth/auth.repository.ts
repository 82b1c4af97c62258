import { and, eq, gt, isNull } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { membershipsTable, passwordResetsTable, signUpRequestsTable, usersTable, wineriesTable } from '../../db/schema';
import type { Role } from '../../../shared/permissions';

export function createAuthRepository(db: DbOrTx) {
  return {
    async findUserByEmail(email: string) {
      const [row] = await db.select().from(usersTable).where(eq(usersTable.email, email));
      return row ?? null;
    },
    async findUserById(id: string) {
      const [row] = await db.select().from(usersTable).where(eq(usersTable.id, id));
      return row ?? null;
    },
    async insertUser(user: { id: string; email: string; name: string; passwordHash: string; activeWineryId?: string | null }) {
      const [row] = await db.insert(usersTable).values(user).onConflictDoNothing().returning();
      return row ?? null;
    },
    async insertWinery(name: string) {
      const [row] = await db.insert(wineriesTable).values({ name }).returning();
      return row;
    },
    async insertMembership(m: { wineryId: string; userId: string; role: Role }) {
      await db.insert(membershipsTable).values(m).onConflictDoNothing();
    },
    async setActiveWinery(userId: string, wineryId: string | null) {
      await db.update(usersTable).set({ activeWineryId: wineryId }).where(eq(usersTable.id, userId));
    },
    async setPassword(userId: string, passwordHash: string) {
      await db.update(usersTable).set({ passwordHash }).where(eq(usersTable.id, userId));
    },
    async insertPasswordReset(r: { tokenHash: string; userId: string; expiresAt: Date }) {
      await db.insert(passwordResetsTable).values(r);
    },
    /** Ends every other reset link of the person (after one was used). */
    async revokeOpenPasswordResets(userId: string, now: Date) {
      await db
        .update(passwordResetsTable)
        .set({ usedAt: now })
        .where(and(eq(passwordResetsTable.userId, userId), isNull(passwordResetsTable.usedAt)));
    },
    async insertSignUpRequest(r: { tokenHash: string; email: string; name: string; wineryName: string; passwordHash: string; expiresAt: Date }) {
      await db.insert(signUpRequestsTable).values(r);
    },
    /** Marks a valid, unused, unexpired sign-up token as used and returns the request, atomically. */
    async consumeSignUpRequest(tokenHash: string, now: Date) {
      const [row] = await db
        .update(signUpRequestsTable)
        .set({ usedAt: now })
        .where(and(eq(signUpRequestsTable.tokenHash, tokenHash), isNull(signUpRequestsTable.usedAt), gt(signUpRequestsTable.expiresAt, now)))
        .returning();
      return row ?? null;
    },
    /** Marks a valid, unused, unexpired reset token as used and returns its user, atomically. */
    async consumePasswordReset(tokenHash: string, now: Date) {
      const [row] = await db
        .update(passwordResetsTable)
        .set({ usedAt: now })
        .where(
          and(
            eq(passwordResetsTable.tokenHash, tokenHash),
            isNull(passwordResetsTable.usedAt),
            gt(passwordResetsTable.expiresAt, now),
          ),
        )
        .returning({ userId: passwordResetsTable.userId });
      return row ?? null;
    },
  };
}

export type AuthRepository = ReturnType<typeof createAuthRepository>;
