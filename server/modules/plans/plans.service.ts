import { buildDayTimeline, cartridgeSpent, dayCartridgeNeeds, requiredFlowLh, WINE_STYLES, type DayNeedsLot } from '../../../shared/engine';
import { blockingReasons, sizePlanTrain } from '../../../shared/adapters/plans';
import {
  planStartMs,
  type AddPlanLotInput,
  type ApprovePlanInput,
  type PlanListQuery,
  type PlanValues,
  type TrainValues,
  type UpdatePlanInput,
  type UpdatePlanLotInput,
  type UpdateTrainInput,
} from '../../../shared/schemas/plans';
import type { ListDto } from '../../../shared/types/api';
import type { PlanDto, PlanListItemDto, PlanLotDto, PlanNeedDto, PlanTimelineDto } from '../../../shared/types/plans';
import type { Database, DbOrTx } from '../../db/client';
import type { PlanTrainHose, PlanTrainStage } from '../../db/schema';
import { badRequest, conflict, HttpError, notFound } from '../../lib/errors';
import { refuseIfInRecord } from '../archive/archive.service';
import type { TenantContext } from '../../middleware/authorize';
import { isUniqueViolation } from '../../db/errors';
import { createCellarService } from '../cellar/cellar.service';
import { analyseLabResult } from '../cellar/lab-analysis';
import { learnedClosedRuns, pastRunOutcomes, type LearnedClosedRun } from './plans.past-runs';
import { presentPlan, presentPlanListItem, presentPlanLot, presentTimeline, presentTrain } from './plans.presenter';
import { createPlansRepository, PLAN_LOT_UNIQUE, type PlanRow, type PlansRepository } from './plans.repository';
import { audited, recordChange } from '../audit/audit.service';

const checkFields = 'Check the highlighted fields.';

const runOpen = () => conflict('A lot of this plan has a run going. Close the run first; a plan cannot change under a running lot.', 'run_open');

const locked = (status: PlanRow['status']) =>
  conflict(
    status === 'done'
      ? 'This plan is done; its record stays as it was.'
      : 'This plan is approved and read-only. An owner or cellar master can reopen it to change it.',
    'plan_locked',
  );

/** Stored stage shape (only the fields we keep). */
const stageValues = (stages: TrainValues['stages']): PlanTrainStage[] =>
  stages.map((s) => ({
    ...(s.name ? { name: s.name } : {}),
    cartridgeTypeId: s.cartridgeTypeId,
    housingId: s.housingId,
    housingCount: s.housingCount,
    ...(s.capacityLPerM2 ? { capacityLPerM2: s.capacityLPerM2 } : {}),
  }));

const hoseValues = (hoses: TrainValues['hoses']): PlanTrainHose[] | null =>
  hoses && hoses.length > 0
    ? hoses.map((h) => ({ diameterMm: h.diameterMm, lengthM: h.lengthM, roughnessMm: h.roughnessMm ?? null, sumK: h.sumK ?? null }))
    : null;

/** The winery's cartridge types, housings and stock: read once when several plans are built together. */
type Catalogue = readonly [
  Awaited<ReturnType<PlansRepository['catalogueTypes']>>,
  Awaited<ReturnType<PlansRepository['catalogueHousings']>>,
  Awaited<ReturnType<PlansRepository['stock']>>,
];

/**
 * The reads' answers, in order. A transaction is one connection: its queries go one after the
 * other (node-postgres deprecates a second query on a busy client); from the pool they run side by side.
 */
async function readAll<T extends readonly (() => Promise<unknown>)[]>(oneConnection: boolean, reads: T): Promise<{ -readonly [K in keyof T]: Awaited<ReturnType<T[K]>> }> {
  if (!oneConnection) return (await Promise.all(reads.map((read) => read()))) as never;
  const answers: unknown[] = [];
  for (const read of reads) answers.push(await read());
  return answers as never;
}

/**
 * Builds the plan's detail with every figure computed by the engine: each train's sizing, the
 * day's timeline, the cartridges the chosen trains need against stock, and what stops approval.
 */
async function buildPlan(
  repo: PlansRepository,
  wineryId: string,
  id: string,
  opts: { inTransaction?: boolean; catalogue?: Promise<Catalogue>; closedRuns?: Promise<LearnedClosedRun[]> } = {},
): Promise<PlanDto | null> {
  const row = await repo.plan(wineryId, id);
  if (!row) return null;
  const oneConnection = opts.inTransaction === true;
  const [planLots, types, housings, stock] = opts.catalogue
    ? await Promise.all([repo.planLots(wineryId, id), ...(await opts.catalogue)] as const)
    : await readAll(oneConnection, [
        () => repo.planLots(wineryId, id),
        () => repo.catalogueTypes(wineryId),
        () => repo.catalogueHousings(wineryId),
        () => repo.stock(wineryId),
      ] as const);
  const styles = [...new Set(planLots.map((p) => p.lot.style))];
  const [trains, discTests, closedRuns] = await readAll(oneConnection, [
    () => repo.trains(wineryId, planLots.map((p) => p.planLot.id)),
    () => repo.latestDiscTests(wineryId, planLots.map((p) => p.lot.id)),
    () => opts.closedRuns ?? learnedClosedRuns(repo, wineryId, styles, types),
  ] as const);
  // What the winery's closed runs of these styles tell about each cartridge type's L/m² (learned by the engine).
  const pastRuns = pastRunOutcomes(closedRuns, types, housings);
  // Capacity of membrane stages from each lot's latest Vmax disc test (when it has one).
  const vmaxByLot = new Map<string, number>();
  const labByLot = new Map<string, { cloggingIndexS: number | null; turbidityNtu: number | null }>();
  for (const t of discTests) {
    const analysis = analyseLabResult(t);
    if (analysis.disc?.computable) vmaxByLot.set(t.lotId, analysis.disc.vmaxLPerM2);
    labByLot.set(t.lotId, { cloggingIndexS: analysis.cloggingIndex, turbidityNtu: t.turbidityNtu });
  }
  const line = row.line;
  const lineSource = line ? { bottlesPerHour: line.bottlesPerHour, bottleMl: line.bottleMl } : null;
  const typeById = new Map(types.map((t) => [t.id, t]));

  const blockers: string[] = [];
  if (!line) blockers.push('Choose a bottling line for the plan.');
  if (planLots.length === 0) blockers.push('Add at least one lot to bottle.');

  const dayLots: DayNeedsLot[] = [];
  const stageNames: string[][] = [];
  const lots: PlanLotDto[] = [];
  for (const { planLot, lot: lotRow } of planLots) {
    const lot = {
      ...lotRow,
      vmaxLPerM2: vmaxByLot.get(lotRow.id) ?? null,
      cloggingIndexS: labByLot.get(lotRow.id)?.cloggingIndexS ?? null,
      turbidityNtu: labByLot.get(lotRow.id)?.turbidityNtu ?? null,
      pastRuns: pastRuns.filter((o) => o.style === lotRow.style),
    };
    const ownTrains = trains.filter((t) => t.planLotId === planLot.id);
    const dtos = ownTrains.map((t) => {
      const outcome = sizePlanTrain({ wine: lot, volumeL: planLot.volumeL, line: lineSource, stages: t.stages, hoses: t.hoses, types, housings, sanitationKind: row.plan.sanitationKind });
      return { row: t, outcome, dto: presentTrain(t, outcome, blockingReasons(outcome)) };
    });
    const chosen = dtos.find((d) => d.row.id === planLot.chosenTrainId);
    let dayStages: DayNeedsLot['stages'] = null;
    if (!chosen) {
      blockers.push(`${lot.code}: choose the train to use.`);
    } else {
      for (const reason of chosen.dto.blockingReasons) blockers.push(`${lot.code} (${chosen.row.name}): ${reason}`);
      if (chosen.outcome.ok) {
        const input = chosen.outcome.input;
        dayStages = chosen.outcome.result.stages.map((s, i) => ({
          cartridgeTypeId: chosen.row.stages[i].cartridgeTypeId,
          housingId: chosen.row.stages[i].housingId,
          housingCount: s.housingCount,
          lengthIn: input.stages[i].housing.lengthIn,
          cartridgeCount: s.cartridgeCount,
          elementEquivalents: s.elementEquivalents,
          capacityL: s.capacityL,
          regenerable: input.stages[i].cartridgeType.regenerable === true,
          maxRegenerationsPerLot: input.stages[i].cartridgeType.maxRegenerationsPerLot,
        }));
      }
    }
    dayLots.push({ lotId: planLot.id, label: lot.code, volumeL: planLot.volumeL, stages: dayStages });
    stageNames.push(chosen?.outcome.ok ? chosen.outcome.result.stages.map((s) => s.name) : []);
    lots.push(presentPlanLot(planLot, lot, dtos.map((d) => d.dto)));
  }

  // The day's needs in lot order (a set carries over between lots of the same train) against usable stock.
  const dayNeeds = dayCartridgeNeeds(
    dayLots,
    stock.map((c) => ({
      cartridgeTypeId: c.typeId,
      lengthIn: c.lengthIn,
      status: c.status,
      spent: cartridgeSpent(c, c),
      latestIntegrityPass: c.latestIntegrityPass,
    })),
  );
  const needList: PlanNeedDto[] = dayNeeds.lines.map((n) => {
    const type = typeById.get(n.cartridgeTypeId)!;
    return {
      cartridgeTypeId: n.cartridgeTypeId,
      typeName: type.name,
      kind: type.kind,
      ratingUm: type.ratingUm,
      lengthIn: n.lengthIn,
      cartridgesNeeded: n.cartridgesNeeded,
      elementEquivalentsNeeded: n.elementEquivalentsNeeded,
      inStock: n.inStock,
      installed: n.installed,
      cartridgesAvailable: n.cartridgesAvailable,
      elementEquivalentsAvailable: (n.cartridgesAvailable * n.lengthIn) / 10,
      notUsable: n.notUsable,
      shortfall: n.shortfall,
      verdict: n.verdict,
      lotCodes: n.lotLabels,
    };
  });
  needList.sort((a, b) => (a.kind === b.kind ? a.typeName.localeCompare(b.typeName) || a.lengthIn - b.lengthIn : a.kind === 'prefilter' ? -1 : 1));

  let timeline: PlanTimelineDto | null = null;
  let timelineError: string | null = null;
  let flowLh: number | null = null;
  if (line) {
    try {
      flowLh = requiredFlowLh(lineSource!);
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
      timelineError = error.message;
    }
  }
  if (!line) timelineError = 'Choose a bottling line to build the day.';
  else if (planLots.length === 0) timelineError = 'Add a lot to build the day.';
  else if (flowLh !== null) {
    try {
      const day = buildDayTimeline({
        startMs: planStartMs(row.plan.plannedDate, row.plan.startTime),
        sanitationKind: row.plan.sanitationKind,
        lots: planLots.map(({ planLot, lot }, i) => ({
          lotId: planLot.id,
          label: lot.code,
          volumeL: planLot.volumeL,
          flowLh: flowLh!,
          // Every regeneration and change of the chosen train's stages within the lot.
          stops: (dayNeeds.lots[i].stages ?? []).flatMap((use, k) => use.stops.map((stop) => ({ ...stop, stage: stageNames[i][k] }))),
        })),
      });
      timeline = presentTimeline(day, row.plan.plannedDate, null);
    } catch (error) {
      if (!(error instanceof RangeError)) throw error;
      timelineError = error.message;
    }
  }

  return presentPlan({
    plan: row.plan,
    line,
    approverName: row.approverName,
    creatorName: row.creatorName,
    requiredFlowLh: flowLh,
    lots,
    timeline,
    timelineError,
    needs: needList,
    approvalBlockers: blockers,
    types,
    housings,
  });
}

/** Bottling-day plans: lots in order, train options per lot sized by the engine, approval. */
export function createPlansService(db: Database) {
  const repo = createPlansRepository(db);
  const cellar = createCellarService(db);

  /**
   * What approval accepts only with a written reason: a chosen train's flux above design, a
   * lot not ready for membrane filtration by its latest analysis, and a cartridge stock shortfall.
   */
  async function approvalCautions(tenant: TenantContext, detail: PlanDto): Promise<string[]> {
    const cautions: string[] = [];
    for (const lot of detail.lots) {
      const train = lot.trains.find((t) => t.id === lot.chosenTrainId);
      for (const w of train?.sizing?.warnings ?? []) {
        if (w.code === 'flux-above-design') cautions.push(`${lot.lot.code}: ${w.message}`);
      }
      const readiness = (await cellar.getLot(tenant, lot.lot.id)).readiness;
      if (readiness.verdict === 'not-ready') cautions.push(`${lot.lot.code} is not ready for membrane filtration: ${readiness.reasons.join(' ')}`);
    }
    for (const n of detail.needs) {
      if (n.verdict === 'short') {
        cautions.push(
          `Stock: ${n.typeName} (${String(n.lengthIn)}-inch) needs ${String(n.cartridgesNeeded)} for the day, ${String(n.cartridgesAvailable)} usable on hand, ${String(n.shortfall)} short.`,
        );
      }
    }
    return cautions;
  }

  async function get(tenant: TenantContext, id: string): Promise<PlanDto> {
    const plan = await buildPlan(repo, tenant.wineryId, id);
    if (!plan) throw notFound('Plan');
    return plan;
  }

  /** Several plans' details in the order given (missing ones left out), the catalogue and stock read once. */
  async function getMany(tenant: TenantContext, ids: string[]): Promise<PlanDto[]> {
    if (ids.length === 0) return [];
    const catalogue = Promise.all([repo.catalogueTypes(tenant.wineryId), repo.catalogueHousings(tenant.wineryId), repo.stock(tenant.wineryId)] as const);
    catalogue.catch(() => undefined); // awaited by each plan; this only keeps a failure with no plan left from going unhandled
    // The winery's closed runs of every style, read once for all the plans.
    const closedRuns = catalogue.then(([types]) => learnedClosedRuns(repo, tenant.wineryId, [...WINE_STYLES], types));
    closedRuns.catch(() => undefined);
    const plans = await Promise.all(ids.map((id) => buildPlan(repo, tenant.wineryId, id, { catalogue, closedRuns })));
    return plans.filter((p): p is PlanDto => p !== null);
  }

  async function requireLine(r: PlansRepository, wineryId: string, lineId: string | undefined) {
    if (lineId && !(await r.lineExists(wineryId, lineId))) {
      throw badRequest(checkFields, { lineId: 'Choose one of this winery’s bottling lines.' });
    }
  }

  /** Every cartridge type and housing a train names must be the winery's own (400 per stage field). */
  async function requireCatalogue(r: PlansRepository, wineryId: string, stages: TrainValues['stages']) {
    const typeIds = await r.existingTypeIds(wineryId, [...new Set(stages.map((s) => s.cartridgeTypeId))]);
    const housingIds = await r.existingHousingIds(wineryId, [...new Set(stages.map((s) => s.housingId))]);
    const fields: Record<string, string> = {};
    stages.forEach((s, i) => {
      if (!typeIds.has(s.cartridgeTypeId)) fields[`stages.${i}.cartridgeTypeId`] = 'Choose a cartridge type from this winery’s catalogue.';
      if (!housingIds.has(s.housingId)) fields[`stages.${i}.housingId`] = 'Choose one of this winery’s housings.';
    });
    if (Object.keys(fields).length > 0) throw badRequest(checkFields, fields);
  }

  /** Runs a change to a draft plan in one transaction with the plan row locked; answers the new detail. */
  async function editDraft(tenant: TenantContext, planId: string, change: (r: PlansRepository, plan: PlanRow, tx: DbOrTx) => Promise<void>): Promise<PlanDto> {
    await db.transaction(async (tx) => {
      const r = createPlansRepository(tx);
      const plan = await r.lockPlan(tenant.wineryId, planId);
      if (!plan) throw notFound('Plan');
      if (plan.status !== 'draft') throw locked(plan.status);
      await audited(tx, tenant, { action: 'update', kind: 'plan', id: planId }, async () => {
        await change(r, plan, tx);
        await r.touchPlan(tenant.wineryId, planId);
      });
    });
    return get(tenant, planId);
  }

  async function requirePlanLot(r: PlansRepository, wineryId: string, planId: string, planLotId: string) {
    const pl = await r.planLot(wineryId, planId, planLotId);
    if (!pl) throw notFound('Lot of this plan');
    return pl;
  }

  /** Writes 1..n positions in the given order. */
  async function renumber(r: PlansRepository, wineryId: string, ids: string[]) {
    for (let i = 0; i < ids.length; i++) await r.updatePlanLot(wineryId, ids[i], { position: i + 1 });
  }

  return {
    async list(tenant: TenantContext, query: PlanListQuery): Promise<ListDto<PlanListItemDto>> {
      const { rows, total } = await repo.list(tenant.wineryId, query);
      return { items: rows.map(presentPlanListItem), total };
    },
    get,
    getMany,

    async create(tenant: TenantContext, input: PlanValues): Promise<PlanDto> {
      const id = await db.transaction(async (tx) => {
        const r = createPlansRepository(tx);
        await requireLine(r, tenant.wineryId, input.lineId);
        return audited(tx, tenant, { action: 'create', kind: 'plan' }, () => r.insertPlan(tenant.wineryId, tenant.userId, input, tenant.userName ?? null));
      });
      return get(tenant, id);
    },

    async update(tenant: TenantContext, id: string, input: UpdatePlanInput): Promise<PlanDto> {
      return editDraft(tenant, id, async (r) => {
        await requireLine(r, tenant.wineryId, input.lineId);
        await r.updatePlan(tenant.wineryId, id, input);
      });
    },

    /** Deletes a draft; approved and done plans stay for the records (409). */
    async remove(tenant: TenantContext, id: string) {
      await db.transaction(async (tx) => {
        const r = createPlansRepository(tx);
        const plan = await r.lockPlan(tenant.wineryId, id);
        if (!plan) throw notFound('Plan');
        await refuseIfInRecord(tx, 'plans', tenant.wineryId, id);
        if (plan.status !== 'draft') {
          throw conflict('Only draft plans can be deleted. Reopen an approved plan first; a done plan stays for the records.', 'plan_not_draft');
        }
        await audited(tx, tenant, { action: 'delete', kind: 'plan', id }, () => r.deletePlan(tenant.wineryId, id));
      });
    },

    /** Adds a lot of the cellar at the end of the day, to bottle its whole volume unless told otherwise. */
    async addLot(tenant: TenantContext, planId: string, input: AddPlanLotInput): Promise<PlanDto> {
      return editDraft(tenant, planId, async (r) => {
        const lot = await r.lot(tenant.wineryId, input.lotId);
        if (!lot) throw badRequest(checkFields, { lotId: 'Choose a lot from this winery’s cellar.' });
        const position = await r.nextPosition(tenant.wineryId, planId);
        try {
          await r.insertPlanLot({ wineryId: tenant.wineryId, planId, lotId: lot.id, position, volumeL: input.volumeL ?? lot.volumeL });
        } catch (error) {
          if (isUniqueViolation(error, PLAN_LOT_UNIQUE)) {
            throw new HttpError(409, 'lot_already_planned', 'This lot is already in the plan.', { lotId: 'This lot is already in the plan.' });
          }
          throw error;
        }
      });
    },

    /** Volume to bottle, place in the day (others move) and the chosen train of one lot. */
    async updateLot(tenant: TenantContext, planId: string, planLotId: string, input: UpdatePlanLotInput): Promise<PlanDto> {
      return editDraft(tenant, planId, async (r) => {
        await requirePlanLot(r, tenant.wineryId, planId, planLotId);
        if (input.chosenTrainId) {
          if (!(await r.train(tenant.wineryId, planLotId, input.chosenTrainId))) {
            throw badRequest(checkFields, { chosenTrainId: 'Choose one of this lot’s trains.' });
          }
        }
        const changes: { volumeL?: number; chosenTrainId?: string | null } = {};
        if (input.volumeL !== undefined) changes.volumeL = input.volumeL;
        if (input.chosenTrainId !== undefined) changes.chosenTrainId = input.chosenTrainId;
        if (Object.keys(changes).length > 0) await r.updatePlanLot(tenant.wineryId, planLotId, changes);
        if (input.position !== undefined) {
          const ids = (await r.orderedPlanLotIds(tenant.wineryId, planId)).filter((x) => x !== planLotId);
          ids.splice(Math.min(input.position, ids.length + 1) - 1, 0, planLotId);
          await renumber(r, tenant.wineryId, ids);
        }
      });
    },

    async removeLot(tenant: TenantContext, planId: string, planLotId: string): Promise<PlanDto> {
      return editDraft(tenant, planId, async (r, _plan, tx) => {
        await requirePlanLot(r, tenant.wineryId, planId, planLotId);
        await refuseIfInRecord(tx, 'plan-lots', tenant.wineryId, planLotId);
        await r.deletePlanLot(tenant.wineryId, planLotId);
        await renumber(r, tenant.wineryId, await r.orderedPlanLotIds(tenant.wineryId, planId));
      });
    },

    async addTrain(tenant: TenantContext, planId: string, planLotId: string, input: TrainValues): Promise<PlanDto> {
      return editDraft(tenant, planId, async (r) => {
        await requirePlanLot(r, tenant.wineryId, planId, planLotId);
        await requireCatalogue(r, tenant.wineryId, input.stages);
        await r.insertTrain({ wineryId: tenant.wineryId, planLotId, name: input.name, stages: stageValues(input.stages), hoses: hoseValues(input.hoses) });
      });
    },

    async updateTrain(tenant: TenantContext, planId: string, planLotId: string, trainId: string, input: UpdateTrainInput): Promise<PlanDto> {
      return editDraft(tenant, planId, async (r) => {
        await requirePlanLot(r, tenant.wineryId, planId, planLotId);
        if (!(await r.train(tenant.wineryId, planLotId, trainId))) throw notFound('Train');
        const changes: { name?: string; stages?: PlanTrainStage[]; hoses?: PlanTrainHose[] | null } = {};
        if (input.name !== undefined) changes.name = input.name.trim();
        if (input.stages !== undefined) {
          const stages = input.stages.map((s) => ({ ...s, housingCount: s.housingCount ?? 1 }));
          await requireCatalogue(r, tenant.wineryId, stages);
          changes.stages = stageValues(stages);
        }
        if (input.hoses !== undefined) changes.hoses = hoseValues(input.hoses as TrainValues['hoses']);
        await r.updateTrain(tenant.wineryId, trainId, changes);
      });
    },

    /** Deletes a train option; when it was the chosen one the lot has none chosen again. */
    async deleteTrain(tenant: TenantContext, planId: string, planLotId: string, trainId: string): Promise<PlanDto> {
      return editDraft(tenant, planId, async (r) => {
        await requirePlanLot(r, tenant.wineryId, planId, planLotId);
        if (!(await r.train(tenant.wineryId, planLotId, trainId))) throw notFound('Train');
        await r.deleteTrain(tenant.wineryId, trainId);
      });
    },

    /**
     * Approves a draft when every lot has a chosen train and no chosen train breaks a limit of
     * the equipment; otherwise 409 with the reasons (in `fields`, one per reason).
     */
    async approve(tenant: TenantContext, id: string, input: ApprovePlanInput = {}, now = new Date()): Promise<PlanDto> {
      await db.transaction(async (tx) => {
        const r = createPlansRepository(tx);
        const plan = await r.lockPlan(tenant.wineryId, id);
        if (!plan) throw notFound('Plan');
        if (plan.status !== 'draft') throw conflict(`This plan is already ${plan.status}.`, 'plan_not_draft');
        const detail = (await buildPlan(r, tenant.wineryId, id, { inTransaction: true }))!;
        if (detail.approvalBlockers.length > 0) {
          const fields = Object.fromEntries(detail.approvalBlockers.map((reason, i) => [`reasons.${i}`, reason]));
          throw new HttpError(409, 'plan_not_ready', `This plan cannot be approved yet: ${detail.approvalBlockers.join(' ')}`, fields);
        }
        const cautions = await approvalCautions(tenant, detail);
        const reason = input.reason?.trim() ?? '';
        if (cautions.length > 0 && reason === '') {
          const fields = Object.fromEntries(cautions.map((c, i) => [`cautions.${i}`, c]));
          throw new HttpError(409, 'plan_needs_reason', `Approving this plan needs a written reason: ${cautions.join(' ')}`, fields);
        }
        await audited(tx, tenant, { action: 'approve', kind: 'plan', id }, () =>
          r.updatePlan(tenant.wineryId, id, {
            status: 'approved',
            approvedBy: tenant.userId,
            approvedByName: tenant.userName ?? null,
            approvedAt: now,
            approvalCautions: cautions.length > 0 ? cautions : null,
            approvalReason: cautions.length > 0 ? reason : null,
            // The sized figures as approved, frozen for the filtration record.
            approvedSizing: Object.fromEntries(
              detail.lots.map((l) => [l.id, l.trains.find((t) => t.id === l.chosenTrainId)?.sizing ?? null]),
            ),
          }),
        );
      });
      return get(tenant, id);
    },

    /**
     * Back to draft from approved (an approver's "Reopen"); done plans stay done. Refused while
     * a lot of the plan has an open run. Once a run of it has closed, the approved plan stays
     * as recorded and reopening continues it as a new revision: a new draft plan row linked to
     * it (previousPlanId, revision + 1) with copies of its lots and trains; the answer is the
     * new revision.
     */
    async reopen(tenant: TenantContext, id: string): Promise<PlanDto> {
      const target = await db.transaction(async (tx) => {
        const r = createPlansRepository(tx);
        const plan = await r.lockPlan(tenant.wineryId, id);
        if (!plan) throw notFound('Plan');
        if (plan.status === 'done') throw conflict('This plan is done; its record stays as it was.', 'plan_done');
        if (plan.status === 'draft') throw conflict('This plan is already a draft.', 'plan_not_approved');
        const runs = await r.runCounts(tenant.wineryId, id);
        if (runs.open > 0) throw runOpen();
        if (runs.closed === 0) {
          await audited(tx, tenant, { action: 'reopen', kind: 'plan', id }, () =>
            r.updatePlan(tenant.wineryId, id, { status: 'draft', approvedBy: null, approvedByName: null, approvedAt: null, approvalCautions: null, approvalReason: null, approvedSizing: null }),
          );
          return id;
        }
        const later = await r.laterRevision(tenant.wineryId, id);
        if (later) throw conflict(`This plan was already continued as revision ${String(later.revision)}; open that one.`, 'plan_revised');
        const full = await r.plan(tenant.wineryId, id);
        if (!full) throw notFound('Plan');
        const p = full.plan;
        const newId = await r.insertPlanRow({
          wineryId: tenant.wineryId,
          name: p.name,
          plannedDate: p.plannedDate,
          lineId: p.lineId,
          status: 'draft',
          startTime: p.startTime,
          sanitationKind: p.sanitationKind,
          notes: p.notes,
          createdBy: tenant.userId,
          createdByName: tenant.userName ?? null,
          revision: p.revision + 1,
          previousPlanId: p.id,
        });
        const lots = await r.planLotRows(tenant.wineryId, id);
        const trains = await r.trains(tenant.wineryId, lots.map((l) => l.id));
        for (const lot of lots) {
          const copyId = await r.insertPlanLot({ wineryId: tenant.wineryId, planId: newId, lotId: lot.lotId, position: lot.position, volumeL: lot.volumeL });
          let chosen: string | null = null;
          for (const train of trains.filter((x) => x.planLotId === lot.id)) {
            const trainCopyId = await r.insertTrain({ wineryId: tenant.wineryId, planLotId: copyId, name: train.name, stages: train.stages, hoses: train.hoses });
            if (train.id === lot.chosenTrainId) chosen = trainCopyId;
          }
          if (chosen) await r.updatePlanLot(tenant.wineryId, copyId, { chosenTrainId: chosen });
        }
        await recordChange(tx, tenant, { action: 'create', kind: 'plan', id: newId });
        return newId;
      });
      return get(tenant, target);
    },

    /** Approved → done, after the day. */
    async markDone(tenant: TenantContext, id: string): Promise<PlanDto> {
      await db.transaction(async (tx) => {
        const r = createPlansRepository(tx);
        const plan = await r.lockPlan(tenant.wineryId, id);
        if (!plan) throw notFound('Plan');
        if (plan.status === 'done') throw conflict('This plan is already done.', 'plan_done');
        if (plan.status !== 'approved') throw conflict('Approve the plan before marking it done.', 'plan_not_approved');
        await audited(tx, tenant, { action: 'done', kind: 'plan', id }, () => r.updatePlan(tenant.wineryId, id, { status: 'done' }));
      });
      return get(tenant, id);
    },
  };
}
export type PlansService = ReturnType<typeof createPlansService>;

/** The winery's cartridge types and housings as plans size them (the records module reads them too). */
export function planCatalogue(db: DbOrTx) {
  const repo = createPlansRepository(db);
  return { types: (wineryId: string) => repo.catalogueTypes(wineryId), housings: (wineryId: string) => repo.catalogueHousings(wineryId) };
}

