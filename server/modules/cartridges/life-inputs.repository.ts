import { and, asc, eq, exists, inArray, or, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { cartridgeEventsTable, cartridgesTable, cartridgeTypesTable, housingsTable, lifeCartridgeColumns } from '../../db/schema';

/** Event kinds the life forecast reads. */
export const LIFE_EVENT_KINDS = ['registered', 'cycle', 'integrity'] as const;
/** Event kinds that make an in-stock cartridge worth forecasting (it has been used). */
const USE_EVENT_KINDS = ['cycle', 'integrity', 'run'] as const;

/** One event as the aggregate gives it: kind, time (ms since the Unix epoch), details, the housing it happened in. */
export type LifeEventTuple = [kind: (typeof LIFE_EVENT_KINDS)[number], atMs: number, details: Record<string, unknown> | null, housingId: string | null];

/**
 * The inputs of many cartridges' life forecasts at once (Today, the alert rules): the ratings of
 * the winery's cartridge types and housings, and the cartridges worth forecasting with their
 * events. A fixed number of queries whatever the number of cartridges.
 */
export function createLifeInputsRepository(db: DbOrTx) {
  return {
    /** The ratings the life forecast and the alert rules read, and the name shown, of every cartridge type of the winery. */
    async lifeTypes(wineryId: string) {
      return db
        .select({
          id: cartridgeTypesTable.id,
          name: cartridgeTypesTable.name,
          kind: cartridgeTypesTable.kind,
          ratedSteamCycles: cartridgeTypesTable.ratedSteamCycles,
          ratedHotWaterCycles: cartridgeTypesTable.ratedHotWaterCycles,
          ratedChemicalCycles: cartridgeTypesTable.ratedChemicalCycles,
          flowRecoveryMinPct: cartridgeTypesTable.flowRecoveryMinPct,
          waterFlowLhPer10in: cartridgeTypesTable.waterFlowLhPer10in,
          waterDpBar: cartridgeTypesTable.waterDpBar,
          maxTempC: cartridgeTypesTable.maxTempC,
        })
        .from(cartridgeTypesTable)
        .where(eq(cartridgeTypesTable.wineryId, wineryId));
    },

    /** Every housing's name and temperature rating (a winery has tens of housings). */
    async housingRatings(wineryId: string) {
      return db.select({ id: housingsTable.id, name: housingsTable.name, maxTempC: housingsTable.maxTempC }).from(housingsTable).where(eq(housingsTable.wineryId, wineryId));
    },

    /**
     * The cartridges whose life is worth forecasting: installed or regenerating ones, and
     * in-stock ones that have been used. Each with its housing name and the events the
     * forecast reads, aggregated per cartridge in the same query (no list of ids sent back).
     * An event is [kind, time in ms since the epoch, details, housing id].
     */
    async cartridgesInUse(wineryId: string) {
      const used = db
        .select({ one: sql`1` })
        .from(cartridgeEventsTable)
        .where(and(eq(cartridgeEventsTable.cartridgeId, cartridgesTable.id), inArray(cartridgeEventsTable.kind, [...USE_EVENT_KINDS])));
      const lifeEvents = db
        .select({
          cartridgeId: cartridgeEventsTable.cartridgeId,
          events: sql<
            LifeEventTuple[]
          >`json_agg(json_build_array(${cartridgeEventsTable.kind}, extract(epoch from ${cartridgeEventsTable.at}) * 1000, ${cartridgeEventsTable.details}, ${cartridgeEventsTable.housingId}))`.as(
            'events',
          ),
        })
        .from(cartridgeEventsTable)
        .where(and(eq(cartridgeEventsTable.wineryId, wineryId), inArray(cartridgeEventsTable.kind, [...LIFE_EVENT_KINDS])))
        .groupBy(cartridgeEventsTable.cartridgeId)
        .as('life_events');
      return db
        .select({
          cartridge: lifeCartridgeColumns,
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
export type LifeInputsRepository = ReturnType<typeof createLifeInputsRepository>;
export type LifeCartridgeRow = Awaited<ReturnType<LifeInputsRepository['cartridgesInUse']>>[number];
export type LifeTypeRow = Awaited<ReturnType<LifeInputsRepository['lifeTypes']>>[number];
export type LifeHousingRow = Awaited<ReturnType<LifeInputsRepository['housingRatings']>>[number];
