// Derived figures of a lab result, all from the engine: clogging index and its band, the Vmax
// disc test fit, and the lot readiness verdict built on them.
import {
  cloggingIndex,
  cloggingIndexBand,
  cloggingIndexVerdict,
  defaultReadinessThresholds,
  discAreaM2FromDiameterMm,
  fitConstantPressure,
  lotReadiness,
  type ReadinessThresholds,
  type WineStyle,
} from '../../../shared/engine';
import type { CloggingIndexBandDto, DiscTestDto, ReadinessDto, ReadinessThresholdsUsedDto } from '../../../shared/types/cellar';
import type { DiscPoint } from '../../db/schema';

export type LabMeasurements = {
  turbidityNtu: number | null;
  t200s: number | null;
  t400s: number | null;
  discDiameterMm: number | null;
  discPressureBar?: number | null;
  discPoints: DiscPoint[] | null;
};

export type LabAnalysis = {
  cloggingIndex: number | null;
  cloggingIndexBand: CloggingIndexBandDto | null;
  disc: DiscTestDto | null;
};

/** Runs an engine calculation; a RangeError (input outside the formula's validity) becomes its message. */
function attempt<T>(fn: () => T): { ok: true; value: T } | { ok: false; reason: string } {
  try {
    return { ok: true, value: fn() };
  } catch (error) {
    if (error instanceof RangeError) return { ok: false, reason: error.message };
    throw error;
  }
}

/** Clogging index (T400 − 2·T200) with its band, and the Vmax / initial flux of a disc test. */
export function analyseLabResult(m: LabMeasurements, thresholds: ReadinessThresholds = defaultReadinessThresholds): LabAnalysis {
  let ci: number | null = null;
  let band: CloggingIndexBandDto | null = null;
  if (m.t200s !== null && m.t400s !== null) {
    const r = attempt(() => cloggingIndex(m.t200s!, m.t400s!));
    if (r.ok) {
      ci = r.value;
      const b = cloggingIndexBand(ci);
      band = { band: b.band, label: b.label, ...cloggingIndexVerdict(ci, thresholds.cloggingIndex) };
    }
  }

  let disc: DiscTestDto | null = null;
  const points = m.discPoints ?? [];
  if (points.length > 0) {
    const base = { diameterMm: m.discDiameterMm, pressureBar: m.discPressureBar ?? null, points };
    if (m.discDiameterMm === null) {
      disc = { ...base, areaM2: null, computable: false, reason: 'Enter the disc diameter to compute Vmax.' };
    } else {
      const areaM2 = discAreaM2FromDiameterMm(m.discDiameterMm);
      const fit = attempt(() => fitConstantPressure({ points, discAreaM2: areaM2 }));
      disc = fit.ok
        ? { ...base, areaM2, computable: true, vmaxL: fit.value.vmaxL, vmaxLPerM2: fit.value.vmaxLPerM2, j0LPerM2H: fit.value.j0LPerM2H, r2: fit.value.r2 }
        : { ...base, areaM2, computable: false, reason: fit.reason };
    }
  }
  return { cloggingIndex: ci, cloggingIndexBand: band, disc };
}

/**
 * Readiness of a lot from its latest lab result (engine's lotReadiness): turbidity by style,
 * the clogging index and, where present, the Vmax per m² of the disc test.
 */
export function readinessOf(style: WineStyle, latest: (LabMeasurements & { analysis: LabAnalysis }) | null, thresholds: ReadinessThresholds): ReadinessDto {
  const vmax = latest?.analysis.disc?.computable ? latest.analysis.disc.vmaxLPerM2 : undefined;
  const r = lotReadiness(
    {
      style,
      turbidityNtu: latest?.turbidityNtu ?? undefined,
      cloggingIndex: latest?.analysis.cloggingIndex ?? undefined,
      vmaxLPerM2: vmax,
    },
    thresholds,
  );
  return { verdict: r.verdict, reasons: r.reasons };
}

/** The thresholds that apply to a style, with their sources, for showing next to the verdict. */
export function thresholdsUsed(style: WineStyle, thresholds: ReadinessThresholds, isDefault: boolean): ReadinessThresholdsUsedDto {
  const t = thresholds.turbidity[style];
  return {
    isDefault,
    turbidity: { limitNtu: t.limitNtu, borderlineMarginNtu: t.borderlineMarginNtu, source: t.source },
    cloggingIndex: { ...thresholds.cloggingIndex },
    cloggingIndexValidity: { ...thresholds.cloggingIndexValidity },
    vmax: { ...thresholds.vmax },
  };
}
