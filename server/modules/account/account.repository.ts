import { asc, eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { membershipsTable, usersTable, wineriesTable } from '../../db/schema';

export function createAccountRepository(db: DbOrTx) {
  return {
    async membershipsOf(userId: string) {
      return db
        .select({ wineryId: membershipsTable.wineryId, wineryName: wineriesTable.name, role: membershipsTable.role })
        .from(membershipsTable)
        .innerJoin(wineriesTable, eq(wineriesTable.id, membershipsTable.wineryId))
        .where(eq(membershipsTable.userId, userId))
        .orderBy(asc(wineriesTable.name));
    },
    async updateUser(userId: string, changes: { name?: string; units?: 'metric' | 'us'; activeWineryId?: string | null }) {
      await db.update(usersTable).set(changes).where(eq(usersTable.id, userId));
    },
  };
}
