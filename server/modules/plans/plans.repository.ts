import { and, asc, count, desc, eq, ilike, inArray, isNull, max, or, sql } from 'drizzle-orm';
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
  usersTable,
  type PlanTrainHose,
  type PlanTrainStage,
} from '../../db/schema';
import { likePattern, orderBy, pageWindow } from '../../db/list';

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
      const [row] = await db
        .select()
        .from(plansTable)
        .where(and(eq(plansTable.wineryId, wineryId), eq(plansTable.id, id)))
        .for('update');
      return row ?? null;
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
      if (ids.length === 0) return new Set<string>();
      const rows = await db
        .select({ id: cartridgeTypesTable.id })
        .from(cartridgeTypesTable)
        .where(and(eq(cartridgeTypesTable.wineryId, wineryId), inArray(cartridgeTypesTable.id, ids)));
      return new Set(rows.map((r) => r.id));
    },
    async existingHousingIds(wineryId: string, ids: string[]) {
      if (ids.length === 0) return new Set<string>();
      const rows = await db
        .select({ id: housingsTable.id })
        .from(housingsTable)
        .where(and(eq(housingsTable.wineryId, wineryId), inArray(housingsTable.id, ids)));
      return new Set(rows.map((r) => r.id));
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
  };
}
export type PlansRepository = ReturnType<typeof createPlansRepository>;
