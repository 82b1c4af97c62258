import { aliasedTable, and, asc, desc, eq, exists, gte, ilike, inArray, lt, or, sql, type SQL } from 'drizzle-orm';
import type { RecordLotsQuery } from '../../../shared/schemas/records';
import type { RecordCartridgeDto, RecordChangeDto, RecordCorrectionDto } from '../../../shared/types/records';
import type { DbOrTx } from '../../db/client';
import {
  cartridgeEventsTable,
  cartridgesTable,
  cartridgeTypesTable,
  housingsTable,
  labResultsTable,
  linesTable,
  lotsTable,
  planLotsTable,
  plansTable,
  planTrainsTable,
  runReadingsTable,
  runsTable,
  usersTable,
  runChangesTable,
  runReadingCorrectionsTable,
  runStageCartridgesTable,
} from '../../db/schema';

export type RecordRunRow = Awaited<ReturnType<ReturnType<typeof createRecordsRepository>['runsOfLot']>>[number];
export type RecordReadingRow = Awaited<ReturnType<ReturnType<typeof createRecordsRepository>['readings']>>[number];
export type RecordEventRow = Awaited<ReturnType<ReturnType<typeof createRecordsRepository>['cartridgeHistory']>>[number];

/** A cartridge that served a stage of a run, as the repository derives it. */
export type StageCartridgeRow = Pick<
  RecordCartridgeDto,
  'cartridgeId' | 'serial' | 'batch' | 'typeName' | 'kind' | 'ratingUm' | 'lengthIn' | 'litresCarried' | 'installedAtVolumeL' | 'removedAtVolumeL'
> & {
  stageIndex: number;
  /** Counters as they stand now (the service subtracts what happened since the start). */
  litresNow: number;
  steamNow: number;
  hotWaterNow: number;
  chemicalNow: number;
  /** Litres before the run, as snapshotted when the run started (runs bound to their cartridges). */
  snapshotLitresAtStart?: number;
};

/** A change or regeneration during a run. */
export type RunChangeRow = Omit<RecordChangeDto, 'at'> & { stageIndex: number; at: Date };

/** A correction or voiding of a reading (the reading row itself is never changed). */
export type ReadingCorrectionRow = Omit<RecordCorrectionDto, 'at'> & { readingId: string; at: Date };

const starter = aliasedTable(usersTable, 'starter');
const closer = aliasedTable(usersTable, 'closer');
const approver = aliasedTable(usersTable, 'approver');

/** A run event of a cartridge (written at close) names its run in details.runId. */
const runIdOfEvent = sql<string>`${cartridgeEventsTable.details} ->> 'runId'`;

export function createRecordsRepository(db: DbOrTx) {
  /** Closed runs' ids whose cartridges match the serial or batch (the reverse trace). */
  function runsThroughCartridges(wineryId: string, filter: { serial?: string; batch?: string }): SQL {
    // Switches to run_stage_cartridges (serial, batch copied at start) when that table lands.
    const conds: SQL[] = [eq(cartridgeEventsTable.wineryId, wineryId), eq(cartridgeEventsTable.kind, 'run'), sql`${runIdOfEvent} = ${runsTable.id}::text`];
    if (filter.serial) conds.push(sql`lower(${cartridgesTable.serial}) = lower(${filter.serial})`);
    if (filter.batch) conds.push(sql`lower(${cartridgesTable.batch}) = lower(${filter.batch})`);
    const snap: SQL[] = [eq(runStageCartridgesTable.wineryId, wineryId), eq(runStageCartridgesTable.runId, runsTable.id)];
    if (filter.serial) snap.push(sql`lower(${runStageCartridgesTable.serial}) = lower(${filter.serial})`);
    if (filter.batch) snap.push(sql`lower(coalesce(${runStageCartridgesTable.batch}, '')) = lower(${filter.batch})`);
    return or(
      // Runs bound to their cartridges: serial and batch as they were at the start.
      exists(db.select({ one: sql`1` }).from(runStageCartridgesTable).where(and(...snap))),
      // Older runs: the cartridges their close credited.
      exists(
        db
          .select({ one: sql`1` })
          .from(cartridgeEventsTable)
          .innerJoin(cartridgesTable, eq(cartridgesTable.id, cartridgeEventsTable.cartridgeId))
          .where(and(...conds)),
      ),
    )!;
  }

  return {
    async lot(wineryId: string, lotId: string) {
      const [row] = await db
        .select({
          id: lotsTable.id,
          code: lotsTable.code,
          name: lotsTable.name,
          style: lotsTable.style,
          vintage: lotsTable.vintage,
          volumeL: lotsTable.volumeL,
          tempC: lotsTable.tempC,
          ethanolPctVol: lotsTable.ethanolPctVol,
          sugarGPerL: lotsTable.sugarGPerL,
        })
        .from(lotsTable)
        .where(and(eq(lotsTable.wineryId, wineryId), eq(lotsTable.id, lotId)));
      return row ?? null;
    },

    /** Every run of the lot (oldest first) with its plan, chosen train, line and the names of who acted. */
    async runsOfLot(wineryId: string, lotId: string) {
      return db
        .select({
          run: runsTable,
          planLot: planLotsTable,
          plan: plansTable,
          train: planTrainsTable,
          line: linesTable,
          startedByName: starter.name,
          closedByName: closer.name,
          approvedByName: approver.name,
        })
        .from(runsTable)
        .innerJoin(planLotsTable, eq(planLotsTable.id, runsTable.planLotId))
        .innerJoin(plansTable, eq(plansTable.id, runsTable.planId))
        .leftJoin(planTrainsTable, and(eq(planTrainsTable.id, planLotsTable.chosenTrainId), eq(planTrainsTable.wineryId, wineryId)))
        .leftJoin(linesTable, and(eq(linesTable.id, plansTable.lineId), eq(linesTable.wineryId, wineryId)))
        .leftJoin(starter, eq(starter.id, runsTable.startedBy))
        .leftJoin(closer, eq(closer.id, runsTable.closedBy))
        .leftJoin(approver, eq(approver.id, plansTable.approvedBy))
        .where(and(eq(runsTable.wineryId, wineryId), eq(planLotsTable.lotId, lotId)))
        .orderBy(asc(runsTable.startedAt), asc(runsTable.id));
    },

    async labResults(wineryId: string, lotId: string) {
      return db
        .select()
        .from(labResultsTable)
        .where(and(eq(labResultsTable.wineryId, wineryId), eq(labResultsTable.lotId, lotId)))
        .orderBy(asc(labResultsTable.sampledAt), asc(labResultsTable.id));
    },

    async catalogue(wineryId: string, typeIds: string[], housingIds: string[]) {
      const [types, housings] = await Promise.all([
        typeIds.length === 0
          ? []
          : db
              .select({ id: cartridgeTypesTable.id, name: cartridgeTypesTable.name, kind: cartridgeTypesTable.kind, terminalDpBar: cartridgeTypesTable.terminalDpBar })
              .from(cartridgeTypesTable)
              .where(and(eq(cartridgeTypesTable.wineryId, wineryId), inArray(cartridgeTypesTable.id, typeIds))),
        housingIds.length === 0
          ? []
          : db
              .select({ id: housingsTable.id, name: housingsTable.name })
              .from(housingsTable)
              .where(and(eq(housingsTable.wineryId, wineryId), inArray(housingsTable.id, housingIds))),
      ]);
      return { types, housings };
    },

    async readings(wineryId: string, runId: string) {
      return db
        .select({ reading: runReadingsTable, byName: usersTable.name })
        .from(runReadingsTable)
        .leftJoin(usersTable, eq(usersTable.id, runReadingsTable.createdBy))
        .where(and(eq(runReadingsTable.wineryId, wineryId), eq(runReadingsTable.runId, runId)))
        .orderBy(asc(runReadingsTable.stageIndex), asc(runReadingsTable.volumeL), asc(runReadingsTable.at), asc(runReadingsTable.id));
    },

    /**
     * The cartridges that served each stage of a run. Today derived from what exists: for a closed
     * run, the cartridges its close credited with litres (run events naming the run); else (an open
     * run, or one closed at 0 L) those installed in the stage's housing when the run started,
     * rebuilt from the install/remove events, and for an open run those installed now.
     * TODO(run_stage_cartridges): switch to the snapshot table when it lands — one query on
     * run_stage_cartridges by run id, ordered by stage_index and serial; nothing else changes.
     */
    async stageCartridgesForRun(
      wineryId: string,
      run: { id: string; status: 'running' | 'closed'; startedAt: Date },
      stageHousingIds: string[],
    ): Promise<StageCartridgeRow[]> {
      // Runs bound to their cartridges: what the start and each change snapshotted, one row per
      // cartridge and stage (a regeneration splits a stint; the litres add up).
      const snapped = await db
        .select({
          stint: runStageCartridgesTable,
          kind: cartridgeTypesTable.kind,
          litresNow: cartridgesTable.litresFiltered,
          steamNow: cartridgesTable.steamCycles,
          hotWaterNow: cartridgesTable.hotWaterCycles,
          chemicalNow: cartridgesTable.chemicalCycles,
        })
        .from(runStageCartridgesTable)
        .innerJoin(cartridgesTable, eq(cartridgesTable.id, runStageCartridgesTable.cartridgeId))
        .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, runStageCartridgesTable.typeId))
        .where(and(eq(runStageCartridgesTable.wineryId, wineryId), eq(runStageCartridgesTable.runId, run.id)))
        .orderBy(asc(runStageCartridgesTable.installedAtVolumeL), asc(runStageCartridgesTable.createdAt));
      if (snapped.length > 0) {
        const rows = new Map<string, StageCartridgeRow>();
        for (const { stint: s, ...now } of snapped) {
          const key = `${String(s.stageIndex)}|${s.cartridgeId}`;
          const prev = rows.get(key);
          if (prev) {
            prev.litresCarried = prev.litresCarried === null || s.litresCarried === null ? null : prev.litresCarried + s.litresCarried;
            prev.removedAtVolumeL = s.removedAtVolumeL;
            continue;
          }
          rows.set(key, {
            stageIndex: s.stageIndex,
            cartridgeId: s.cartridgeId,
            serial: s.serial,
            batch: s.batch ?? '',
            typeName: s.typeName,
            kind: now.kind,
            ratingUm: s.ratingUm,
            lengthIn: s.lengthIn ?? 0,
            litresCarried: s.litresCarried,
            litresNow: now.litresNow,
            steamNow: now.steamNow,
            hotWaterNow: now.hotWaterNow,
            chemicalNow: now.chemicalNow,
            installedAtVolumeL: s.installedAtVolumeL,
            removedAtVolumeL: s.removedAtVolumeL,
            snapshotLitresAtStart: s.litresAtStart,
          });
        }
        return [...rows.values()].sort((a, b) => a.stageIndex - b.stageIndex || a.installedAtVolumeL - b.installedAtVolumeL || a.serial.localeCompare(b.serial));
      }
      if (stageHousingIds.length === 0) return [];
      const stageOfHousing = (housingId: string | null) => (housingId ? stageHousingIds.indexOf(housingId) : -1);
      const columns = {
        cartridgeId: cartridgesTable.id,
        serial: cartridgesTable.serial,
        batch: cartridgesTable.batch,
        typeName: cartridgeTypesTable.name,
        kind: cartridgeTypesTable.kind,
        ratingUm: cartridgeTypesTable.ratingUm,
        lengthIn: cartridgesTable.lengthIn,
        litresNow: cartridgesTable.litresFiltered,
        steamNow: cartridgesTable.steamCycles,
        hotWaterNow: cartridgesTable.hotWaterCycles,
        chemicalNow: cartridgesTable.chemicalCycles,
      };
      const out = new Map<string, StageCartridgeRow>();
      const add = (row: Omit<StageCartridgeRow, 'stageIndex' | 'litresCarried' | 'installedAtVolumeL' | 'removedAtVolumeL'>, housingId: string | null, litres: number | null) => {
        const stageIndex = stageOfHousing(housingId);
        if (stageIndex < 0 || out.has(row.cartridgeId)) return;
        out.set(row.cartridgeId, { ...row, stageIndex, litresCarried: litres, installedAtVolumeL: 0, removedAtVolumeL: null });
      };

      if (run.status === 'closed') {
        const credited = await db
          .select({ ...columns, housingId: cartridgeEventsTable.housingId, details: cartridgeEventsTable.details })
          .from(cartridgeEventsTable)
          .innerJoin(cartridgesTable, eq(cartridgesTable.id, cartridgeEventsTable.cartridgeId))
          .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
          .where(and(eq(cartridgeEventsTable.wineryId, wineryId), inArray(cartridgeEventsTable.kind, ['run', 'run-correction']), sql`${runIdOfEvent} = ${run.id}`))
          .orderBy(asc(cartridgeEventsTable.at));
        for (const { housingId, details, ...row } of credited) {
          const litres = typeof details.litres === 'number' && Number.isFinite(details.litres) ? details.litres : 0;
          // A correction after close adds its difference to what the close credited.
          const seen = out.get(row.cartridgeId);
          if (seen) seen.litresCarried = (seen.litresCarried ?? 0) + litres;
          else add(row, housingId, litres);
        }
      } else {
        const installed = await db
          .select({ ...columns, housingId: cartridgesTable.housingId })
          .from(cartridgesTable)
          .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
          .where(and(eq(cartridgesTable.wineryId, wineryId), eq(cartridgesTable.status, 'installed'), inArray(cartridgesTable.housingId, stageHousingIds)));
        for (const { housingId, ...row } of installed) add(row, housingId, null);
      }

      if (out.size === 0) {
        // In the housing at the start: the last install/remove event of each cartridge before the start.
        const moves = await db
          .select({ ...columns, housingId: cartridgeEventsTable.housingId, kind2: cartridgeEventsTable.kind, at: cartridgeEventsTable.at })
          .from(cartridgeEventsTable)
          .innerJoin(cartridgesTable, eq(cartridgesTable.id, cartridgeEventsTable.cartridgeId))
          .innerJoin(cartridgeTypesTable, eq(cartridgeTypesTable.id, cartridgesTable.typeId))
          .where(
            and(
              eq(cartridgeEventsTable.wineryId, wineryId),
              inArray(cartridgeEventsTable.kind, ['installed', 'removed', 'retired']),
              lt(cartridgeEventsTable.at, run.startedAt),
              or(inArray(cartridgeEventsTable.housingId, stageHousingIds), eq(cartridgeEventsTable.kind, 'retired')),
            ),
          )
          .orderBy(asc(cartridgeEventsTable.at));
        const last = new Map<string, (typeof moves)[number]>();
        for (const m of moves) last.set(m.cartridgeId, m);
        for (const { housingId, kind2, at: _at, ...row } of last.values()) {
          if (kind2 === 'installed') add(row, housingId, run.status === 'closed' ? 0 : null);
        }
      }
      return [...out.values()].sort((a, b) => a.stageIndex - b.stageIndex || a.serial.localeCompare(b.serial));
    },

    /** Changes and regenerations during a run, in volume order, with the cartridges' serials. */
    async runChanges(wineryId: string, runId: string): Promise<RunChangeRow[]> {
      const rows = await db
        .select()
        .from(runChangesTable)
        .where(and(eq(runChangesTable.wineryId, wineryId), eq(runChangesTable.runId, runId)))
        .orderBy(asc(runChangesTable.atVolumeL), asc(runChangesTable.createdAt));
      if (rows.length === 0) return [];
      const ids = [...new Set(rows.flatMap((r) => [...r.removedCartridgeIds, ...r.installedCartridgeIds]))];
      const serials = ids.length
        ? await db.select({ id: cartridgesTable.id, serial: cartridgesTable.serial }).from(cartridgesTable).where(and(eq(cartridgesTable.wineryId, wineryId), inArray(cartridgesTable.id, ids)))
        : [];
      const serialOf = new Map(serials.map((x) => [x.id, x.serial]));
      return rows.map((r) => ({
        stageIndex: r.stageIndex,
        kind: r.kind,
        atVolumeL: r.atVolumeL,
        removedSerials: r.removedCartridgeIds.map((id) => serialOf.get(id) ?? id),
        installedSerials: r.installedCartridgeIds.map((id) => serialOf.get(id) ?? id),
        byName: r.createdByName,
        at: r.createdAt,
      }));
    },

    /** Corrections and voidings of a run's readings, oldest first (the record's own order: by time alone). */
    async readingCorrections(wineryId: string, runId: string): Promise<ReadingCorrectionRow[]> {
      const rows = await db
        .select()
        .from(runReadingCorrectionsTable)
        .where(and(eq(runReadingCorrectionsTable.wineryId, wineryId), eq(runReadingCorrectionsTable.runId, runId)))
        .orderBy(asc(runReadingCorrectionsTable.createdAt));
      return rows.map((r) => ({
        readingId: r.readingId,
        kind: r.kind,
        volumeL: r.volumeL,
        upstreamBar: r.upstreamBar,
        downstreamBar: r.downstreamBar,
        flowLh: r.flowLh,
        tempC: r.tempC,
        reason: r.reason,
        byName: r.createdByName,
        at: r.createdAt,
      }));
    },

    /** Cycles, integrity tests and run credits of these cartridges, oldest first, with who. */
    async cartridgeHistory(wineryId: string, cartridgeIds: string[]) {
      if (cartridgeIds.length === 0) return [];
      return db
        .select({
          id: cartridgeEventsTable.id,
          cartridgeId: cartridgeEventsTable.cartridgeId,
          kind: cartridgeEventsTable.kind,
          details: cartridgeEventsTable.details,
          at: cartridgeEventsTable.at,
          byName: usersTable.name,
        })
        .from(cartridgeEventsTable)
        .leftJoin(usersTable, eq(usersTable.id, cartridgeEventsTable.actorId))
        .where(
          and(
            eq(cartridgeEventsTable.wineryId, wineryId),
            inArray(cartridgeEventsTable.cartridgeId, cartridgeIds),
            inArray(cartridgeEventsTable.kind, ['cycle', 'integrity', 'run', 'run-correction']),
          ),
        )
        .orderBy(asc(cartridgeEventsTable.at), asc(cartridgeEventsTable.id));
    },

    /** Bottled lots (with at least one closed run), newest bottling first, filtered and paged. */
    async bottledLots(wineryId: string, q: RecordLotsQuery) {
      const conds: SQL[] = [eq(runsTable.wineryId, wineryId), eq(runsTable.status, 'closed')];
      if (q.from) conds.push(gte(runsTable.closedAt, new Date(`${q.from}T00:00:00Z`)));
      if (q.to) conds.push(lt(runsTable.closedAt, new Date(new Date(`${q.to}T00:00:00Z`).getTime() + 86_400_000)));
      if (q.style) conds.push(eq(lotsTable.style, q.style));
      if (q.q) {
        const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
        conds.push(or(ilike(lotsTable.code, like), ilike(lotsTable.name, like), ilike(plansTable.name, like))!);
      }
      if (q.serial || q.batch) conds.push(runsThroughCartridges(wineryId, { serial: q.serial, batch: q.batch }));
      const volume = sql<number>`coalesce((select max(${runReadingsTable.volumeL}) from ${runReadingsTable} where ${runReadingsTable.runId} = ${runsTable.id}), 0)`;
      const base = db
        .select({
          lotId: lotsTable.id,
          code: lotsTable.code,
          name: lotsTable.name,
          style: lotsTable.style,
          volumeL: lotsTable.volumeL,
          runCount: sql<number>`count(*)`.mapWith(Number),
          volumeFilteredL: sql<number>`sum(${volume})`.mapWith(Number),
          lastBottledAt: sql<Date>`max(${runsTable.closedAt})`.mapWith((v: string | Date) => new Date(v)),
          planNames: sql<string[]>`array_agg(distinct ${plansTable.name})`,
          total: sql<number>`count(*) over ()`.mapWith(Number),
        })
        .from(runsTable)
        .innerJoin(planLotsTable, eq(planLotsTable.id, runsTable.planLotId))
        .innerJoin(plansTable, eq(plansTable.id, runsTable.planId))
        .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId))
        .where(and(...conds))
        .groupBy(lotsTable.id)
        .orderBy(desc(sql`max(${runsTable.closedAt})`), asc(lotsTable.code))
        .limit(q.pageSize)
        .offset((q.page - 1) * q.pageSize);
      const rows = await base;
      return { rows, total: rows[0]?.total ?? (q.page > 1 ? await countBottled() : 0) };

      async function countBottled() {
        const [row] = await db
          .select({ n: sql<number>`count(distinct ${lotsTable.id})`.mapWith(Number) })
          .from(runsTable)
          .innerJoin(planLotsTable, eq(planLotsTable.id, runsTable.planLotId))
          .innerJoin(plansTable, eq(plansTable.id, runsTable.planId))
          .innerJoin(lotsTable, eq(lotsTable.id, planLotsTable.lotId))
          .where(and(...conds));
        return row?.n ?? 0;
      }
    },
  };
}

export type RecordsRepository = ReturnType<typeof createRecordsRepository>;
