import { and, asc, eq, gt, isNull } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { invitationsTable, membershipsTable, usersTable, wineriesTable } from '../../db/schema';
import type { Role } from '../../../shared/permissions';

export function createTeamRepository(db: DbOrTx) {
  return {
    async members(wineryId: string) {
      return db
        .select({
          userId: usersTable.id,
          name: usersTable.name,
          email: usersTable.email,
          role: membershipsTable.role,
          joinedAt: membershipsTable.createdAt,
        })
        .from(membershipsTable)
        .innerJoin(usersTable, eq(usersTable.id, membershipsTable.userId))
        .where(eq(membershipsTable.wineryId, wineryId))
        .orderBy(asc(usersTable.name));
    },
    async member(wineryId: string, userId: string) {
      const [row] = await db
        .select({ userId: membershipsTable.userId, role: membershipsTable.role })
        .from(membershipsTable)
        .where(and(eq(membershipsTable.wineryId, wineryId), eq(membershipsTable.userId, userId)));
      return row ?? null;
    },
    async memberByEmail(wineryId: string, email: string) {
      const [row] = await db
        .select({ userId: usersTable.id })
        .from(membershipsTable)
        .innerJoin(usersTable, eq(usersTable.id, membershipsTable.userId))
        .where(and(eq(membershipsTable.wineryId, wineryId), eq(usersTable.email, email)));
      return row ?? null;
    },
    /** Locks the winery's owner rows so two concurrent demotions cannot both pass the last-owner check. */
    async ownerCount(wineryId: string) {
      const rows = await db
        .select({ userId: membershipsTable.userId })
        .from(membershipsTable)
        .where(and(eq(membershipsTable.wineryId, wineryId), eq(membershipsTable.role, 'owner')))
        .for('update');
      return rows.length;
    },
    async setRole(wineryId: string, userId: string, role: Role) {
      await db
        .update(membershipsTable)
        .set({ role })
        .where(and(eq(membershipsTable.wineryId, wineryId), eq(membershipsTable.userId, userId)));
    },
    async removeMember(wineryId: string, userId: string) {
      await db.delete(membershipsTable).where(and(eq(membershipsTable.wineryId, wineryId), eq(membershipsTable.userId, userId)));
    },
    async addMember(wineryId: string, userId: string, role: Role) {
      await db.insert(membershipsTable).values({ wineryId, userId, role }).onConflictDoNothing();
    },
    async pendingInvitations(wineryId: string, now: Date) {
      return db
        .select({
          id: invitationsTable.id,
          email: invitationsTable.email,
          role: invitationsTable.role,
          invitedBy: usersTable.name,
          expiresAt: invitationsTable.expiresAt,
          createdAt: invitationsTable.createdAt,
        })
        .from(invitationsTable)
        .leftJoin(usersTable, eq(usersTable.id, invitationsTable.invitedBy))
        .where(
          and(
            eq(invitationsTable.wineryId, wineryId),
            isNull(invitationsTable.acceptedAt),
            isNull(invitationsTable.revokedAt),
            gt(invitationsTable.expiresAt, now),
          ),
        )
        .orderBy(asc(invitationsTable.email));
    },
    async pendingInvitationFor(wineryId: string, email: string, now: Date) {
      const [row] = await db
        .select({ id: invitationsTable.id })
        .from(invitationsTable)
        .where(
          and(
            eq(invitationsTable.wineryId, wineryId),
            eq(invitationsTable.email, email),
            isNull(invitationsTable.acceptedAt),
            isNull(invitationsTable.revokedAt),
            gt(invitationsTable.expiresAt, now),
          ),
        );
      return row ?? null;
    },
    async insertInvitation(values: typeof invitationsTable.$inferInsert) {
      const [row] = await db.insert(invitationsTable).values(values).returning();
      return row;
    },
    async renewInvitation(id: string, changes: { tokenHash: string; role: Role; expiresAt: Date; invitedBy: string }) {
      const [row] = await db.update(invitationsTable).set(changes).where(eq(invitationsTable.id, id)).returning();
      return row;
    },
    async revokeInvitation(wineryId: string, id: string, now: Date) {
      const rows = await db
        .update(invitationsTable)
        .set({ revokedAt: now })
        .where(and(eq(invitationsTable.id, id), eq(invitationsTable.wineryId, wineryId), isNull(invitationsTable.acceptedAt), isNull(invitationsTable.revokedAt)))
        .returning({ id: invitationsTable.id });
      return rows.length > 0;
    },
    async invitationByTokenHash(tokenHash: string) {
      const [row] = await db
        .select({ invitation: invitationsTable, wineryName: wineriesTable.name })
        .from(invitationsTable)
        .innerJoin(wineriesTable, eq(wineriesTable.id, invitationsTable.wineryId))
        .where(eq(invitationsTable.tokenHash, tokenHash));
      return row ?? null;
    },
    /** Marks the invitation accepted only if it is still open (not used, revoked or expired): true when it was. */
    async markAccepted(id: string, userId: string, now: Date) {
      const rows = await db
        .update(invitationsTable)
        .set({ acceptedAt: now, acceptedBy: userId })
        .where(and(eq(invitationsTable.id, id), isNull(invitationsTable.acceptedAt), isNull(invitationsTable.revokedAt), gt(invitationsTable.expiresAt, now)))
        .returning({ id: invitationsTable.id });
      return rows.length > 0;
    },
    async wineryName(wineryId: string) {
      const [row] = await db.select({ name: wineriesTable.name }).from(wineriesTable).where(eq(wineriesTable.id, wineryId));
      return row?.name ?? '';
    },
  };
}
