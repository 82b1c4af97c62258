// Live previews with the engine, before anything is saved (the server judges the saved record).
import {
  allowedPressureDecayMbar,
  cartridgeLife,
  diffusionLimitForHousing,
  evaluateIntegrityTest,
  expectedBubblePointBar,
  type IntegrityTestInput,
  type IntegrityVerdict,
  type UnitSystem,
} from '@shared/engine';
import type { CycleKind, IntegrityTestKind } from '@shared/schemas/care';
import type { CareTargetDto } from '@shared/types/care';

export type RecoveryPreview = { basis: 'new' | 'first-after' | 'before'; pct: number; minPct: number };

/** Water flow after the cycle as a % of the as-new (or first) flow, else of the flow before. */
export function recoveryPreview(target: CareTargetDto, kind: CycleKind, beforeLh: number | undefined, afterLh: number | undefined): RecoveryPreview | null {
  if (afterLh === undefined || !(afterLh > 0)) return null;
  try {
    const life = cartridgeLife(
      { flowRecoveryMinPct: target.flowRecoveryMinPct },
      { litresFiltered: 0, cycles: [{ kind, waterFlowBeforeLh: beforeLh, waterFlowAfterLh: afterLh }], waterFlowNewLh: target.flowBasis?.flowLh },
    );
    const point = life.recovery.points[0];
    if (!point) return null;
    if (target.flowBasis) return { basis: target.flowBasis.kind, pct: point.recoveryPct, minPct: target.flowRecoveryMinPct };
    if (point.gainPct !== null) return { basis: 'before', pct: point.gainPct, minPct: target.flowRecoveryMinPct };
    return null;
  } catch {
    return null;
  }
}

export type TestReadings = { bubblePointBar?: number; diffusionMlMin?: number; decayMbar?: number; testMin?: number; tempC?: number };

/** The type's limit for this test, or why it cannot be judged. */
export function integrityPreview(target: CareTargetDto, test: IntegrityTestKind, r: TestReadings, system: UnitSystem): { verdict: IntegrityVerdict } | { missing: string } | null {
  try {
    let input: IntegrityTestInput;
    if (test === 'bubble-point') {
      if (target.bubblePointMinBar === null) return { missing: `${target.typeName} has no minimum bubble point in the catalogue.` };
      if (r.bubblePointBar === undefined) return null;
      const minimumBar = r.tempC !== undefined ? expectedBubblePointBar({ waterBubblePointBar: target.bubblePointMinBar, tempC: r.tempC }) : target.bubblePointMinBar;
      input = { kind: 'bubble-point', measuredBar: r.bubblePointBar, minimumBar };
    } else {
      if (target.diffusionMaxMlMinPer10in === null) return { missing: `${target.typeName} has no diffusion limit in the catalogue.` };
      const maxMlMin = diffusionLimitForHousing(target.diffusionMaxMlMinPer10in, target.elementEquivalents);
      if (test === 'diffusion') {
        if (r.diffusionMlMin === undefined) return null;
        input = { kind: 'diffusion', measuredMlMin: r.diffusionMlMin, maximumMlMin: maxMlMin };
      } else {
        if (!target.housingId) return { missing: 'Install the cartridge first: the allowed decay depends on its housing\u2019s upstream gas volume.' };
        if (target.upstreamGasVolumeL === null) return { missing: `Enter the upstream gas volume of ${target.housingName ?? 'the housing'} under Equipment first.` };
        if (r.decayMbar === undefined || r.testMin === undefined || !(r.testMin > 0)) return null;
        const maximumDecayMbar = allowedPressureDecayMbar({ diffusionLimitMlMin: maxMlMin, testMin: r.testMin, upstreamVolumeL: target.upstreamGasVolumeL });
        input = { kind: 'pressure-hold', measuredDecayMbar: r.decayMbar, maximumDecayMbar };
      }
    }
    return { verdict: evaluateIntegrityTest(input, system) };
  } catch (error) {
    return error instanceof RangeError ? { missing: error.message } : null;
  }
}
