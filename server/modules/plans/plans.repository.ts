import { and, asc, count, desc, eq, ilike, inArray, isNull, max, or, sql, type SQL } from 'drizzle-orm';
import type { PlanListQuery, PlanValues } from '../../../shared/schemas/plans';
import type { DbOrTx } from '../../db/client';
import {
  cartridgesTable,
  cartridgeTypesTable,
  housingsTable,
  labResultsTable,
  linesTable,
  lotsTable,
  planLotsTable,
  plansTable,
  planTrainsTable,
  runsTable,
  runStageLearningsTable,
  usersTable,
  type PlanTrainHose,
  type PlanTrainStage,
} from '../../db/schema';
import { likePattern, lockedOwnRow, orderBy, ownIdsAmong, pageWindow } from '../../db/list';

export type PlanRow = typeof plansTable.$inferSelect;
export type PlanLotRow = typeof planLotsTable.$inferSelect;
export type PlanTrainRow = typeof planTrainsTable.$inferSelect;
export type PlanLineRow = typeof linesTable.$inferSelect;
export const PLAN_LOT_UNIQUE = 'plan_lots_plan_lot_uq';

const wineryParam = sql.placeholder('wineryId');

function prepare(db: DbOrTx) {
  const approver = sql<string | null>`(select ${usersTable.name} from ${usersTable} where ${usersTable.id} = ${plansTable.approvedBy})`;
  const creator = sql<string | null>`(select ${usersTable.name} from ${usersTable} where ${usersTable.id} = ${plansTable.createdBy})`;
  return {
    plan: db
      .select({ plan: plansTable, line: linesTable, approverName: approver, creatorName: creator })
      .from(plansTable)
      .leftJoin(linesTable, eq(linesTable.id, plansTable.lineId))
      .where(and(eq(plansTable.wineryId, wineryParam), eq(plansTable.id, sql.placeholder('id'))))
      .prepare('plans_plan'),
    /** The plan's lots in order, each with the cellar lot's wine figures. */
    planLots: db
      .select({
        planLot: planLotsTable,
        lot: {
          id: lotsTable.id,
          code: lotsTable.code,
          name: lotsTable.name,
          style: lotsTable.style,
          volumeL: lotsTable.volumeL,
          tempC: lotsTable.tempC,
          ethanolPctVol: lotsTable.ethanolPctVol,
          sugarGPerL: lotsTable.sugarGPerL,
        },
      })
      .from(planLotsTable)
      .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId))
      .where(and(eq(planLotsTable.wineryId, wineryParam), eq(planLotsTable.planId, sql.placeholder('planId'))))
      .orderBy(asc(planLotsTable.position), asc(planLotsTable.createdAt))
      .prepare('plans_plan_lots'),
    catalogueTypes: db
      .select({
        id: cartridgeTypesTable.id,
        name: cartridgeTypesTable.name,
        kind: cartridgeTypesTable.kind,
        ratingUm: cartridgeTypesTable.ratingUm,
        areaM2Per10in: cartridgeTypesTable.areaM2Per10in,
        waterFlowLhPer10in: cartridgeTypesTable.waterFlowLhPer10in,
        waterDpBar: cartridgeTypesTable.waterDpBar,
        maxDpForwardBar: cartridgeTypesTable.maxDpForwardBar,
        maxDpReverseBar: cartridgeTypesTable.maxDpReverseBar,
        maxTempC: cartridgeTypesTable.maxTempC,
        terminalDpBar: cartridgeTypesTable.terminalDpBar,
        designFluxLhPer10in: cartridgeTypesTable.designFluxLhPer10in,
        pricePer10in: cartridgeTypesTable.pricePer10in,
        currency: cartridgeTypesTable.currency,
        ratedHotWaterCycles: cartridgeTypesTable.ratedHotWaterCycles,
        nominalCapacityLPerM2: cartridgeTypesTable.nominalCapacityLPerM2,
      })
      .from(cartridgeTypesTable)
      .where(eq(cartridgeTypesTable.wineryId, wineryParam))
      .orderBy(asc(cartridgeTypesTable.kind), asc(cartridgeTypesTable.name))
      .prepare('plans_catalogue_types'),
    catalogueHousings: db
      .select({
        id: housingsTable.id,
        name: housingsTable.name,
        rounds: housingsTable.rounds,
        lengthIn: housingsTable.lengthIn,
        maxPressureBar: housingsTable.maxPressureBar,
        maxTempC: housingsTable.maxTempC,
        holdUpL: housingsTable.holdUpL,
      })
      .from(housingsTable)
      .where(eq(housingsTable.wineryId, wineryParam))
      .orderBy(asc(housingsTable.name))
      .prepare('plans_catalogue_housings'),
    stock: db
      .select({
        typeId: cartridgesTable.typeId,
        lengthIn: cartridgesTable.lengthIn,
        inStock: sql<number>`cast(count(*) filter (where ${cartridgesTable.status} = 'in-stock') as int)`.mapWith(Number),
        installed: sql<number>`cast(count(*) filter (where ${cartridgesTable.status} = 'installed') as int)`.mapWith(Number),
      })
      .from(cartridgesTable)
      .where(and(eq(cartridgesTable.wineryId, wineryParam), inArray(cartridgesTable.status, ['in-stock', 'installed'])))
      .groupBy(cartridgesTable.typeId, cartridgesTable.lengthIn)
      .prepare('plans_stock'),
  };
}

export function createPlansRepository(db: DbOrTx) {
  /**
   * The plan detail's reads (on every plan page and Today), as named prepared statements: the
   * SQL is built once per repository and PostgreSQL keeps each plan per connection.
   */
  let statements: ReturnType<typeof prepare> | undefined;
  const prepared = () => (statements ??= prepare(db));
  const lotCount = sql<number>`(select cast(count(*) as int) from ${planLotsTable} where ${planLotsTable.planId} = ${plansTable.id})`.mapWith(Number);
  const volumeSum = sql<number>`(select coalesce(sum(${planLotsTable.volumeL}), 0) from ${planLotsTable} where ${planLotsTable.planId} = ${plansTable.id})`.mapWith(Number);

  return {
    /** One page of plans with the line's name, lot count and volume (one query), and the count. */
    async list(wineryId: string, query: PlanListQuery) {
      const q = query.q ? likePattern(query.q) : null;
      const where = and(
        eq(plansTable.wineryId, wineryId),
        q ? or(ilike(plansTable.name, q), ilike(plansTable.notes, q), ilike(linesTable.name, q)) : undefined,
        query.status ? eq(plansTable.status, query.status) : undefined,
        query.archived === 'true' ? undefined : isNull(plansTable.archivedAt),
      );
      const { limit, offset } = pageWindow(query);
      const [rows, [{ total }]] = await Promise.all([
        db
          .select({ plan: plansTable, lineName: linesTable.name, lotCount, volumeL: volumeSum })
          .from(plansTable)
          .leftJoin(linesTable, eq(linesTable.id, plansTable.lineId))
          .where(where)
          .orderBy(
            ...orderBy(
              query,
              { plannedDate: plansTable.plannedDate, name: plansTable.name, status: plansTable.status, createdAt: plansTable.createdAt },
              plansTable.id,
            ),
          )
          .limit(limit)
          .offset(offset),
        db
          .select({ total: count() })
          .from(plansTable)
          .leftJoin(linesTable, eq(linesTable.id, plansTable.lineId))
          .where(where),
      ]);
      return { rows, total };
    },

    /** Locks the plan row (writes to a plan and its lots and trains go through this). */
    async lockPlan(wineryId: string, id: string) {
      return lockedOwnRow(db, plansTable, wineryId, id);
    },

    /** The plan row with its line and the names of who made and approved it. */
    async plan(wineryId: string, id: string) {
      const approver = sql<string | null>`coalesce(${plansTable.approvedByName}, (select ${usersTable.name} from ${usersTable} where ${usersTable.id} = ${plansTable.approvedBy}))`;
      const creator = sql<string | null>`coalesce(${plansTable.createdByName}, (select ${usersTable.name} from ${usersTable} where ${usersTable.id} = ${plansTable.createdBy}))`;
      const [row] = await db
        .select({ plan: plansTable, line: linesTable, approverName: approver, creatorName: creator })
        .from(plansTable)
        .leftJoin(linesTable, eq(linesTable.id, plansTable.lineId))
        .where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.id, id)));
      return row ?? null;
    },

    /** The plan's lots in order, each with the cellar lot's wine figures. */
    async planLots(wineryId: string, planId: string) {
      return prepared().planLots.execute({ wineryId, planId });
    },

    /** The latest lab result's disc test of each given lot (one query), for capacity from Vmax. */
    async latestDiscTests(wineryId: string, lotIds: string[]) {
      if (lotIds.length === 0) return [];
      return db
        .selectDistinctOn([labResultsTable.lotId], {
          lotId: labResultsTable.lotId,
          turbidityNtu: labResultsTable.turbidityNtu,
          t200s: labResultsTable.t200s,
          t400s: labResultsTable.t400s,
          discDiameterMm: labResultsTable.discDiameterMm,
          discPressureBar: labResultsTable.discPressureBar,
          discPoints: labResultsTable.discPoints,
        })
        .from(labResultsTable)
        .where(and(eq(labResultsTable.wineryId, wineryId), inArray(labResultsTable.lotId, lotIds)))
        .orderBy(labResultsTable.lotId, desc(labResultsTable.sampledAt), desc(labResultsTable.createdAt));
    },

    /** Every train of the given plan lots, oldest first (one query). */
    async trains(wineryId: string, planLotIds: string[]) {
      if (planLotIds.length === 0) return [];
      return db
        .select()
        .from(planTrainsTable)
        .where(and(eq(planTrainsTable.wineryId, wineryId), inArray(planTrainsTable.planLotId, planLotIds)))
        .orderBy(asc(planTrainsTable.createdAt), asc(planTrainsTable.id));
    },

    async catalogueTypes(wineryId: string) {
      return prepared().catalogueTypes.execute({ wineryId });
    },

    async catalogueHousings(wineryId: string) {
      return prepared().catalogueHousings.execute({ wineryId });
    },

    /**
     * The winery's cartridges in stock, installed or being regenerated, with their cycle counts, their type's rated
     * cycles and the result of their latest integrity test (for the engine's usable stock).
     */
    async stock(wineryId: string) {
      return db
        .select({
          typeId: cartridgesTable.typeId,
          lengthIn: cartridgesTable.lengthIn,
          status: cartridgesTable.status,
          steamCycles: cartridgesTable.steamCycles,
          hotWaterCycles: cartridgesTable.hotWaterCycles,
          chemicalCycles: cartridgesTable.chemicalCycles,
          ratedSteamCycles: cartridgeTypesTable.ratedSteamCycles,
          ratedHotWaterCycles: cartridgeTypesTable.ratedHotWaterCycles,
          ratedChemicalCycles: cartridgeTypesTable.ratedChemicalCycles,
          latestIntegrityPass: sql<boolean | null>`(select (e.details->>'pass')::boolean from cartridge_events e where e.cartridge_id = ${cartridgesTable.id} and e.kind = 'integrity' order by e.at desc, e.id desc limit 1)`,
        })
        .from(cartridgesTable)
        .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
        .where(and(eq(cartridgesTable.wineryId, wineryId), inArray(cartridgesTable.status, ['in-stock', 'installed', 'regenerating'])));
    },

    // ---- reference checks (each scoped to the winery) --------------------------------
    async lineExists(wineryId: string, id: string) {
      const [row] = await db.select({ id: linesTable.id }).from(linesTable).where(and(eq(linesTable.wineryId, wineryId), eq(linesTable.id, id)));
      return Boolean(row);
    },
    async lot(wineryId: string, id: string) {
      const [row] = await db
        .select({ id: lotsTable.id, volumeL: lotsTable.volumeL })
        .from(lotsTable)
        .where(and(eq(lotsTable.wineryId, wineryId), eq(lotsTable.id, id)));
      return row ?? null;
    },
    async existingTypeIds(wineryId: string, ids: string[]) {
      return ownIdsAmong(db, cartridgeTypesTable, wineryId, ids);
    },
    async existingHousingIds(wineryId: string, ids: string[]) {
      return ownIdsAmong(db, housingsTable, wineryId, ids);
    },

    // ---- writes ---------------------------------------------------------------------
    async insertPlan(wineryId: string, createdBy: string, values: PlanValues, createdByName: string | null = null) {
      const [row] = await db
        .insert(plansTable)
        .values({ ...values, wineryId, createdBy, createdByName })
        .returning({ id: plansTable.id });
      return row.id;
    },
    async updatePlan(wineryId: string, id: string, changes: Partial<typeof plansTable.$inferInsert>) {
      await db
        .update(plansTable)
        .set({ ...changes, updatedAt: new Date() })
        .where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.id, id)));
    },
    /** Marks the plan as changed (a lot or train of it was edited). */
    async touchPlan(wineryId: string, id: string) {
      await db
        .update(plansTable)
        .set({ updatedAt: new Date() })
        .where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.id, id)));
    },
    /** Runs of this plan's lots: how many are open and how many closed. */
    async runCounts(wineryId: string, planId: string) {
      const [row] = await db
        .select({
          open: sql<number>`count(*) filter (where ${runsTable.status} = 'running')`.mapWith(Number),
          closed: sql<number>`count(*) filter (where ${runsTable.status} = 'closed')`.mapWith(Number),
        })
        .from(runsTable)
        .where(and(eq(runsTable.wineryId, wineryId), eq(runsTable.planId, planId)));
      return { open: row?.open ?? 0, closed: row?.closed ?? 0 };
    },
    async laterRevision(wineryId: string, planId: string) {
      const [row] = await db
        .select({ id: plansTable.id, revision: plansTable.revision })
        .from(plansTable)
        .where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.previousPlanId, planId)))
        .limit(1);
      return row ?? null;
    },
    async insertPlanRow(values: typeof plansTable.$inferInsert) {
      const [row] = await db.insert(plansTable).values(values).returning({ id: plansTable.id });
      return row.id;
    },
    async planLotRows(wineryId: string, planId: string) {
      return db
        .select()
        .from(planLotsTable)
        .where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.planId, planId)))
        .orderBy(asc(planLotsTable.position));
    },
    async deletePlan(wineryId: string, id: string) {
      await db.delete(plansTable).where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.id, id)));
    },
    async planLot(wineryId: string, planId: string, planLotId: string) {
      const [row] = await db
        .select()
        .from(planLotsTable)
        .where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.planId, planId), eq(planLotsTable.id, planLotId)));
      return row ?? null;
    },
    async nextPosition(wineryId: string, planId: string) {
      const [row] = await db
        .select({ top: max(planLotsTable.position) })
        .from(planLotsTable)
        .where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.planId, planId)));
      return (row?.top ?? 0) + 1;
    },
    async insertPlanLot(values: { wineryId: string; planId: string; lotId: string; position: number; volumeL: number }) {
      const [row] = await db.insert(planLotsTable).values(values).returning({ id: planLotsTable.id });
      return row.id;
    },
    async updatePlanLot(wineryId: string, planLotId: string, changes: Partial<Pick<PlanLotRow, 'volumeL' | 'position' | 'chosenTrainId'>>) {
      await db
        .update(planLotsTable)
        .set({ ...changes, updatedAt: new Date() })
        .where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.id, planLotId)));
    },
    async deletePlanLot(wineryId: string, planLotId: string) {
      await db.delete(planLotsTable).where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.id, planLotId)));
    },
    /** Plan-lot ids of the plan in their current order. */
    async orderedPlanLotIds(wineryId: string, planId: string) {
      const rows = await db
        .select({ id: planLotsTable.id })
        .from(planLotsTable)
        .where(and(eq(planLotsTable.wineryId, wineryId), eq(planLotsTable.planId, planId)))
        .orderBy(asc(planLotsTable.position), asc(planLotsTable.createdAt));
      return rows.map((r) => r.id);
    },
    async train(wineryId: string, planLotId: string, trainId: string) {
      const [row] = await db
        .select()
        .from(planTrainsTable)
        .where(and(eq(planTrainsTable.wineryId, wineryId), eq(planTrainsTable.planLotId, planLotId), eq(planTrainsTable.id, trainId)));
      return row ?? null;
    },
    async insertTrain(values: { wineryId: string; planLotId: string; name: string; stages: PlanTrainStage[]; hoses: PlanTrainHose[] | null }) {
      const [row] = await db.insert(planTrainsTable).values(values).returning({ id: planTrainsTable.id });
      return row.id;
    },
    async updateTrain(wineryId: string, trainId: string, changes: { name?: string; stages?: PlanTrainStage[]; hoses?: PlanTrainHose[] | null }) {
      await db
        .update(planTrainsTable)
        .set({ ...changes, updatedAt: new Date() })
        .where(and(eq(planTrainsTable.wineryId, wineryId), eq(planTrainsTable.id, trainId)));
    },
    async deleteTrain(wineryId: string, trainId: string) {
      await db.delete(planTrainsTable).where(and(eq(planTrainsTable.wineryId, wineryId), eq(planTrainsTable.id, trainId)));
    },

    /**
     * The winery's closed runs of lots of the given styles, the latest first (at most `limit` per style),
     * each with its train's stages, its readings as corrected (the latest correction of a
     * reading wins; voided ones left out), its changes and regenerations, and the lot's latest
     * lab result sampled before the run started — in one query.
     */
    /**
     * The winery's latest closed runs of these styles (at most `limit` per style, latest first)
     * with the lab figures of their lot before the run, their stages' stored learnings and what
     * those learnings must have been worked out from now (`version`: of the
     * run's readings, corrections and changes). No readings: those are read only for runs whose learning is missing
     * or out of date ({@link closedRunReadings}).
     */
    async closedRunsForCapacity(wineryId: string, styles: string[], limit: number): Promise<ClosedRunForCapacity[]> {
      if (styles.length === 0) return [];
      const result = await db.execute(sql`
        with picked as (
          select r.id, r.closed_at, r.started_at, r.winery_id, l.id as lot_id, l.style, t.stages,
            row_number() over (partition by l.style order by r.closed_at desc nulls last, r.id) as rn
          from runs r
          join plan_lots pl on pl.id = r.plan_lot_id and pl.winery_id = r.winery_id
          join lots l on l.id = pl.lot_id and l.winery_id = r.winery_id
          join plan_trains t on t.id = pl.chosen_train_id and t.winery_id = r.winery_id
          where r.winery_id = ${wineryId}::uuid and r.status = 'closed'
            and l.style in (select jsonb_array_elements_text(${JSON.stringify(styles)}::jsonb))
        )
        select p.id, p.closed_at, p.started_at, p.style, p.stages,
          lab.turbidity_ntu, lab.t200_s, lab.t400_s,
          ${runVersion(sql`p`)} as version,
          (select coalesce(json_agg(json_build_array(s.stage_index, s.inputs, s.litres, s.basis, s.sets)), '[]'::json)
            from ${runStageLearningsTable} s where s.run_id = p.id) as learned
        from picked p
        left join lateral (
          select lr.turbidity_ntu, lr.t200_s, lr.t400_s from lab_results lr
          where lr.lot_id = p.lot_id and lr.winery_id = p.winery_id and lr.sampled_at <= p.started_at
          order by lr.sampled_at desc, lr.created_at desc limit 1) lab on true
        where p.rn <= ${limit}::int
        order by p.closed_at desc nulls last, p.id`);
      return (result.rows as Record<string, unknown>[]).map((row) => ({
        id: String(row.id),
        closedAt: row.closed_at ? new Date(row.closed_at as string).toISOString() : new Date(row.started_at as string).toISOString(),
        style: row.style as ClosedRunForCapacity['style'],
        stages: row.stages as PlanTrainStage[],
        turbidityNtu: row.turbidity_ntu === null ? null : Number(row.turbidity_ntu),
        t200s: row.t200_s === null ? null : Number(row.t200_s),
        t400s: row.t400_s === null ? null : Number(row.t400_s),
        version: String(row.version),
        learned: (row.learned as [number, string, number | null, 'reached' | 'fit' | null, number | null][]).map(([stageIndex, inputs, litres, basis, sets]) => ({
          stageIndex: Number(stageIndex),
          inputs,
          learning: litres === null || basis === null || sets === null ? null : { litres: Number(litres), basis, sets: Number(sets) },
        })),
      }));
    },

    /**
     * The effective readings (latest correction applied, voided ones left out) and changes of
     * these closed runs, with their `version` read in the same statement (so a learning is stored
     * under the inputs it was really worked out from).
     */
    async closedRunReadings(wineryId: string, runIds: string[]): Promise<ClosedRunReadings[]> {
      if (runIds.length === 0) return [];
      const result = await db.execute(sql`
        select p.id, ${runVersion(sql`p`)} as version,
          (select coalesce(json_agg(json_build_array(
              rr.stage_index,
              coalesce(c.volume_l, rr.volume_l),
              coalesce(c.upstream_bar, rr.upstream_bar),
              coalesce(c.downstream_bar, rr.downstream_bar),
              case when c.id is null then rr.flow_lh else c.flow_lh end,
              case when c.id is null then rr.temp_c else c.temp_c end)), '[]'::json)
            from run_readings rr
            left join lateral (
              select x.id, x.kind, x.volume_l, x.upstream_bar, x.downstream_bar, x.flow_lh, x.temp_c
              from run_reading_corrections x where x.reading_id = rr.id and x.winery_id = p.winery_id
              order by x.created_at desc, x.id desc limit 1) c on true
            where rr.run_id = p.id and rr.winery_id = p.winery_id and (c.kind is null or c.kind <> 'void')) as readings,
          (select coalesce(json_agg(json_build_array(ch.stage_index, ch.at_volume_l)), '[]'::json)
            from run_changes ch where ch.run_id = p.id and ch.winery_id = p.winery_id) as changes
        from runs p
        where p.winery_id = ${wineryId}::uuid and p.id = any(${sql.param(runIds)}::uuid[])`);
      const num = (v: unknown) => (v === null ? null : Number(v));
      return (result.rows as Record<string, unknown>[]).map((row) => ({
        id: String(row.id),
        version: String(row.version),
        readings: (row.readings as unknown[][]).map(([stageIndex, volumeL, upstreamBar, downstreamBar, flowLh, tempC]) => ({
          stageIndex: Number(stageIndex),
          volumeL: Number(volumeL),
          upstreamBar: Number(upstreamBar),
          downstreamBar: Number(downstreamBar),
          flowLh: num(flowLh),
          tempC: num(tempC),
        })),
        changes: (row.changes as unknown[][]).map(([stageIndex, atVolumeL]) => ({ stageIndex: Number(stageIndex), atVolumeL: Number(atVolumeL) })),
      }));
    },

    /** Stores stages' learnings (replacing what was kept for the same run and stage). */
    async storeStageLearnings(rows: { runId: string; stageIndex: number; inputs: string; litres: number | null; basis: 'reached' | 'fit' | null; sets: number | null }[]) {
      if (rows.length === 0) return;
      await db
        .insert(runStageLearningsTable)
        .values(rows.map((r) => ({ ...r, computedAt: new Date() })))
        .onConflictDoUpdate({
          target: [runStageLearningsTable.runId, runStageLearningsTable.stageIndex],
          set: { inputs: sql`excluded.inputs`, litres: sql`excluded.litres`, basis: sql`excluded.basis`, sets: sql`excluded.sets`, computedAt: sql`excluded.computed_at` },
        });
    },
  };
}
export type PlansRepository = ReturnType<typeof createPlansRepository>;

/**
 * A run's inputs to its stages' learnings: the version of its readings, corrections and changes,
 * raised by triggers on every write of them (run_figures, migration 0023; 0 before the first).
 */
function runVersion(run: SQL) {
  return sql`coalesce((select f.version from run_figures f where f.run_id = ${run}.id), 0)::text`;
}

/** A stage's stored learning: litres to terminal ΔP for 1 m² (null when the stage told nothing). */
export type StoredStageLearning = { litres: number; basis: 'reached' | 'fit'; sets: number };

/** A closed run as the capacity-from-past-runs learning reads it (metric values), with what is stored of its stages. */
export type ClosedRunForCapacity = {
  id: string;
  closedAt: string;
  style: (typeof lotsTable.$inferSelect)['style'];
  stages: PlanTrainStage[];
  turbidityNtu: number | null;
  t200s: number | null;
  t400s: number | null;
  /** The version of the run's readings, corrections and changes now (see runVersion). */
  version: string;
  learned: { stageIndex: number; inputs: string; learning: StoredStageLearning | null }[];
};

/** A closed run's effective readings and changes, with the inputs they were read at. */
export type ClosedRunReadings = {
  id: string;
  version: string;
  readings: { stageIndex: number; volumeL: number; upstreamBar: number; downstreamBar: number; flowLh: number | null; tempC: number | null }[];
  changes: { stageIndex: number; atVolumeL: number }[];
};
