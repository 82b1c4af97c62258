import { and, count, desc, eq } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { attachmentsTable, labResultsTable, usersTable, type DiscPoint } from '../../db/schema';

export type LabResultValues = {
  sampledAt: Date;
  turbidityNtu: number | null;
  t200s: number | null;
  t400s: number | null;
  discDiameterMm: number | null;
  discPressureBar: number | null;
  discPoints: DiscPoint[] | null;
  freeSo2MgL: number | null;
  notes: string;
};

export type LabResultRow = typeof labResultsTable.$inferSelect & { createdByName: string | null };

export function createLabResultsRepository(db: DbOrTx) {
  const select = () =>
    db
      .select({
        id: labResultsTable.id,
        wineryId: labResultsTable.wineryId,
        lotId: labResultsTable.lotId,
        sampledAt: labResultsTable.sampledAt,
        turbidityNtu: labResultsTable.turbidityNtu,
        t200s: labResultsTable.t200s,
        t400s: labResultsTable.t400s,
        discDiameterMm: labResultsTable.discDiameterMm,
        discPressureBar: labResultsTable.discPressureBar,
        discPoints: labResultsTable.discPoints,
        freeSo2MgL: labResultsTable.freeSo2MgL,
        notes: labResultsTable.notes,
        createdBy: labResultsTable.createdBy,
        createdAt: labResultsTable.createdAt,
        updatedAt: labResultsTable.updatedAt,
        createdByName: usersTable.name,
      })
      .from(labResultsTable)
      .leftJoin(usersTable, eq(usersTable.id, labResultsTable.createdBy));
  const newestFirst = [desc(labResultsTable.sampledAt), desc(labResultsTable.createdAt)];

  return {
    /** All lab results of a lot, newest sample first. */
    async list(wineryId: string, lotId: string): Promise<LabResultRow[]> {
      return select()
        .where(and(eq(labResultsTable.wineryId, wineryId), eq(labResultsTable.lotId, lotId)))
        .orderBy(...newestFirst);
    },
    async latest(wineryId: string, lotId: string): Promise<LabResultRow | null> {
      const [row] = await select()
        .where(and(eq(labResultsTable.wineryId, wineryId), eq(labResultsTable.lotId, lotId)))
        .orderBy(...newestFirst)
        .limit(1);
      return row ?? null;
    },
    async find(wineryId: string, lotId: string, id: string): Promise<LabResultRow | null> {
      const [row] = await select().where(
        and(eq(labResultsTable.wineryId, wineryId), eq(labResultsTable.lotId, lotId), eq(labResultsTable.id, id)),
      );
      return row ?? null;
    },
    async insert(wineryId: string, lotId: string, createdBy: string, values: LabResultValues) {
      const [row] = await db.insert(labResultsTable).values({ wineryId, lotId, createdBy, ...values }).returning({ id: labResultsTable.id });
      return row.id;
    },
    async update(wineryId: string, lotId: string, id: string, values: LabResultValues, now: Date) {
      const rows = await db
        .update(labResultsTable)
        .set({ ...values, updatedAt: now })
        .where(and(eq(labResultsTable.wineryId, wineryId), eq(labResultsTable.lotId, lotId), eq(labResultsTable.id, id)))
        .returning({ id: labResultsTable.id });
      return rows.length > 0;
    },
    async attachmentCount(wineryId: string, id: string) {
      const [{ n }] = await db
        .select({ n: count() })
        .from(attachmentsTable)
        .where(and(eq(attachmentsTable.wineryId, wineryId), eq(attachmentsTable.ownerKind, 'lab-result'), eq(attachmentsTable.ownerId, id)));
      return n;
    },
    async delete(wineryId: string, lotId: string, id: string) {
      const rows = await db
        .delete(labResultsTable)
        .where(and(eq(labResultsTable.wineryId, wineryId), eq(labResultsTable.lotId, lotId), eq(labResultsTable.id, id)))
        .returning({ id: labResultsTable.id });
      return rows.length > 0;
    },
  };
}
export type LabResultsRepository = ReturnType<typeof createLabResultsRepository>;
