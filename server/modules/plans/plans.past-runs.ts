import { createHash } from 'node:crypto';
import { cloggingIndex, elementEquivalents, stageLitresPerM2FromRun, type PastRunStageOutcome } from '../../../shared/engine';
import type { SizingCatalogueHousing, SizingCatalogueType } from '../../../shared/adapters/plans';
import type { ClosedRunForCapacity } from './plans.repository';

/** Closed runs read for the capacity learning, at most (the latest first). */
export const PAST_RUNS_READ_MAX = 60;

/**
 * What a closed run's stage tells changes only with its readings (a correction) or the catalogue
 * figures it is read with, so the engine's answer is kept per (run, stage, type, area, terminal,
 * readings' signature): a plan page does not refit the same runs each time it opens.
 */
const learned = new Map<string, ReturnType<typeof stageLitresPerM2FromRun>>();
const LEARNED_MAX = 5000;

/**
 * What the winery's closed runs tell, stage by stage: the litres per m² each stage's sets took
 * to terminal ΔP (reached or fitted by the engine), with the lot's style, clogging index and
 * turbidity before the run. Stages whose type or housing is no longer in the catalogue, and
 * stages that tell nothing, are left out.
 */
export function pastRunOutcomes(
  runs: readonly ClosedRunForCapacity[],
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
      const areaM2 = elementEquivalents({ cartridges: (stage.housingCount || 1) * housing.rounds, lengthIn: housing.lengthIn as 10 | 20 | 30 | 40 }) * type.areaM2Per10in;
      const points = run.readings
        .filter((r) => r.stageIndex === index)
        .map((r) => ({ volumeL: r.volumeL, dpBar: r.upstreamBar - r.downstreamBar, flowLh: r.flowLh, tempC: r.tempC }));
      const restartsAtL = run.changes.filter((c) => c.stageIndex === index).map((c) => c.atVolumeL);
      const key = createHash('sha256').update(JSON.stringify([run.id, index, type.id, areaM2, type.terminalDpBar, restartsAtL, points])).digest('base64');
      try {
        let result = learned.get(key);
        if (result === undefined) {
          result = stageLitresPerM2FromRun({ points, terminalDpBar: type.terminalDpBar, areaM2, restartsAtL });
          if (learned.size >= LEARNED_MAX) learned.clear();
          learned.set(key, result);
        }
        if (!result) return;
        out.push({
          runId: run.id,
          style: run.style,
          cartridgeTypeId: type.id,
          cloggingIndexS: ci,
          turbidityNtu: run.turbidityNtu,
          closedAt: run.closedAt,
          lPerM2: result.lPerM2,
          basis: result.basis,
        });
      } catch (error) {
        if (!(error instanceof RangeError)) throw error;
      }
    });
  }
  return out;
}
