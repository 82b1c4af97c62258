import { and, asc, count, eq, exists, gte, inArray, or, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { cartridgeEventsTable, cartridgesTable, cartridgeTypesTable, housingsTable, plansTable, tanksTable } from '../../db/schema';

/** One event as the aggregate gives it: kind, time (ms since the Unix epoch), details. */
type LifeEventTuple = [kind: (typeof LIFE_EVENT_KINDS)[number], atMs: number, details: Record<string, unknown> | null];

/** Event kinds the life forecast reads. */
const LIFE_EVENT_KINDS = ['registered', 'cycle', 'integrity'] as const;
/** Event kinds that make an in-stock cartridge worth forecasting (it has been used). */
const USE_EVENT_KINDS = ['cycle', 'integrity', 'run'] as const;

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

    /** The ratings the life forecast reads, and the name shown, of every cartridge type of the winery. */
    async lifeTypes(wineryId: string) {
      return db
        .select({
          id: cartridgeTypesTable.id,
          name: cartridgeTypesTable.name,
          ratedSteamCycles: cartridgeTypesTable.ratedSteamCycles,
          ratedHotWaterCycles: cartridgeTypesTable.ratedHotWaterCycles,
          ratedChemicalCycles: cartridgeTypesTable.ratedChemicalCycles,
          flowRecoveryMinPct: cartridgeTypesTable.flowRecoveryMinPct,
          waterFlowLhPer10in: cartridgeTypesTable.waterFlowLhPer10in,
        })
        .from(cartridgeTypesTable)
        .where(eq(cartridgeTypesTable.wineryId, wineryId));
    },

    /**
     * The cartridges whose life is worth forecasting: installed or regenerating ones, and
     * in-stock ones that have been used. Each with its housing name and the events the
     * forecast reads, aggregated per cartridge in the same query (no list of ids sent back).
     * An event is [kind, time in ms since the epoch, details].
     */
    async cartridgesInUse(wineryId: string) {
      const used = db
        .select({ one: sql`1` })
        .from(cartridgeEventsTable)
        .where(and(eq(cartridgeEventsTable.cartridgeId, cartridgesTable.id), inArray(cartridgeEventsTable.kind, [...USE_EVENT_KINDS])));
      const lifeEvents = db
        .select({
          cartridgeId: cartridgeEventsTable.cartridgeId,
          events:
            sql<LifeEventTuple[]>`json_agg(json_build_array(${cartridgeEventsTable.kind}, extract(epoch from ${cartridgeEventsTable.at}) * 1000, ${cartridgeEventsTable.details}))`.as(
              'events',
            ),
        })
        .from(cartridgeEventsTable)
        .where(and(eq(cartridgeEventsTable.wineryId, wineryId), inArray(cartridgeEventsTable.kind, [...LIFE_EVENT_KINDS])))
        .groupBy(cartridgeEventsTable.cartridgeId)
        .as('life_events');
      return db
        .select({
          cartridge: {
            id: cartridgesTable.id,
            serial: cartridgesTable.serial,
            status: cartridgesTable.status,
            typeId: cartridgesTable.typeId,
            housingId: cartridgesTable.housingId,
            position: cartridgesTable.position,
            litresFiltered: cartridgesTable.litresFiltered,
            lengthIn: cartridgesTable.lengthIn,
          },
          housingName: housingsTable.name,
          events: lifeEvents.events,
        })
        .from(cartridgesTable)
        .leftJoin(housingsTable, eq(housingsTable.id, cartridgesTable.housingId))
        .leftJoin(lifeEvents, eq(lifeEvents.cartridgeId, cartridgesTable.id))
        .where(
          and(
            eq(cartridgesTable.wineryId, wineryId),
            or(inArray(cartridgesTable.status, ['installed', 'regenerating']), and(eq(cartridgesTable.status, 'in-stock'), exists(used))),
          ),
        )
        .orderBy(asc(cartridgesTable.serial));
    },
  };
}
export type TodayRepository = ReturnType<typeof createTodayRepository>;
export type TodayCartridgeRow = Awaited<ReturnType<TodayRepository['cartridgesInUse']>>[number];
export type TodayLifeType = Awaited<ReturnType<TodayRepository['lifeTypes']>>[number];
