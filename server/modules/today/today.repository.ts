import { and, asc, count, eq, gte, inArray, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { cartridgesTable, housingsTable, plansTable, tanksTable } from '../../db/schema';

export function createTodayRepository(db: DbOrTx) {
  return {
    /** Ids of the draft and approved plans dated on or after fromDate (YYYY-MM-DD), soonest first (one query). */
    async upcomingPlanIds(wineryId: string, fromDate: string, limit: number) {
      const rows = await db
        .select({ id: plansTable.id })
        .from(plansTable)
        .where(and(eq(plansTable.wineryId, wineryId), inArray(plansTable.status, ['draft', 'approved']), gte(plansTable.plannedDate, fromDate)))
        .orderBy(asc(plansTable.plannedDate), asc(plansTable.startTime), asc(plansTable.name), asc(plansTable.id))
        .limit(limit);
      return rows.map((r) => r.id);
    },

    /** Tanks, housings and housings with at least one empty round, in one query. */
    async counts(wineryId: string) {
      const installedPerHousing = db
        .select({ housingId: cartridgesTable.housingId, n: count().as('n') })
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.status, 'installed')))
        .groupBy(cartridgesTable.housingId)
        .as('installed_per_housing');
      const [row] = await db
        .select({
          housings: sql<number>`cast(count(*) as int)`,
          withFree: sql<number>`cast(count(*) filter (where coalesce(${installedPerHousing.n}, 0) < ${housingsTable.rounds}) as int)`,
          tanks: sql<number>`(select cast(count(*) as int) from ${tanksTable} where ${tanksTable.wineryId} = ${wineryId})`,
        })
        .from(housingsTable)
        .leftJoin(installedPerHousing, eq(installedPerHousing.housingId, housingsTable.id))
        .where(eq(housingsTable.wineryId, wineryId));
      return { housings: row?.housings ?? 0, housingsWithFreeRounds: row?.withFree ?? 0, tanks: row?.tanks ?? 0 };
    },
  };
}
export type TodayRepository = ReturnType<typeof createTodayRepository>;
