import { fitConstantFlow, formatNumber, type TrainSizingResult } from '../../../shared/engine';
import { sizePlanTrain } from '../../../shared/adapters/plans';
import type { RecordLotsQuery, VerifyRecordInput } from '../../../shared/schemas/records';
import type {
  FilterRecordDto,
  RecordContent,
  RecordIntegrityDto,
  RecordIntegrityTestDto,
  RecordLotListDto,
  RecordReadingDto,
  RecordRunDto,
  RecordSanitationDto,
  RecordSizingDto,
  RecordStageDto,
  VerifyRecordDto,
} from '../../../shared/types/records';
import type { WinerySettingsDto } from '../../../shared/types/api';
import type { Database } from '../../db/client';
import { sha256OfCanonical } from '../../lib/canonical-json';
import { notFound } from '../../lib/errors';
import type { TenantContext } from '../../middleware/authorize';
import { planCatalogue } from '../plans/plans.service';
import { fittedCurve } from '../runs/runs.service';
import { createWinerySettingsService } from '../winery-settings/winery-settings.service';
import { judgeReadinessAt } from './readiness-at-start';
import { presentCartridge, presentChange, presentIntegrityTest, presentLotListItem, presentReading, presentSanitation } from './records.presenter';
import { createRecordsRepository, type RecordEventRow, type RecordRunRow, type StageCartridgeRow } from './records.repository';

/** What the record says of a readiness verdict that was not kept when its run started. */
export const READINESS_CURRENT_NOTE =
  'Computed with the winery’s current readiness thresholds: this run started before Porewise kept the verdict with the run, so a later change of the thresholds changes this line.';

/** Readings a stage needs before its ΔP curve is fitted (as on the run page). */
export const RECORD_MIN_READINGS_FOR_FIT = 3;
const iso = (d: Date) => d.toISOString();
const litres = (v: number) => `${formatNumber(v, 0)} L`;

/** Bottles a volume fills, whole bottles only; null without a bottle size. */
export function bottlesOf(volumeL: number, bottleMl: number | null): number | null {
  if (bottleMl === null || !(bottleMl > 0) || !Number.isFinite(volumeL)) return null;
  return Math.floor((volumeL * 1000) / bottleMl + 1e-9);
}

/** The plain sentence of the integrity proof of one membrane stage. */
function integrityOf(p: {
  membranes: StageCartridgeRow[];
  history: RecordEventRow[];
  startedAt: Date;
  afterFrom: Date | null;
  volumeL: number;
  bottles: number | null;
  bottleMl: number | null;
}): RecordIntegrityDto {
  const tests = (id: string) => p.history.filter((e) => e.cartridgeId === id && e.kind === 'integrity');
  const before: RecordIntegrityTestDto[] = [];
  const after: RecordIntegrityTestDto[] = [];
  const problems: string[] = [];
  for (const c of p.membranes) {
    const own = tests(c.cartridgeId);
    const b = [...own].reverse().find((e) => e.at.getTime() <= p.startedAt.getTime());
    if (b) before.push(presentIntegrityTest(c.serial, b));
    if (!b) problems.push(`${c.serial} has no integrity test before the run`);
    else if (b.details.pass !== true) problems.push(`${c.serial} failed its last integrity test before the run`);
    if (p.afterFrom) {
      const a = own.find((e) => e.at.getTime() >= p.afterFrom!.getTime());
      if (a) after.push(presentIntegrityTest(c.serial, a));
      if (!a) problems.push(`${c.serial} has no integrity test after the run`);
      else if (a.details.pass !== true) problems.push(`${c.serial} failed its integrity test after the run`);
    }
  }
  if (p.membranes.length === 0) {
    return { before, after, status: 'warning', statement: 'Warning: no membrane cartridge is on record for this stage, so its integrity cannot be shown.' };
  }
  if (!p.afterFrom) {
    const head = problems.length > 0 ? `Warning: ${problems.join('; ')}. ` : '';
    return { before, after, status: 'warning', statement: `${head}The run is still open: the integrity test after the run is not due yet, so no volume is proven yet.` };
  }
  if (problems.length > 0) {
    return {
      before,
      after,
      status: 'warning',
      statement: `Warning: ${problems.join('; ')}. The ${litres(p.volumeL)} filtered through this stage are not proven to have passed an integral membrane between two passing tests.`,
    };
  }
  const bottles = p.bottles === null ? '' : ` (${formatNumber(p.bottles, 0)} bottles of ${formatNumber(p.bottleMl!, 0)} mL)`;
  return {
    before,
    after,
    status: 'proven',
    statement: `${litres(p.volumeL)}${bottles} were filtered between two passing integrity tests of every membrane cartridge in this stage.`,
  };
}

/** Cartridges' counters at the run's start: the counters now minus what their history added since. */
function atStart(c: StageCartridgeRow, history: RecordEventRow[], startedAt: Date) {
  const since = history.filter((e) => e.cartridgeId === c.cartridgeId && e.at.getTime() >= startedAt.getTime());
  const count = (kind: string) => since.filter((e) => e.kind === 'cycle' && e.details.kind === kind).length;
  const litresSince = since.filter((e) => e.kind === 'run' || e.kind === 'run-correction').reduce((sum, e) => sum + (typeof e.details.litres === 'number' ? e.details.litres : 0), 0);
  return {
    litresAtStart: c.snapshotLitresAtStart ?? Math.max(0, c.litresNow - litresSince),
    cyclesAtStart: {
      steam: Math.max(0, c.steamNow - count('steam')),
      hotWater: Math.max(0, c.hotWaterNow - count('hot-water')),
      chemical: Math.max(0, c.chemicalNow - count('chemical')),
    },
  };
}

/** The bottling filtration record of each lot: everything an auditor asks, with its fingerprint. */
export function createRecordsService(db: Database) {
  const repo = createRecordsRepository(db);
  const plansRepo = planCatalogue(db);

  async function runRecord(wineryId: string, lot: NonNullable<Awaited<ReturnType<typeof repo.lot>>>, row: RecordRunRow, ctx: {
    labs: Awaited<ReturnType<typeof repo.labResults>>;
    /** The winery's thresholds now, only for runs started before readiness was kept with the run. */
    thresholds: Pick<WinerySettingsDto, 'readinessThresholds' | 'readinessThresholdsAreDefault'>;
    catalogue: { types: Awaited<ReturnType<typeof plansRepo.types>>; housings: Awaited<ReturnType<typeof plansRepo.housings>> };
  }): Promise<RecordRunDto> {
    const { run, plan, train, line, planLot } = row;
    const stages = train?.stages ?? [];
    const housingIds = stages.map((s) => s.housingId);
    const [names, readingRows, corrections, changes, cartridges] = await Promise.all([
      repo.catalogue(wineryId, [...new Set(stages.map((s) => s.cartridgeTypeId))], [...new Set(housingIds)]),
      repo.readings(wineryId, run.id),
      repo.readingCorrections(wineryId, run.id),
      repo.runChanges(wineryId, run.id),
      repo.stageCartridgesForRun(wineryId, run, housingIds),
    ]);
    const history = await repo.cartridgeHistory(
      wineryId,
      cartridges.map((c) => c.cartridgeId),
    );

    const readings: (RecordReadingDto & { stageIndex: number; effective: { volumeL: number; dpBar: number } | null })[] = readingRows.map((r) => {
      const own = corrections.filter((c) => c.readingId === r.reading.id);
      return presentReading(r, own);
    });
    const live = readings.filter((r) => r.effective !== null);
    const volumeFilteredL = live.reduce((m, r) => Math.max(m, r.effective!.volumeL), 0);
    const bottleMl = line?.bottleMl ?? null;
    const bottles = bottlesOf(volumeFilteredL, bottleMl);
    const lastReadingAt = readings.reduce<Date | null>((m, r) => (m === null || Date.parse(r.at) > m.getTime() ? new Date(r.at) : m), null);
    const afterFrom = run.status === 'closed' ? (lastReadingAt ?? run.startedAt) : null;

    // Analyses and readiness as kept when the run started; runs from before that are judged
    // now with the winery's current thresholds, and the record says so.
    const frozenReadiness = run.readinessAtStart ?? null;
    const readinessThen =
      frozenReadiness ??
      judgeReadinessAt({ style: lot.style, labs: ctx.labs, thresholds: ctx.thresholds.readinessThresholds, isDefault: ctx.thresholds.readinessThresholdsAreDefault, at: run.startedAt });

    // Sized figures of the chosen train (the train of an approved plan cannot change).
    let sizing: RecordSizingDto | null = null;
    let sizingNote: string | null = null;
    // The figures frozen when the plan was approved; else (older plans) sized again from the stored train.
    const frozen = (plan.approvedSizing?.[planLot.id] ?? null) as TrainSizingResult | null;
    const sizingSource: 'frozen-at-approval' | 'stored-train' = frozen ? 'frozen-at-approval' : 'stored-train';
    if (!train) sizingNote = 'The plan has no chosen train for this lot.';
    else {
      const outcome: { ok: true; result: TrainSizingResult } | { ok: false; error: string } = frozen ? { ok: true, result: frozen } : sizePlanTrain({
        wine: lot,
        volumeL: planLot.volumeL,
        line: line ? { bottlesPerHour: line.bottlesPerHour, bottleMl: line.bottleMl } : null,
        stages: train.stages,
        hoses: train.hoses,
        types: ctx.catalogue.types,
        housings: ctx.catalogue.housings,
      });
      if (!outcome.ok) sizingNote = outcome.error;
      else {
        const r = outcome.result;
        sizing = {
          flowLh: r.flowLh,
          batchL: r.batchL,
          runHours: r.totals.runHours,
          pumpPressureCleanBar: r.totals.pumpPressureCleanBar,
          pumpPressureEndOfRunBar: r.totals.pumpPressureEndOfRunBar,
          stages: r.stages.map((s) => ({
            index: s.index,
            name: s.name,
            kind: s.kind,
            ratingUm: s.ratingUm,
            cartridgeCount: s.cartridgeCount,
            elementEquivalents: s.elementEquivalents,
            areaM2: s.areaM2,
            fluxLmh: s.fluxLmh,
            cleanDpBar: s.cleanDpBar,
            terminalDpBar: s.terminalDpBar,
            capacityL: s.capacityL,
            setsUsed: s.setsUsed,
          })),
          warnings: r.warnings.map((w) => w.message),
        };
      }
    }

    const stageDtos: RecordStageDto[] = stages.map((s, index) => {
      const type = names.types.find((t) => t.id === s.cartridgeTypeId);
      const housing = names.housings.find((h) => h.id === s.housingId);
      const own = cartridges.filter((c) => c.stageIndex === index);
      const kind = type?.kind ?? own[0]?.kind ?? 'prefilter';
      const terminalDpBar = type?.terminalDpBar ?? 0;
      const ownReadings = readings.filter((r) => r.stageIndex === index);
      const points = ownReadings.filter((r) => r.effective !== null).map((r) => r.effective!);
      let fit: RecordStageDto['fit'] = null;
      let curve: RecordStageDto['curve'] = [];
      let fitNote: string | null = null;
      if (points.length < RECORD_MIN_READINGS_FOR_FIT) {
        fitNote = `Too few readings on this stage for a fit (${String(points.length)}; at least ${String(RECORD_MIN_READINGS_FOR_FIT)}).`;
      } else {
        const best = fitConstantFlow(points).find((f) => f.valid && f.kPerL > 0) ?? null;
        if (!best) fitNote = 'ΔP did not rise with the litres on these readings, so no law could be fitted.';
        else {
          fit = { law: best.law, dp0Bar: best.dp0Bar, kPerL: best.kPerL, r2: best.r2, n: best.n };
          // the run page's chart, frozen
          curve = terminalDpBar > 0 ? fittedCurve(best, terminalDpBar, Math.max(...points.map((q) => q.volumeL))) : [];
        }
      }
      const lastPoint = [...points].sort((a, b) => a.volumeL - b.volumeL).at(-1) ?? null;
      // Sanitation: cycles of the stage's cartridges since their previous run, up to the start.
      const sanitation: RecordSanitationDto[] = [];
      for (const c of own) {
        const mine = history.filter((e) => e.cartridgeId === c.cartridgeId && e.at.getTime() <= run.startedAt.getTime());
        const previousRun = [...mine].reverse().find((e) => e.kind === 'run');
        for (const e of mine) {
          if (e.kind === 'cycle' && (!previousRun || e.at.getTime() > previousRun.at.getTime())) sanitation.push(presentSanitation(c.serial, e));
        }
      }
      sanitation.sort((a, b) => a.at.localeCompare(b.at) || a.serial.localeCompare(b.serial));
      return {
        index,
        name: s.name ?? `Stage ${String(index + 1)}`,
        housingName: housing?.name ?? 'Unknown housing',
        kind,
        plannedTypeName: type?.name ?? 'Unknown type',
        terminalDpBar,
        cartridges: own.map((c) => presentCartridge(c, atStart(c, history, run.startedAt))),
        changes: changes.filter((c) => c.stageIndex === index).map(presentChange),
        sanitation,
        integrity:
          kind === 'membrane'
            ? integrityOf({ membranes: own, history, startedAt: run.startedAt, afterFrom, volumeL: volumeFilteredL, bottles, bottleMl })
            : null,
        readings: ownReadings.map(({ stageIndex: _s, effective: _e, ...r }) => r),
        fit,
        curve,
        finalDpBar: lastPoint ? lastPoint.dpBar : null,
        fitNote,
      };
    });

    return {
      id: run.id,
      status: run.status,
      startedAt: iso(run.startedAt),
      startedByName: run.startedByName ?? row.startedByName,
      closedAt: run.closedAt ? iso(run.closedAt) : null,
      closedByName: run.closedByName ?? row.closedByName,
      volumeFilteredL,
      bottles,
      analyses: readinessThen.analyses,
      readiness: {
        verdict: readinessThen.verdict,
        reasons: readinessThen.reasons,
        source: frozenReadiness ? 'frozen-at-start' : 'current-thresholds',
        thresholds: readinessThen.thresholds,
        note: frozenReadiness ? null : READINESS_CURRENT_NOTE,
      },
      plan: {
        id: plan.id,
        name: plan.name,
        plannedDate: plan.plannedDate,
        trainName: train?.name ?? '',
        lineName: line?.name ?? null,
        bottleMl,
        approvedAt: plan.approvedAt ? iso(plan.approvedAt) : null,
        approvedByName: row.approvedByName,
        sizingSource,
        sizing,
        sizingNote,
      },
      overrideReason: run.overrideReason ?? null,
      overrideByName: run.overrideByName ?? null,
      stages: stageDtos,
      notes: run.notes,
    };
  }

  async function content(wineryId: string, lotId: string): Promise<RecordContent> {
    const lot = await repo.lot(wineryId, lotId);
    if (!lot) throw notFound('Lot');
    const runs = await repo.runsOfLot(wineryId, lotId);
    if (runs.length === 0) throw notFound('Record of this lot (it has no run yet)');
    const [labs, thresholds, types, housings] = await Promise.all([
      repo.labResults(wineryId, lotId),
      createWinerySettingsService(db).get(wineryId),
      plansRepo.types(wineryId),
      plansRepo.housings(wineryId),
    ]);
    const runDtos: RecordRunDto[] = [];
    for (const row of runs) runDtos.push(await runRecord(wineryId, lot, row, { labs, thresholds, catalogue: { types, housings } }));
    return {
      schemaVersion: 2,
      lot: { id: lot.id, code: lot.code, name: lot.name, style: lot.style, vintage: lot.vintage, volumeL: lot.volumeL },
      runs: runDtos,
    };
  }

  /** The record with its fingerprint; `now` is when this copy is made (not part of the hash). */
  async function record(t: TenantContext, lotId: string, now = new Date()): Promise<FilterRecordDto> {
    const c = await content(t.wineryId, lotId);
    return { ...c, fingerprint: sha256OfCanonical(c), generatedAt: iso(now) };
  }

  return {
    record,

    async list(t: TenantContext, q: RecordLotsQuery): Promise<RecordLotListDto> {
      const { rows, total } = await repo.bottledLots(t.wineryId, q);
      return { items: rows.map(presentLotListItem), total };
    },

    async verify(t: TenantContext, input: VerifyRecordInput): Promise<VerifyRecordDto> {
      const r = await record(t, input.lotId);
      return { matches: r.fingerprint === input.fingerprint };
    },
  };
}

export type RecordsService = ReturnType<typeof createRecordsService>;
