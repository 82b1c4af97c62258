// Live previews with the engine, before anything is saved (the server judges the saved record).
import {
  allowedPressureDecayMbar,
  cartridgeLife,
  diffusionLimitForHousing,
  evaluateIntegrityTest,
  judgeBubblePoint,
  normalisedWaterFlowLh,
  RECOVERY_SUSPECT_PCT,
  type IntegrityTestInput,
  type IntegrityVerdict,
  type UnitSystem,
} from '@shared/engine';
import type { CycleKind, FlowBasis, IntegrityTestKind, WettingFluid } from '@shared/schemas/care';
import type { CareTargetDto } from '@shared/types/care';

export type RecoveryPreview = { basis: 'new' | 'spec' | 'first-after' | 'before'; pct: number; minPct: number; suspect: boolean };

/**
 * Water flow after the cycle as a % of the as-new (or spec, or first) flow, else of the flow before;
 * flows first brought to one cartridge at 20 °C and the type's specification ΔP (Darcy: Q ∝ ΔP/μ). `suspect` above 105 %: a housing's flow entered as one cartridge's?
 */
export function recoveryPreview(
  target: CareTargetDto,
  kind: CycleKind,
  beforeLh: number | undefined,
  afterLh: number | undefined,
  opts: { waterTempC?: number; flowBasis?: FlowBasis; /** ΔP of the flow measurement, bar (default the type's specification ΔP) */ flowDpBar?: number } = {},
): RecoveryPreview | null {
  if (afterLh === undefined || !(afterLh > 0)) return null;
  try {
    const byHousing = opts.flowBasis === 'housing' && target.housingElementEquivalents !== null;
    const norm = (q: number | undefined) =>
      q === undefined || !(q > 0)
        ? q
        : normalisedWaterFlowLh({
            flowLh: q,
            basis: byHousing ? 'housing' : 'cartridge',
            cartridgeEquivalents: target.elementEquivalents,
            housingEquivalents: target.housingElementEquivalents ?? undefined,
            waterTempC: opts.waterTempC,
            ...(opts.flowDpBar !== undefined && opts.flowDpBar > 0 && target.waterDpBar > 0 ? { dpBar: opts.flowDpBar, refDpBar: target.waterDpBar } : {}),
          });
    const after = norm(afterLh) as number;
    const before = norm(beforeLh);
    const life = cartridgeLife(
      { flowRecoveryMinPct: target.flowRecoveryMinPct },
      { litresFiltered: 0, cycles: [{ kind, waterFlowBeforeLh: before, waterFlowAfterLh: after }], waterFlowNewLh: target.flowBasis?.flowLh },
    );
    const point = life.recovery.points[0];
    if (!point) return null;
    if (target.flowBasis) {
      return { basis: target.flowBasis.kind, pct: point.recoveryPct, minPct: target.flowRecoveryMinPct, suspect: point.recoveryPct > RECOVERY_SUSPECT_PCT };
    }
    if (point.gainPct !== null) return { basis: 'before', pct: point.gainPct, minPct: target.flowRecoveryMinPct, suspect: false };
    return null;
  } catch {
    return null;
  }
}

export type TestReadings = {
  bubblePointBar?: number;
  diffusionMlMin?: number;
  decayMbar?: number;
  testMin?: number;
  tempC?: number;
  wettingFluid?: WettingFluid;
  ethanolPctVol?: number;
};

/** 10-inch equivalents a diffusion or pressure-hold test covers: the whole housing when installed (PDA TR 26). */
export function testedEquivalents(target: CareTargetDto): number {
  return target.housingElementEquivalents ?? target.elementEquivalents;
}

/** The type's limit for this test, or why it cannot be judged; `retest` when a product-wet fail asks for a water re-test. */
export function integrityPreview(
  target: CareTargetDto,
  test: IntegrityTestKind,
  r: TestReadings,
  system: UnitSystem,
): { verdict: IntegrityVerdict & { retest?: boolean } } | { missing: string } | null {
  try {
    let input: IntegrityTestInput;
    if (test === 'bubble-point') {
      if (target.bubblePointMinBar === null) return { missing: `${target.typeName} has no minimum bubble point in the catalogue.` };
      if (r.bubblePointBar === undefined) return null;
      const fluid = r.wettingFluid ?? 'water';
      if (fluid !== 'water' && r.ethanolPctVol === undefined) return { missing: 'Enter the alcoholic strength of the wetting liquid: its surface tension sets the expected bubble point.' };
      const j = judgeBubblePoint({
        measuredBar: r.bubblePointBar,
        waterMinBar: target.bubblePointMinBar,
        tempC: r.tempC,
        wetting: fluid === 'water' ? { liquid: 'water' } : { liquid: fluid, ethanolPctVol: r.ethanolPctVol as number },
        system,
      });
      return { verdict: { pass: j.pass, reason: j.reason, retest: !j.final } };
    } else {
      if (target.diffusionMaxMlMinPer10in === null) return { missing: `${target.typeName} has no diffusion limit in the catalogue.` };
      const maxMlMin = diffusionLimitForHousing(target.diffusionMaxMlMinPer10in, testedEquivalents(target));
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
