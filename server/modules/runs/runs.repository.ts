import { and, asc, desc, eq, inArray, isNotNull, sql } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import { executeNamed, writeCacheWithoutWaiting, type DbOrTx } from '../../db/client';
import { findOwnRow, lockedOwnRow, lockOwnRow } from '../../db/list';
import {
  usersTable,
  cartridgeEventsTable,
  cartridgesTable,
  cartridgeTypesTable,
  housingsTable,
  linesTable,
  lotsTable,
  planLotsTable,
  plansTable,
  planTrainsTable,
  runChangesTable,
  runFiguresTable,
  runReadingCorrectionsTable,
  runReadingsTable,
  runsTable,
  runStageCartridgesTable,
  type PlanTrainStage,
} from '../../db/schema';

export type RunRow = typeof runsTable.$inferSelect;
export type RunReadingRow = typeof runReadingsTable.$inferSelect & { byName?: string | null };
/** A reading to store, already validated against the schema. */
export type NewReading = {
  stageIndex: number;
  volumeL: number;
  upstreamBar: number;
  downstreamBar: number;
  flowLh: number | null;
  tempC: number | null;
  at: Date | null;
  clientKey: string;
};

/** A raw run_readings row (snake_case, from hand-written SQL) as the Drizzle row type. */
function readingFromRaw(r: Record<string, unknown>): RunReadingRow {
  const date = (v: unknown) => (v instanceof Date ? v : new Date(String(v)));
  const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));
  return {
    id: String(r.id),
    wineryId: String(r.winery_id),
    createdAt: date(r.created_at),
    updatedAt: date(r.updated_at),
    runId: String(r.run_id),
    stageIndex: Number(r.stage_index),
    at: date(r.at),
    volumeL: Number(r.volume_l),
    upstreamBar: Number(r.upstream_bar),
    downstreamBar: Number(r.downstream_bar),
    flowLh: num(r.flow_lh),
    tempC: num(r.temp_c),
    clientKey: String(r.client_key),
    createdBy: r.created_by === null || r.created_by === undefined ? null : String(r.created_by),
    createdByName: r.created_by_name === null || r.created_by_name === undefined ? null : String(r.created_by_name),
    byName: r.by_name === null || r.by_name === undefined ? null : String(r.by_name),
  };
}
type ReadingInsert = typeof runReadingsTable.$inferInsert;
/** A reading row to insert (winery, run, values, key, who). */
export type NewReadingRow = ReadingInsert;
type EventInsert = typeof cartridgeEventsTable.$inferInsert;
export type RunStageCartridgeRow = typeof runStageCartridgesTable.$inferSelect;
type StageCartridgeInsert = typeof runStageCartridgesTable.$inferInsert;
export type RunChangeRow = typeof runChangesTable.$inferSelect;
type ChangeInsert = typeof runChangesTable.$inferInsert;
export type ReadingCorrectionRow = typeof runReadingCorrectionsTable.$inferSelect;
export type CorrectionInsert = typeof runReadingCorrectionsTable.$inferInsert;
type RunInsert = typeof runsTable.$inferInsert;

const summaryColumns = {
  run: runsTable,
  planName: plansTable.name,
  lotId: lotsTable.id,
  lotCode: lotsTable.code,
  lotName: lotsTable.name,
  volumeL: planLotsTable.volumeL,
};

export type RunSummaryRow = {
  run: RunRow;
  planName: string;
  lotId: string;
  lotCode: string;
  lotName: string;
  volumeL: number;
  currentVolumeL: number;
  readingCount: number;
};

/**
 * Readings of one run in a single statement (see `insertReadingsIfOpen`), prepared once per
 * connection. $1–$9 are arrays, one element per reading in arrival order (stage, at or null,
 * litres, upstream, downstream, flow, temperature, client key, user); $10 winery, $11 run.
 * A reading is stored only while the run is running and has the stage, and when its litres are
 * not below the stage's highest so far, counting the readings before it in the same statement
 * (the running maximum): the same outcome as storing them one after the other in that order.
 * A key already stored, or twice in the statement, is stored once (the first). A reading sent
 * without its time is stamped with the statement's time, a microsecond apart in arrival order.
 */
const INSERT_READINGS_IF_OPEN = `
  with input as (
    select * from unnest($1::int[], $2::timestamptz[], $3::double precision[], $4::double precision[], $5::double precision[],
                         $6::double precision[], $7::double precision[], $8::text[], $9::text[])
      with ordinality as x(stage_index, at, volume_l, upstream_bar, downstream_bar, flow_lh, temp_c, client_key, created_by, ord)
  ), run as (
    select r.winery_id, r.id, jsonb_array_length(t.stages) as stage_count
    from runs r
    join plan_lots pl on pl.id = r.plan_lot_id and pl.winery_id = r.winery_id
    join plan_trains t on t.id = pl.chosen_train_id and t.winery_id = r.winery_id
    where r.winery_id = $10::uuid and r.id = $11::uuid and r.status = 'running'
    for no key update of r
  ), checked as (
    select i.*, run.winery_id, run.id as run_id,
           max(i.volume_l) over (partition by i.stage_index order by i.ord rows between unbounded preceding and 1 preceding) as before_in_statement
    from input i cross join run
    where i.stage_index < run.stage_count
  ), ins as (
    insert into run_readings (winery_id, run_id, stage_index, at, volume_l, upstream_bar, downstream_bar, flow_lh, temp_c, client_key, created_by, created_by_name)
    select c.winery_id, c.run_id, c.stage_index, coalesce(c.at, now() + (c.ord - 1) * interval '1 microsecond'), c.volume_l, c.upstream_bar, c.downstream_bar,
           c.flow_lh, c.temp_c, c.client_key, c.created_by, (select u.name from users u where u.id = c.created_by)
    from checked c
    where c.volume_l >= greatest(coalesce(c.before_in_statement, 0),
            coalesce((select max(x.volume_l) from run_readings x where x.run_id = c.run_id and x.stage_index = c.stage_index), 0))
    order by c.ord
    on conflict (run_id, client_key) do nothing
    returning *
  ), bump as (
    update runs set reading_count = runs.reading_count + n.stored, current_volume_l = greatest(runs.current_volume_l, n.top)
    from (select count(*)::int as stored, max(volume_l) as top from ins) n
    where runs.id = $11::uuid and n.stored > 0
  )
  select ins.*, u.name as by_name from ins left join users u on u.id = ins.created_by`;

export function createRunsRepository(db: DbOrTx) {
  function summaries(wineryId: string) {
    return db
      .select(summaryColumns)
      .from(runsTable)
      .innerJoin(plansTable, eq(plansTable.id, runsTable.planId))
      .innerJoin(planLotsTable, eq(planLotsTable.id, runsTable.planLotId))
      .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId))
      .where(eq(runsTable.wineryId, wineryId))
      .$dynamic();
  }

  /** The stored counters on the run row are the summary's count and litres. */
  function withReadingStats(rows: Omit<RunSummaryRow, 'currentVolumeL' | 'readingCount'>[]): RunSummaryRow[] {
    return rows.map((r) => ({ ...r, currentVolumeL: r.run.currentVolumeL, readingCount: r.run.readingCount }));
  }

  return {
    /** The plan lot with its plan, lot, chosen train and line; null when not this winery's. */
    async planLot(wineryId: string, planLotId: string) {
      const [row] = await db
        .select({ planLot: planLotsTable, plan: plansTable, lot: lotsTable, train: planTrainsTable, line: linesTable })
        .from(planLotsTable)
        .innerJoin(plansTable, eq(plansTable.id, planLotsTable.planId))
        .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId))
        .leftJoin(planTrainsTable, and(eq(planTrainsTable.id, planLotsTable.chosenTrainId), eq(planTrainsTable.wineryId, wineryId)))
        .leftJoin(linesTable, and(eq(linesTable.id, plansTable.lineId), eq(linesTable.wineryId, wineryId)))
        .where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.id, planLotId)));
      return row ?? null;
    },

    /** Approved plans' lots with a chosen train, for starting a run. */
    async startOptions(wineryId: string) {
      const running = sql<string | null>`(select ${runsTable.id} from ${runsTable} where ${runsTable.planLotId} = ${planLotsTable.id} and ${runsTable.status} = 'running' limit 1)`;
      return db
        .select({
          planLotId: planLotsTable.id,
          planId: plansTable.id,
          planName: plansTable.name,
          plannedDate: plansTable.plannedDate,
          lotCode: lotsTable.code,
          lotName: lotsTable.name,
          volumeL: planLotsTable.volumeL,
          trainName: planTrainsTable.name,
          runningRunId: running,
        })
        .from(planLotsTable)
        .innerJoin(plansTable, eq(plansTable.id, planLotsTable.planId))
        .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId))
        .innerJoin(planTrainsTable, eq(planTrainsTable.id, planLotsTable.chosenTrainId))
        .where(
          and(
            eq(planLotsTable.wineryId, wineryId),
            eq(plansTable.status, 'approved'),
            isNotNull(planLotsTable.chosenTrainId),
            // a plan continued as a later revision is kept as recorded; the revision is the one to run
            sql`not exists (select 1 from ${plansTable} as later where later.previous_plan_id = ${plansTable.id})`,
          ),
        )
        .orderBy(asc(plansTable.plannedDate), asc(planLotsTable.position))
        .limit(200);
    },

    /** Locks the plan lot so two starts of the same lot queue up. */
    async lockPlanLot(wineryId: string, id: string) {
      await lockOwnRow(db, planLotsTable, wineryId, id);
    },

    async runningFor(wineryId: string, planLotId: string) {
      const [row] = await db
        .select({ id: runsTable.id })
        .from(runsTable)
        .where(and(eq(runsTable.wineryId, wineryId), eq(runsTable.planLotId, planLotId), eq(runsTable.status, 'running')))
        .limit(1);
      return row ?? null;
    },

    async insertRun(values: RunInsert) {
      const [row] = await db.insert(runsTable).values(values).returning();
      return row;
    },

    async list(wineryId: string, limit: number) {
      return withReadingStats(await summaries(wineryId).orderBy(desc(runsTable.startedAt), desc(runsTable.id)).limit(limit));
    },

    /**
     * The run's summary and its plan lot's context (plan, lot, chosen train, line) in one
     * round trip, as `summary` and `planLot` give them; null when not this winery's.
     */
    async summaryWithPlanLot(wineryId: string, id: string) {
      const runPlan = alias(plansTable, 'run_plan');
      const f = runFiguresTable;
      const [row] = await db
        .select({
          run: runsTable,
          planName: runPlan.name,
          planLot: planLotsTable,
          plan: plansTable,
          lot: lotsTable,
          train: planTrainsTable,
          line: linesTable,
          figuresVersion: sql<number>`coalesce(${f.version}, 0)`.mapWith(Number),
          pageKey: sql<string | null>`case when ${f.pageVersion} = ${f.version} then ${f.pageKey} end`,
          page: sql<unknown>`case when ${f.pageVersion} = ${f.version} then ${f.page} end`,
        })
        .from(runsTable)
        .innerJoin(runPlan, eq(runPlan.id, runsTable.planId))
        .innerJoin(planLotsTable, and(eq(planLotsTable.id, runsTable.planLotId), eq(planLotsTable.wineryId, wineryId)))
        .innerJoin(plansTable, eq(plansTable.id, planLotsTable.planId))
        .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId))
        .leftJoin(planTrainsTable, and(eq(planTrainsTable.id, planLotsTable.chosenTrainId), eq(planTrainsTable.wineryId, wineryId)))
        .leftJoin(linesTable, and(eq(linesTable.id, plansTable.lineId), eq(linesTable.wineryId, wineryId)))
        .leftJoin(f, eq(f.runId, runsTable.id))
        .where(and(eq(runsTable.wineryId, wineryId), eq(runsTable.id, id)));
      if (!row) return null;
      const summary: RunSummaryRow = {
        run: row.run,
        planName: row.planName,
        lotId: row.lot.id,
        lotCode: row.lot.code,
        lotName: row.lot.name,
        volumeL: row.planLot.volumeL,
        currentVolumeL: row.run.currentVolumeL,
        readingCount: row.run.readingCount,
      };
      return {
        summary,
        ctx: { planLot: row.planLot, plan: row.plan, lot: row.lot, train: row.train, line: row.line },
        /** The run's figures version (0 before any row) and its stored page entry, when worked out at that version (else null). */
        stored: { version: row.figuresVersion, pageKey: row.pageKey, page: row.page ?? null },
      };
    },

    /**
     * Stores the run page's per-stage figures worked out at `version` with the inputs `key`, only
     * if the run's version is still that one (a write in between leaves the entry as it was, to be
     * worked out again by the next read). `page` is the JSON text, kept as written.
     */
    async storePageFigures(runId: string, version: number, key: string, page: string) {
      // Never queues behind a long write of the run (a logger import): skipped, the next read stores it.
      await writeCacheWithoutWaiting(db, (tx) => tx.execute(sql`
        insert into ${runFiguresTable} (run_id, version, page_version, page_key, page)
        values (${runId}::uuid, ${version}::int, ${version}::int, ${key}::text, ${page}::json)
        on conflict (run_id) do update
          set page_version = excluded.page_version, page_key = excluded.page_key, page = excluded.page
          where ${runFiguresTable}.version = excluded.version`));
    },

    async lockRun(wineryId: string, id: string) {
      return lockedOwnRow(db, runsTable, wineryId, id);
    },

    async readings(wineryId: string, runId: string, stageIndex?: number): Promise<RunReadingRow[]> {
      const rows = await db
        .select({ reading: runReadingsTable, byName: usersTable.name })
        .from(runReadingsTable)
        .leftJoin(usersTable, eq(usersTable.id, runReadingsTable.createdBy))
        .where(
          and(
            eq(runReadingsTable.wineryId, wineryId),
            eq(runReadingsTable.runId, runId),
            stageIndex === undefined ? undefined : eq(runReadingsTable.stageIndex, stageIndex),
          ),
        )
        .orderBy(asc(runReadingsTable.stageIndex), asc(runReadingsTable.volumeL), asc(runReadingsTable.at));
      return rows.map((r) => ({ ...r.reading, byName: r.byName }));
    },

    /**
     * The run's readings with only what the run page reads of them (values, time, key, who):
     * no tenant columns or row timestamps, so thousands of readings map quickly. The other
     * fields of the row type are absent.
     */
    async readingsForFigures(wineryId: string, runId: string, stageIndex?: number): Promise<RunReadingRow[]> {
      const t = runReadingsTable;
      const rows = await db
        .select({
          id: t.id,
          stageIndex: t.stageIndex,
          at: t.at,
          volumeL: t.volumeL,
          upstreamBar: t.upstreamBar,
          downstreamBar: t.downstreamBar,
          flowLh: t.flowLh,
          tempC: t.tempC,
          clientKey: t.clientKey,
          createdByName: t.createdByName,
          byName: usersTable.name,
        })
        .from(t)
        .leftJoin(usersTable, eq(usersTable.id, t.createdBy))
        .where(and(eq(t.wineryId, wineryId), eq(t.runId, runId), stageIndex === undefined ? undefined : eq(t.stageIndex, stageIndex)))
        .orderBy(asc(t.stageIndex), asc(t.volumeL), asc(t.at));
      return rows as RunReadingRow[];
    },

    /**
     * Stores readings of one run (sent by one or several people, in arrival order) in a single
     * statement, each only while the run is running and has its stage and its litres do not go
     * down, and counts them on the run (reading_count, current_volume_l). The run row is locked
     * for this statement alone, and a close (which takes the row for update) either comes first,
     * and then this stores nothing, or waits for it. Answers the rows stored; a reading missing
     * from them was a resend of a stored key or failed a check (the caller finds out which).
     */
    async insertReadingsIfOpen(wineryId: string, runId: string, items: { reading: NewReading; userId: string }[]): Promise<RunReadingRow[]> {
      const col = <T>(f: (x: { reading: NewReading; userId: string }) => T) => items.map(f);
      const rows = await executeNamed(db, 'runs_insert_readings_if_open', INSERT_READINGS_IF_OPEN, [
        col((x) => x.reading.stageIndex),
        col((x) => (x.reading.at ? x.reading.at.toISOString() : null)),
        col((x) => x.reading.volumeL),
        col((x) => x.reading.upstreamBar),
        col((x) => x.reading.downstreamBar),
        col((x) => x.reading.flowLh),
        col((x) => x.reading.tempC),
        col((x) => x.reading.clientKey),
        col((x) => x.userId),
        wineryId,
        runId,
      ]);
      return rows.map(readingFromRaw);
    },

    /**
     * What a batch needs to be checked, read with the run row locked until the transaction
     * ends (other readings of this run and a close wait; the batch then bumps the run's counters): the run, its stage count, the keys
     * of the batch already stored and the highest litres per stage.
     */
    async batchContext(wineryId: string, runId: string, clientKeys: string[]) {
      const runRes = await db.execute(sql`
        select r.status, r.plan_lot_id, coalesce(jsonb_array_length(t.stages), 0) as stage_count
        from runs r
        join plan_lots pl on pl.id = r.plan_lot_id and pl.winery_id = r.winery_id
        left join plan_trains t on t.id = pl.chosen_train_id and t.winery_id = r.winery_id
        where r.winery_id = ${wineryId}::uuid and r.id = ${runId}::uuid
        for no key update of r`);
      const run = runRes.rows[0] as { status: string; stage_count: number | string } | undefined;
      if (!run) return null;
      // One statement, one snapshot: the stored keys and the litres agree with each other.
      const seenRes = await db.execute(sql`
        select
          (select coalesce(json_agg(x.client_key), '[]'::json) from run_readings x
            where x.run_id = ${runId}::uuid and x.client_key in (select jsonb_array_elements_text(${JSON.stringify(clientKeys)}::jsonb))) as keys,
          (select coalesce(json_object_agg(s.stage_index, s.v), '{}'::json) from
            (select stage_index, max(volume_l) as v from run_readings where run_id = ${runId}::uuid group by stage_index) s) as last`);
      const seen = seenRes.rows[0] as { keys: string[]; last: Record<string, number> };
      return {
        status: run.status,
        stageCount: Number(run.stage_count),
        storedKeys: new Set(seen.keys.map(String)),
        lastVolume: new Map(Object.entries(seen.last).map(([k, v]) => [Number(k), Number(v)])),
      };
    },

    /**
     * Bulk insert in one statement (twelve array parameters unnested, so its size does not grow
     * with the number of parameters); a key already stored (a concurrent resend) is skipped. Each
     * run's stored counters (reading_count, current_volume_l) go up by what was stored, in the
     * same statement. Every path that stores readings in bulk goes through here. Returns how
     * many were stored.
     */
    async insertReadings(values: ReadingInsert[]) {
      if (values.length === 0) return 0;
      const col = <T>(pick: (v: ReadingInsert) => T) => sql.param(values.map(pick));
      const result = await db.execute<{ stored: number }>(sql`
        with ins as (
          insert into run_readings (winery_id, run_id, stage_index, at, volume_l, upstream_bar, downstream_bar, flow_lh, temp_c, client_key, created_by, created_by_name)
          select * from unnest(
            ${col((v) => v.wineryId)}::uuid[], ${col((v) => v.runId)}::uuid[], ${col((v) => v.stageIndex)}::int[],
            ${col((v) => (v.at instanceof Date ? v.at.toISOString() : (v.at ?? new Date().toISOString())))}::timestamptz[],
            ${col((v) => v.volumeL)}::float8[], ${col((v) => v.upstreamBar)}::float8[], ${col((v) => v.downstreamBar)}::float8[],
            ${col((v) => v.flowLh ?? null)}::float8[], ${col((v) => v.tempC ?? null)}::float8[], ${col((v) => v.clientKey)}::text[],
            ${col((v) => v.createdBy ?? null)}::text[], ${col((v) => v.createdByName ?? null)}::text[])
          on conflict (run_id, client_key) do nothing
          returning run_id, volume_l
        ), per_run as (
          select run_id, count(*)::int as n, max(volume_l) as v from ins group by run_id
        ), counted as (
          update runs r set reading_count = r.reading_count + p.n, current_volume_l = greatest(r.current_volume_l, p.v)
          from per_run p where r.id = p.run_id
          returning r.id
        )
        select coalesce(sum(n), 0)::int as stored from per_run`);
      return Number(result.rows[0]?.stored ?? 0);
    },

    /**
     * Counts the run's readings again from the record, after a correction or a void: readings
     * whose latest correction is not a void, and the highest (corrected) volume among them.
     */
    async recountRun(wineryId: string, runId: string) {
      await db.execute(sql`
        update runs r set reading_count = s.n, current_volume_l = s.v
        from (
          select count(*) filter (where not e.voided)::int as n, coalesce(max(e.vol) filter (where not e.voided), 0) as v
          from (
            select
              coalesce((select c.kind = 'void' from run_reading_corrections c where c.reading_id = x.id order by c.created_at desc, c.id desc limit 1), false) as voided,
              coalesce((select c.volume_l from run_reading_corrections c where c.reading_id = x.id and c.kind = 'correct' and c.volume_l is not null order by c.created_at desc, c.id desc limit 1), x.volume_l) as vol
            from run_readings x where x.run_id = ${runId}::uuid
          ) e
        ) s
        where r.winery_id = ${wineryId}::uuid and r.id = ${runId}::uuid`);
    },

    async readingByKey(wineryId: string, runId: string, clientKey: string): Promise<RunReadingRow | null> {
      const [row] = await db
        .select({ reading: runReadingsTable, byName: usersTable.name })
        .from(runReadingsTable)
        .leftJoin(usersTable, eq(usersTable.id, runReadingsTable.createdBy))
        .where(and(eq(runReadingsTable.wineryId, wineryId), eq(runReadingsTable.runId, runId), eq(runReadingsTable.clientKey, clientKey)));
      return row ? { ...row.reading, byName: row.byName } : null;
    },

    /** The run without locking it (for telling why a reading was not stored). */
    async run(wineryId: string, id: string) {
      return findOwnRow(db, runsTable, wineryId, id);
    },

    async lastReading(wineryId: string, runId: string, stageIndex: number) {
      const [row] = await db
        .select()
        .from(runReadingsTable)
        .where(and(eq(runReadingsTable.wineryId, wineryId), eq(runReadingsTable.runId, runId), eq(runReadingsTable.stageIndex, stageIndex)))
        .orderBy(desc(runReadingsTable.volumeL))
        .limit(1);
      return row ?? null;
    },

    async closeRun(wineryId: string, id: string, closedBy: string, closedByName: string | null, notes: string | undefined) {
      await db
        .update(runsTable)
        .set({ status: 'closed', closedAt: new Date(), closedBy, closedByName, updatedAt: new Date(), ...(notes !== undefined ? { notes } : {}) })
        .where(and(eq(runsTable.wineryId, wineryId), eq(runsTable.id, id)));
    },

    async types(wineryId: string, ids: string[]) {
      if (ids.length === 0) return [];
      return db
        .select({ id: cartridgeTypesTable.id, name: cartridgeTypesTable.name, terminalDpBar: cartridgeTypesTable.terminalDpBar })
        .from(cartridgeTypesTable)
        .where(and(eq(cartridgeTypesTable.wineryId, wineryId), inArray(cartridgeTypesTable.id, ids)));
    },

    async housings(wineryId: string, ids: string[]) {
      if (ids.length === 0) return [];
      return db
        .select({ id: housingsTable.id, name: housingsTable.name })
        .from(housingsTable)
        .where(and(eq(housingsTable.wineryId, wineryId), inArray(housingsTable.id, ids)));
    },

    /** Cartridges installed in these housings, locked for the update. */
    async installedIn(wineryId: string, housingIds: string[]) {
      if (housingIds.length === 0) return [];
      return db
        .select({ id: cartridgesTable.id, housingId: cartridgesTable.housingId, position: cartridgesTable.position })
        .from(cartridgesTable)
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.status, 'installed'), inArray(cartridgesTable.housingId, housingIds)))
        .for('update');
    },

    async addLitres(wineryId: string, ids: string[], litres: number) {
      if (ids.length === 0) return;
      await db
        .update(cartridgesTable)
        .set({ litresFiltered: sql`${cartridgesTable.litresFiltered} + ${litres}`, updatedAt: new Date() })
        .where(and(eq(cartridgesTable.wineryId, wineryId), inArray(cartridgesTable.id, ids)));
    },

    async housingRows(wineryId: string, ids: string[]) {
      if (ids.length === 0) return [];
      return db
        .select()
        .from(housingsTable)
        .where(and(eq(housingsTable.wineryId, wineryId), inArray(housingsTable.id, ids)));
    },

    async updateTrainStages(wineryId: string, trainId: string, stages: PlanTrainStage[]) {
      await db
        .update(planTrainsTable)
        .set({ stages, updatedAt: new Date() })
        .where(and(eq(planTrainsTable.wineryId, wineryId), eq(planTrainsTable.id, trainId)));
    },

    async reapprove(wineryId: string, planId: string, userId: string, userName: string | null) {
      await db
        .update(plansTable)
        .set({ approvedBy: userId, approvedByName: userName, approvedAt: new Date(), approvedSizing: null, updatedAt: new Date() })
        .where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.id, planId)));
    },

    /** The housings' rows, locked so nothing is installed or removed while a run starts. */
    async lockHousings(wineryId: string, ids: string[]) {
      if (ids.length === 0) return [];
      return db
        .select()
        .from(housingsTable)
        .where(and(eq(housingsTable.wineryId, wineryId), inArray(housingsTable.id, ids)))
        .for('update');
    },

    /** Every cartridge sitting in these housings (any status), with its type; locked. */
    async cartridgesIn(wineryId: string, housingIds: string[]) {
      if (housingIds.length === 0) return [];
      return db
        .select({ cartridge: cartridgesTable, type: cartridgeTypesTable })
        .from(cartridgesTable)
        .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
        .where(and(eq(cartridgesTable.wineryId, wineryId), inArray(cartridgesTable.housingId, housingIds)))
        .orderBy(asc(cartridgesTable.position), asc(cartridgesTable.serial))
        .for('update', { of: cartridgesTable });
    },

    /** These cartridges with their types; locked. */
    async cartridgesById(wineryId: string, ids: string[]) {
      if (ids.length === 0) return [];
      return db
        .select({ cartridge: cartridgesTable, type: cartridgeTypesTable })
        .from(cartridgesTable)
        .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
        .where(and(eq(cartridgesTable.wineryId, wineryId), inArray(cartridgesTable.id, ids)))
        .for('update', { of: cartridgesTable });
    },

    /** History of these cartridges (for the life forecast and the latest integrity test). */
    async eventsOf(wineryId: string, cartridgeIds: string[]) {
      if (cartridgeIds.length === 0) return [];
      return db
        .select({ cartridgeId: cartridgeEventsTable.cartridgeId, kind: cartridgeEventsTable.kind, at: cartridgeEventsTable.at, details: cartridgeEventsTable.details })
        .from(cartridgeEventsTable)
        .where(and(eq(cartridgeEventsTable.wineryId, wineryId), inArray(cartridgeEventsTable.cartridgeId, cartridgeIds)))
        .orderBy(asc(cartridgeEventsTable.at));
    },

    async insertStageCartridges(values: StageCartridgeInsert[]) {
      if (values.length === 0) return;
      await db.insert(runStageCartridgesTable).values(values);
    },

    async stageCartridges(wineryId: string, runId: string) {
      return db
        .select()
        .from(runStageCartridgesTable)
        .where(and(eq(runStageCartridgesTable.wineryId, wineryId), eq(runStageCartridgesTable.runId, runId)))
        .orderBy(asc(runStageCartridgesTable.stageIndex), asc(runStageCartridgesTable.installedAtVolumeL), asc(runStageCartridgesTable.serial));
    },

    async endStint(wineryId: string, id: string, removedAtVolumeL: number) {
      await db
        .update(runStageCartridgesTable)
        .set({ removedAtVolumeL, updatedAt: new Date() })
        .where(and(eq(runStageCartridgesTable.wineryId, wineryId), eq(runStageCartridgesTable.id, id)));
    },

    async setCarried(wineryId: string, id: string, litresCarried: number) {
      await db
        .update(runStageCartridgesTable)
        .set({ litresCarried, updatedAt: new Date() })
        .where(and(eq(runStageCartridgesTable.wineryId, wineryId), eq(runStageCartridgesTable.id, id)));
    },

    async insertChange(values: ChangeInsert) {
      const [row] = await db.insert(runChangesTable).values(values).returning();
      return row;
    },

    async changes(wineryId: string, runId: string) {
      return db
        .select()
        .from(runChangesTable)
        .where(and(eq(runChangesTable.wineryId, wineryId), eq(runChangesTable.runId, runId)))
        .orderBy(asc(runChangesTable.atVolumeL), asc(runChangesTable.createdAt));
    },

    async reading(wineryId: string, runId: string, id: string) {
      const [row] = await db
        .select()
        .from(runReadingsTable)
        .where(and(eq(runReadingsTable.wineryId, wineryId), eq(runReadingsTable.runId, runId), eq(runReadingsTable.id, id)));
      return row ?? null;
    },

    async insertCorrection(values: CorrectionInsert) {
      await db.insert(runReadingCorrectionsTable).values(values);
    },

    async corrections(wineryId: string, runId: string) {
      return db
        .select()
        .from(runReadingCorrectionsTable)
        .where(and(eq(runReadingCorrectionsTable.wineryId, wineryId), eq(runReadingCorrectionsTable.runId, runId)))
        .orderBy(asc(runReadingCorrectionsTable.createdAt), asc(runReadingCorrectionsTable.id));
    },

    async addLitresTo(wineryId: string, id: string, litres: number) {
      await db
        .update(cartridgesTable)
        .set({ litresFiltered: sql`${cartridgesTable.litresFiltered} + ${litres}`, updatedAt: new Date() })
        .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.id, id)));
    },

    async countCycle(wineryId: string, ids: string[], counter: 'steamCycles' | 'hotWaterCycles' | 'chemicalCycles' | null) {
      if (ids.length === 0 || !counter) return;
      await db
        .update(cartridgesTable)
        .set({ [counter]: sql`${cartridgesTable[counter]} + 1`, updatedAt: new Date() })
        .where(and(eq(cartridgesTable.wineryId, wineryId), inArray(cartridgesTable.id, ids)));
    },

    async insertEvents(values: EventInsert[]) {
      if (values.length === 0) return;
      await db.insert(cartridgeEventsTable).values(values);
    },

    /** Litres credited to each cartridge for a run: its 'run' event at close plus any 'run-correction' events since. */
    async creditedLitres(wineryId: string, runId: string) {
      const rows = await db
        .select({
          cartridgeId: cartridgeEventsTable.cartridgeId,
          litres: sql<number>`coalesce(sum(coalesce((${cartridgeEventsTable.details}->>'litres')::double precision, 0)), 0)`.mapWith(Number),
          housingId: sql<string | null>`(array_agg(${cartridgeEventsTable.housingId} order by ${cartridgeEventsTable.at}))[1]`,
        })
        .from(cartridgeEventsTable)
        .where(
          and(
            eq(cartridgeEventsTable.wineryId, wineryId),
            inArray(cartridgeEventsTable.kind, ['run', 'run-correction']),
            sql`${cartridgeEventsTable.details}->>'runId' = ${runId}`,
          ),
        )
        .groupBy(cartridgeEventsTable.cartridgeId);
      return rows;
    },
  };
}

export type RunsRepository = ReturnType<typeof createRunsRepository>;
