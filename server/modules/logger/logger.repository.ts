import { and, asc, count, eq, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { findOwnRow } from '../../db/list';
import { loggerImportsTable, loggerProfilesTable } from '../../db/schema';

export type LoggerProfileRow = typeof loggerProfilesTable.$inferSelect;
type ProfileInsert = typeof loggerProfilesTable.$inferInsert;
type ImportInsert = typeof loggerImportsTable.$inferInsert;

/** Logger profiles and the record of imported files; every query is by winery. */
export function createLoggerRepository(db: DbOrTx) {
  return {
    async profiles(wineryId: string) {
      return db.select().from(loggerProfilesTable).where(eq(loggerProfilesTable.wineryId, wineryId)).orderBy(asc(loggerProfilesTable.name));
    },

    async profile(wineryId: string, id: string) {
      return findOwnRow(db, loggerProfilesTable, wineryId, id);
    },

    async profileCount(wineryId: string) {
      const [row] = await db.select({ n: count() }).from(loggerProfilesTable).where(eq(loggerProfilesTable.wineryId, wineryId));
      return row?.n ?? 0;
    },

    /** Inserts a profile; null when the winery already has one of that name. */
    async insertProfile(values: ProfileInsert) {
      const [row] = await db.insert(loggerProfilesTable).values(values).onConflictDoNothing().returning();
      return row ?? null;
    },

    /** Updates a profile; undefined when it is not this winery's, null when the new name is taken. */
    async updateProfile(wineryId: string, id: string, patch: Partial<Pick<ProfileInsert, 'name' | 'mapping'>>) {
      try {
        const [row] = await db
          .update(loggerProfilesTable)
          .set({ ...patch, updatedAt: new Date() })
          .where(and(eq(loggerProfilesTable.wineryId, wineryId), eq(loggerProfilesTable.id, id)))
          .returning();
        return row;
      } catch (e) {
        if ((e as { code?: string; cause?: { code?: string } }).code === '23505' || (e as { cause?: { code?: string } }).cause?.code === '23505') return null;
        throw e;
      }
    },

    async removeProfile(wineryId: string, id: string) {
      const rows = await db
        .delete(loggerProfilesTable)
        .where(and(eq(loggerProfilesTable.wineryId, wineryId), eq(loggerProfilesTable.id, id)))
        .returning({ id: loggerProfilesTable.id });
      return rows.length > 0;
    },

    /** The earlier import of this file into this run's stage, if any. */
    async importOf(wineryId: string, runId: string, stageIndex: number, sha256: string) {
      const [row] = await db
        .select()
        .from(loggerImportsTable)
        .where(
          and(
            eq(loggerImportsTable.wineryId, wineryId),
            eq(loggerImportsTable.runId, runId),
            eq(loggerImportsTable.stageIndex, stageIndex),
            eq(loggerImportsTable.fileSha256, sha256),
          ),
        );
      return row ?? null;
    },

    /**
     * Claims the file for this run's stage; null when it was imported already (or a concurrent
     * import of the same file got there first: this one then waits for it and stores nothing).
     */
    async claimImport(values: ImportInsert) {
      const [row] = await db
        .insert(loggerImportsTable)
        .values(values)
        .onConflictDoNothing({ target: [loggerImportsTable.runId, loggerImportsTable.stageIndex, loggerImportsTable.fileSha256] })
        .returning({ id: loggerImportsTable.id });
      return row ?? null;
    },

    async finishImport(wineryId: string, id: string, importedCount: number, attachmentId: string | null) {
      await db
        .update(loggerImportsTable)
        .set({ importedCount, attachmentId, updatedAt: sql`now()` })
        .where(and(eq(loggerImportsTable.wineryId, wineryId), eq(loggerImportsTable.id, id)));
    },
  };
}
