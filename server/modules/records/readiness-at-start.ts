// The lot's readiness when a run starts: judged once, at the start, and kept on the run, so a
// threshold changed in Settings later (or a lab result edited) never rewrites an old record.
import type { ReadinessThresholds, WineStyle } from '../../../shared/engine';
import type { RecordAnalysesDto, RunReadinessAtStart } from '../../../shared/types/records';
import type { DbOrTx } from '../../db/client';
import { analyseLabResult, readinessOf, thresholdsUsed, type LabMeasurements } from '../cellar/lab-analysis';
import { createWinerySettingsService } from '../winery-settings/winery-settings.service';
import { createRecordsRepository } from './records.repository';

type Lab = LabMeasurements & { id: string; sampledAt: Date };

/**
 * Readiness as of `at`: the latest lab result sampled at or before `at`, judged by the engine's
 * lotReadiness against `thresholds` (the rule the record used before it was kept with the run).
 */
export function judgeReadinessAt(p: { style: WineStyle; labs: Lab[]; thresholds: ReadinessThresholds; isDefault: boolean; at: Date }): RunReadinessAtStart {
  const lab = [...p.labs].sort((a, b) => a.sampledAt.getTime() - b.sampledAt.getTime()).reverse().find((l) => l.sampledAt.getTime() <= p.at.getTime()) ?? null;
  const analysis = lab ? analyseLabResult(lab, p.thresholds) : null;
  const readiness = readinessOf(p.style, lab && analysis ? { ...lab, analysis } : null, p.thresholds);
  const analyses: RecordAnalysesDto | null =
    lab && analysis
      ? {
          sampledAt: lab.sampledAt.toISOString(),
          turbidityNtu: lab.turbidityNtu,
          cloggingIndex: analysis.cloggingIndex,
          vmaxLPerM2: analysis.disc?.computable ? analysis.disc.vmaxLPerM2 : null,
        }
      : null;
  return {
    verdict: readiness.verdict,
    reasons: readiness.reasons,
    thresholds: thresholdsUsed(p.style, p.thresholds, p.isDefault),
    analyses,
    labResultId: lab?.id ?? null,
  };
}

/** The lot's readiness now, with the winery's thresholds in force now: what a starting run keeps. */
export async function readinessAtStart(db: DbOrTx, wineryId: string, lot: { id: string; style: WineStyle }, at: Date): Promise<RunReadinessAtStart> {
  // one after the other: inside a transaction there is one connection
  const labs = await createRecordsRepository(db).labResults(wineryId, lot.id);
  const settings = await createWinerySettingsService(db).get(wineryId);
  return judgeReadinessAt({ style: lot.style, labs, thresholds: settings.readinessThresholds, isDefault: settings.readinessThresholdsAreDefault, at });
}
