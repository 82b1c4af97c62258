import { and, asc, count, desc, eq, gte, inArray, isNotNull, or, sql } from 'drizzle-orm';
import type { DbOrTx } from '../../db/client';
import { cartridgeEventsTable, cartridgeLifeFlagsTable, cartridgesTable, housingsTable, lifeCartridgeColumns, plansTable, tanksTable } from '../../db/schema';

/** One event as the aggregate gives it: kind, time (ms since the Unix epoch), details. */
type LifeEventTuple = [kind: (typeof LIFE_EVENT_KINDS)[number], atMs: number, details: Record<string, unknown> | null];

/** Event kinds the life forecast reads. */
const LIFE_EVENT_KINDS = ['registered', 'cycle', 'integrity'] as const;
/** Event kinds that make an in-stock cartridge worth forecasting (it has been used). */
const USE_EVENT_KINDS = ['cycle', 'integrity', 'run'] as const;

/** A cartridge whose stored life check must be worked out again. */
export type StaleLifeRow = { id: string; typeId: string; litresFiltered: number; lengthIn: number; version: number; events: LifeEventTuple[] };

/** Cartridges whose life is worth forecasting: installed or regenerating, or in stock after use. */
const inUse = or(
  inArray(cartridgesTable.status, ['installed', 'regenerating']),
  and(
    eq(cartridgesTable.status, 'in-stock'),
    sql`exists (select 1 from ${cartridgeEventsTable} u where u.cartridge_id = ${cartridgesTable.id} and u.kind = any(${sql.param([...USE_EVENT_KINDS])}::text[]))`,
  ),
)!;

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

    /**
     * The cartridges not retired whose stored life check is missing or stale
     * (cartridge_life_flags.version moved on since it was checked). The check does not depend on
     * the status, so it is kept for every such cartridge and `flaggedCartridges` picks the ones
     * in use when reading; this query then needs no look at the events of unused ones. Each with the events the
     * forecast reads, aggregated per cartridge in the same query, and the version it is read at
     * (0 when it has no row yet). An event is [kind, time in ms since the epoch, details].
     */
    async staleLifeChecks(wineryId: string): Promise<StaleLifeRow[]> {
      const res = await db.execute(sql`
        select cartridges.id, cartridges.type_id, cartridges.litres_filtered, cartridges.length_in, coalesce(f.version, 0) as version,
               (select json_agg(json_build_array(e.kind, extract(epoch from e.at) * 1000, e.details))
                  from ${cartridgeEventsTable} e
                 where e.cartridge_id = cartridges.id and e.kind = any(${sql.param([...LIFE_EVENT_KINDS])}::text[])) as events
        from ${cartridgesTable}
        left join ${cartridgeLifeFlagsTable} f on f.cartridge_id = cartridges.id
        where cartridges.winery_id = ${wineryId}::uuid and cartridges.status <> 'retired'
          and (f.cartridge_id is null or f.checked_version is distinct from f.version)`);
      return (res.rows as Record<string, unknown>[]).map((r) => ({
        id: String(r.id),
        typeId: String(r.type_id),
        litresFiltered: Number(r.litres_filtered),
        lengthIn: Number(r.length_in),
        version: Number(r.version),
        events: (r.events as LifeEventTuple[] | null) ?? [],
      }));
    },

    /**
     * Stores life checks, each only if the cartridge's version is still the one it was read at
     * (a write in between leaves it stale, to be checked again on the next visit).
     */
    async storeLifeChecks(checks: { id: string; version: number; rank: number | null; closeness: number | null; attention: object | null }[]) {
      if (checks.length === 0) return;
      await db.execute(sql`
        insert into ${cartridgeLifeFlagsTable} (cartridge_id, version, checked_version, rank, closeness, attention)
        select x.id, x.version, x.version, x.rank, x.closeness, x.attention
        from jsonb_to_recordset(${JSON.stringify(checks)}::jsonb) as x(id uuid, version int, rank int, closeness double precision, attention jsonb)
        order by x.id
        on conflict (cartridge_id) do update
          set checked_version = excluded.checked_version, rank = excluded.rank, closeness = excluded.closeness, attention = excluded.attention
          where ${cartridgeLifeFlagsTable}.version = excluded.version`);
    },

    /**
     * The cartridges worth forecasting whose stored check found something, most urgent first
     * (rank, then closeness, then serial), at most `limit`, with how many there are in all.
     */
    async flaggedCartridges(wineryId: string, limit: number) {
      const rows = await db
        .select({
          cartridge: lifeCartridgeColumns,
          housingName: housingsTable.name,
          rank: sql<number>`${cartridgeLifeFlagsTable.rank}`.mapWith(Number),
          closeness: sql<number>`${cartridgeLifeFlagsTable.closeness}`.mapWith(Number),
          attention: cartridgeLifeFlagsTable.attention,
          total: sql<number>`count(*) over ()`.mapWith(Number),
        })
        .from(cartridgesTable)
        .innerJoin(cartridgeLifeFlagsTable, eq(cartridgeLifeFlagsTable.cartridgeId, cartridgesTable.id))
        .leftJoin(housingsTable, eq(housingsTable.id, cartridgesTable.housingId))
        .where(and(eq(cartridgesTable.wineryId, wineryId), inUse, isNotNull(cartridgeLifeFlagsTable.rank)))
        .orderBy(asc(cartridgeLifeFlagsTable.rank), desc(cartridgeLifeFlagsTable.closeness), asc(cartridgesTable.serial))
        .limit(limit);
      return { rows, total: rows[0]?.total ?? 0 };
    },
  };
}
export type TodayRepository = ReturnType<typeof createTodayRepository>;
export type TodayCartridgeRow = Awaited<ReturnType<TodayRepository['flaggedCartridges']>>['rows'][number];
