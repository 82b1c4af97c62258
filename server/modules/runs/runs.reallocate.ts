// A reading corrected or voided after its run closed changes the litres the run carried. The
// cartridges were credited at close; this re-allocates them by the same rule as closing, in the
// correction's transaction. The 'run' events written at close are never changed: the difference
// is a 'run-correction' event of its own (who, when, from → to, why), and the change log has it.
import type { DbOrTx } from '../../db/client';
import type { TenantContext } from '../../middleware/authorize';
import { auditSnapshot, recordChange } from '../audit/audit.service';
import { effectiveReadings } from './runs.presenter';
import { createRunsRepository, type RunRow, type RunStageCartridgeRow } from './runs.repository';

/** Below this many litres two allocations are the same (float noise of sums). */
const SAME_LITRES = 1e-6;

/**
 * The litres each stint carried when the run ran to `litres` through the train: from the
 * litres when it went in to when it came out, or to the end (the rule closing uses).
 */
export function stintLitres(stint: Pick<RunStageCartridgeRow, 'installedAtVolumeL' | 'removedAtVolumeL'>, litres: number): number {
  return Math.max(0, (stint.removedAtVolumeL ?? litres) - stint.installedAtVolumeL);
}

/** Litres through the train at the end of a run: the highest counted reading or change point. */
export function runEndLitres(counted: { volumeL: number }[], stints: Pick<RunStageCartridgeRow, 'installedAtVolumeL' | 'removedAtVolumeL'>[]): number {
  return Math.max(0, ...counted.map((x) => x.volumeL), ...stints.map((s) => s.removedAtVolumeL ?? s.installedAtVolumeL));
}

/**
 * Re-allocates a closed run's litres to its cartridges after a reading correction or void.
 * Call inside the correction's transaction, after the correction row is written. Does nothing
 * for a run that is still open (litres are credited at close).
 */
export async function reallocateClosedRun(
  tx: DbOrTx,
  t: TenantContext,
  run: Pick<RunRow, 'id' | 'status' | 'planLotId'>,
  cause: { readingId: string; kind: 'correct' | 'void'; reason: string },
): Promise<void> {
  if (run.status !== 'closed') return;
  const r = createRunsRepository(tx);
  const raw = await r.readings(t.wineryId, run.id);
  const corrections = await r.corrections(t.wineryId, run.id);
  const stints = await r.stageCartridges(t.wineryId, run.id);
  const credited = await r.creditedLitres(t.wineryId, run.id);
  const counted = effectiveReadings(raw, corrections).filter((x) => !x.voided);
  const litres = runEndLitres(counted, stints);

  // What each cartridge should have been credited, with where it was (for its history entry).
  const target = new Map<string, { litres: number; housingId: string | null; stageIndex: number | null }>();
  if (stints.length > 0) {
    for (const s of stints) {
      const v = stintLitres(s, litres);
      if (s.litresCarried === null || Math.abs(s.litresCarried - v) > SAME_LITRES) await r.setCarried(t.wineryId, s.id, v);
      const prev = target.get(s.cartridgeId);
      target.set(s.cartridgeId, { litres: (prev?.litres ?? 0) + v, housingId: prev?.housingId ?? s.housingId, stageIndex: prev?.stageIndex ?? s.stageIndex });
    }
  } else {
    // A run from before runs were bound to cartridges: every cartridge credited at close carried the whole run.
    for (const c of credited) target.set(c.cartridgeId, { litres, housingId: c.housingId, stageIndex: null });
  }

  const ids = [...new Set([...target.keys(), ...credited.map((c) => c.cartridgeId)])];
  const moves = ids
    .map((id) => {
      const before = credited.find((c) => c.cartridgeId === id)?.litres ?? 0;
      const after = target.get(id)?.litres ?? 0;
      return { id, before, after, delta: after - before, where: target.get(id) };
    })
    .filter((m) => Math.abs(m.delta) > SAME_LITRES);
  if (moves.length === 0) return;

  const ctx = await r.planLot(t.wineryId, run.planLotId);
  const current = await r.cartridgesById(t.wineryId, moves.map((m) => m.id));
  const at = new Date();
  for (const m of moves) {
    const before = await auditSnapshot(tx, 'cartridge', t.wineryId, m.id);
    await r.addLitresTo(t.wineryId, m.id, m.delta);
    const now = current.find((c) => c.cartridge.id === m.id)?.cartridge;
    const housingId = m.where?.housingId ?? null;
    await r.insertEvents([
      {
        wineryId: t.wineryId,
        cartridgeId: m.id,
        kind: 'run-correction',
        actorId: t.userId,
        actorName: t.userName ?? null,
        housingId,
        position: now && housingId && now.housingId === housingId ? now.position : null,
        at,
        details: {
          runId: run.id,
          lotCode: ctx?.lot.code ?? '',
          ...(m.where?.stageIndex !== null && m.where?.stageIndex !== undefined ? { stageIndex: m.where.stageIndex } : {}),
          // litres is the difference, so summing a run's events gives what the cartridge carried
          litres: m.delta,
          litresBefore: m.before,
          litresAfter: m.after,
          readingId: cause.readingId,
          correction: cause.kind,
          reason: cause.reason,
        },
      },
    ]);
    await recordChange(tx, t, { action: 'correct', kind: 'cartridge', id: m.id, before });
  }
}
