import { and, count, eq, ilike, or, sql } from 'drizzle-orm';
import type { TanksListQuery } from '../../../shared/schemas/cellar';
import type { DbOrTx } from '../../db/client';
import { lotsTable, tanksTable } from '../../db/schema';
import { deleteOwnRow, likePattern, lockOwnRow, ownRow, ownRowExists, sortedPage, updateOwnRow } from '../../db/list';

export type TankRow = typeof tanksTable.$inferSelect & { lotCount: number; lotVolumeL: number };
export type TankValues = { name: string; capacityL: number; notes: string };

export const TANK_NAME_UNIQUE = 'tanks_winery_name_uq';

export function createTanksRepository(db: DbOrTx) {
  const lotCount = sql<number>`cast(count(${lotsTable.id}) as int)`;
  const lotVolumeL = sql<number>`coalesce(sum(${lotsTable.volumeL}), 0)`;
  const selection = {
    id: tanksTable.id,
    wineryId: tanksTable.wineryId,
    name: tanksTable.name,
    capacityL: tanksTable.capacityL,
    notes: tanksTable.notes,
    createdAt: tanksTable.createdAt,
    updatedAt: tanksTable.updatedAt,
    lotCount,
    lotVolumeL,
  };
  const withLots = () =>
    db
      .select(selection)
      .from(tanksTable)
      .leftJoin(lotsTable, and(eq(lotsTable.tankId, tanksTable.id), eq(lotsTable.wineryId, tanksTable.wineryId)));

  return {
    async list(wineryId: string, query: TanksListQuery): Promise<{ rows: TankRow[]; total: number }> {
      const where = and(eq(tanksTable.wineryId, wineryId), query.q ? or(ilike(tanksTable.name, likePattern(query.q)), ilike(tanksTable.notes, likePattern(query.q))) : undefined);
      const [rows, [{ total }]] = await Promise.all([
        sortedPage(withLots().where(where).groupBy(tanksTable.id).$dynamic(), query, { name: tanksTable.name, capacityL: tanksTable.capacityL, lotCount }, tanksTable.id),
        db.select({ total: count() }).from(tanksTable).where(where),
      ]);
      return { rows, total };
    },
    async find(wineryId: string, id: string): Promise<TankRow | null> {
      const [row] = await withLots()
        .where(ownRow(tanksTable, wineryId, id))
        .groupBy(tanksTable.id);
      return row ?? null;
    },
    exists: (wineryId: string, id: string) => ownRowExists(db, tanksTable, wineryId, id),
    async insert(wineryId: string, values: TankValues) {
      const [row] = await db.insert(tanksTable).values({ wineryId, ...values }).returning({ id: tanksTable.id });
      return row.id;
    },
    update: (wineryId: string, id: string, values: TankValues, now: Date) => updateOwnRow(db, tanksTable, wineryId, id, { ...values, updatedAt: now }),
    /** Locks the tank row so a lot cannot move in while it is being deleted. */
    lockForDelete: (wineryId: string, id: string) => lockOwnRow(db, tanksTable, wineryId, id),
    async lotsIn(wineryId: string, id: string) {
      const [{ n }] = await db
        .select({ n: count() })
        .from(lotsTable)
        .where(and(eq(lotsTable.wineryId, wineryId), eq(lotsTable.tankId, id)));
      return n;
    },
    delete: (wineryId: string, id: string) => deleteOwnRow(db, tanksTable, wineryId, id),
  };
}
export type TanksRepository = ReturnType<typeof createTanksRepository>;
