import { cloggingIndex, elementEquivalents, stageLitresPerM2FromRun, type PastRunStageOutcome } from '../../../shared/engine';
import type { SizingCatalogueHousing, SizingCatalogueType } from '../../../shared/adapters/plans';
import type { ClosedRunForCapacity, PlansRepository, StoredStageLearning } from './plans.repository';

/** Closed runs read for the capacity learning, at most (the latest first). */
export const PAST_RUNS_READ_MAX = 60;

/** A closed run with what each of its stages tells (litres to terminal ΔP for 1 m², or null). */
export type LearnedClosedRun = Omit<ClosedRunForCapacity, 'learned' | 'version'> & { learned: Map<number, StoredStageLearning | null> };

/** What a stage's learning is worked out from: its cartridge type and terminal ΔP, and the run's readings, corrections and changes. */
const inputsOf = (type: Pick<SizingCatalogueType, 'id' | 'terminalDpBar'>, version: string) => `${type.id}/${String(type.terminalDpBar)}/${version}`;

/**
 * The winery's closed runs of these styles with what each stage tells the capacity learning.
 * Each stage's figure is stored (run_stage_learnings) and worked out again (engine
 * `stageLitresPerM2FromRun`, for 1 m²) only when its inputs changed since — the stage's type or
 * its terminal ΔP, or the version of the run's readings, corrections and changes (raised by
 * triggers, like the run page's stored figures) — so a plan page reads the readings of the runs
 * that need it, not of every past run on each visit.
 */
export async function learnedClosedRuns(repo: PlansRepository, wineryId: string, styles: string[], types: readonly SizingCatalogueType[]): Promise<LearnedClosedRun[]> {
  const runs = await repo.closedRunsForCapacity(wineryId, styles, PAST_RUNS_READ_MAX);
  const typeById = new Map(types.map((t) => [t.id, t]));
  const usable = (stageTypeId: string) => {
    const type = typeById.get(stageTypeId);
    return type && type.terminalDpBar > 0 ? type : null;
  };
  const stale = runs.filter((run) =>
    run.stages.some((stage, index) => {
      const type = usable(stage.cartridgeTypeId);
      return type !== null && run.learned.find((l) => l.stageIndex === index)?.inputs !== inputsOf(type, run.version);
    }),
  );
  const fresh = new Map<string, Map<number, StoredStageLearning | null>>();
  if (stale.length > 0) {
    const read = await repo.closedRunReadings(
      wineryId,
      stale.map((r) => r.id),
    );
    const rows: Parameters<PlansRepository['storeStageLearnings']>[0] = [];
    for (const run of read) {
      const stages = stale.find((r) => r.id === run.id)?.stages ?? [];
      const byStage = new Map<number, StoredStageLearning | null>();
      stages.forEach((stage, index) => {
        const type = usable(stage.cartridgeTypeId);
        if (!type) return;
        const points = run.readings
          .filter((r) => r.stageIndex === index)
          .map((r) => ({ volumeL: r.volumeL, dpBar: r.upstreamBar - r.downstreamBar, flowLh: r.flowLh, tempC: r.tempC }));
        const restartsAtL = run.changes.filter((c) => c.stageIndex === index).map((c) => c.atVolumeL);
        let learning: StoredStageLearning | null = null;
        try {
          // Worked out for 1 m²: the engine divides the litres by the area last, so the plan divides by its stage's area.
          const found = stageLitresPerM2FromRun({ points, terminalDpBar: type.terminalDpBar, areaM2: 1, restartsAtL });
          learning = found ? { litres: found.lPerM2, basis: found.basis, sets: found.sets } : null;
        } catch (error) {
          if (!(error instanceof RangeError)) throw error;
        }
        byStage.set(index, learning);
        rows.push({ runId: run.id, stageIndex: index, inputs: inputsOf(type, run.version), litres: learning?.litres ?? null, basis: learning?.basis ?? null, sets: learning?.sets ?? null });
      });
      fresh.set(run.id, byStage);
    }
    await repo.storeStageLearnings(rows);
  }
  return runs.map(({ learned, version: _version, ...run }) => ({
    ...run,
    learned: fresh.get(run.id) ?? new Map(learned.map((l) => [l.stageIndex, l.learning])),
  }));
}

/**
 * What the winery's closed runs tell, stage by stage: the litres per m² each stage's sets took
 * to terminal ΔP (reached or fitted by the engine), with the lot's style, clogging index and
 * turbidity before the run. Stages whose type or housing is no longer in the catalogue, and
 * stages that tell nothing, are left out.
 */
export function pastRunOutcomes(
  runs: readonly LearnedClosedRun[],
  types: readonly SizingCatalogueType[],
  housings: readonly SizingCatalogueHousing[],
): PastRunStageOutcome[] {
  const typeById = new Map(types.map((t) => [t.id, t]));
  const housingById = new Map(housings.map((h) => [h.id, h]));
  const out: PastRunStageOutcome[] = [];
  for (const run of runs) {
    let ci: number | null = null;
    if (run.t200s !== null && run.t400s !== null) {
      try {
        ci = cloggingIndex(run.t200s, run.t400s);
      } catch (error) {
        if (!(error instanceof RangeError)) throw error;
      }
    }
    run.stages.forEach((stage, index) => {
      const type = typeById.get(stage.cartridgeTypeId);
      const housing = housingById.get(stage.housingId);
      if (!type || !housing || !(type.terminalDpBar > 0) || !(type.areaM2Per10in > 0)) return;
      const learning = run.learned.get(index);
      if (!learning) return;
      const areaM2 = elementEquivalents({ cartridges: (stage.housingCount || 1) * housing.rounds, lengthIn: housing.lengthIn as 10 | 20 | 30 | 40 }) * type.areaM2Per10in;
      if (!(areaM2 > 0)) return;
      out.push({
        runId: run.id,
        style: run.style,
        cartridgeTypeId: type.id,
        cloggingIndexS: ci,
        turbidityNtu: run.turbidityNtu,
        closedAt: run.closedAt,
        lPerM2: learning.litres / areaM2,
        basis: learning.basis,
      });
    });
  }
  return out;
}
