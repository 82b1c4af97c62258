/**
 * Flow through a filter medium (Darcy's law with a resistance from a clean-water
 * specification) and through hoses and pipes (Darcy–Weisbach with the Colebrook–White
 * friction factor, plus fitting losses in the Crane TP-410 "K = n·f_T" style).
 */
import { requireFinite, requireNonNegative, requirePositive, requireRange } from './errors';
import { waterViscosity } from './fluids';

const PA_PER_BAR = 1e5;
const M3S_PER_LH = 1e-3 / 3600;

// ---------------------------------------------------------------------------
// Darcy flow through a medium
// ---------------------------------------------------------------------------

/** Clean-water flow specification of a filter element (or of a whole stage). */
export interface MediumSpec {
  /** Water flow of the specification, L/h (> 0). */
  waterFlowLh: number;
  /** Differential pressure at that flow, bar (> 0). */
  dpBar: number;
  /** Filtration area the spec refers to, m² (> 0). */
  areaM2: number;
  /** Water temperature of the spec, °C (0–100, default 20). */
  tempC?: number;
}

/**
 * Hydraulic resistance of a clean medium, 1/m, from a clean-water flow specification:
 * R_m = ΔP·A/(μ_water(T)·Q) (Darcy 1856; resistance-in-series form used in membrane texts,
 * e.g. Zeman & Zydney, Microfiltration and Ultrafiltration). Water viscosity from IAPWS
 * R12-08 at the spec temperature (default 20 °C).
 *
 * Valid for creeping flow in an incompressible medium (R independent of ΔP). A spec that
 * includes end caps and core gives a resistance that includes them.
 *
 * @returns resistance R_m, 1/m (20 L/min at 100 mbar over 0.70 m², 20 °C → 2.0966e10)
 */
export function mediumResistance(spec: MediumSpec): number {
  const tempC = spec.tempC ?? 20;
  requirePositive('water flow of the specification', spec.waterFlowLh);
  requirePositive('pressure drop of the specification', spec.dpBar);
  requirePositive('filter area', spec.areaM2);
  requireRange('temperature of the specification', tempC, 0, 100, '°C');
  const mu = waterViscosity(tempC);
  return (spec.dpBar * PA_PER_BAR * spec.areaM2) / (mu * spec.waterFlowLh * M3S_PER_LH);
}

/** Checks the clean medium's area, resistance and the liquid's viscosity (Darcy's law both ways). */
function requireCleanMedium(args: { areaM2: number; resistancePerM: number; viscosityPaS: number }): void {
  requirePositive('filter area', args.areaM2);
  requirePositive('medium resistance', args.resistancePerM);
  requirePositive('viscosity', args.viscosityPaS);
}

/**
 * Clean differential pressure across a medium at a given flow, bar:
 * ΔP = μ·R_m·Q/A (Darcy 1856).
 *
 * @param args.flowLh          flow, L/h (≥ 0)
 * @param args.areaM2          filtration area, m² (> 0)
 * @param args.resistancePerM  medium resistance R_m, 1/m (> 0), e.g. from {@link mediumResistance}
 * @param args.viscosityPaS    liquid viscosity, Pa·s (> 0), e.g. from wineViscosity
 * @returns ΔP, bar
 */
export function cleanDpBar(args: {
  flowLh: number;
  areaM2: number;
  resistancePerM: number;
  viscosityPaS: number;
}): number {
  requireNonNegative('flow', args.flowLh);
  requireCleanMedium(args);
  return (args.viscosityPaS * args.resistancePerM * args.flowLh * M3S_PER_LH) / args.areaM2 / PA_PER_BAR;
}

/**
 * Flow through a clean medium at a given differential pressure, L/h: Q = ΔP·A/(μ·R_m)
 * (Darcy 1856) — the inverse of {@link cleanDpBar}.
 *
 * @returns flow, L/h
 */
export function cleanFlowLh(args: {
  dpBar: number;
  areaM2: number;
  resistancePerM: number;
  viscosityPaS: number;
}): number {
  requireNonNegative('pressure drop', args.dpBar);
  requireCleanMedium(args);
  return (args.dpBar * PA_PER_BAR * args.areaM2) / (args.viscosityPaS * args.resistancePerM) / M3S_PER_LH;
}

/**
 * Corrects a clean ΔP measured (or specified) with one liquid or temperature to another
 * liquid or temperature at the SAME flow: ΔP₂ = ΔP₁·μ₂/μ₁ (Darcy 1856, laminar flow in
 * the medium).
 *
 * @param dpBar            ΔP with the first liquid, bar (≥ 0)
 * @param fromViscosityPaS viscosity of the first liquid, Pa·s (> 0)
 * @param toViscosityPaS   viscosity of the second liquid, Pa·s (> 0)
 * @returns ΔP with the second liquid, bar
 */
export function correctDpForViscosity(dpBar: number, fromViscosityPaS: number, toViscosityPaS: number): number {
  requireNonNegative('pressure drop', dpBar);
  requirePositive('viscosity of the first liquid', fromViscosityPaS);
  requirePositive('viscosity of the second liquid', toViscosityPaS);
  return (dpBar * toViscosityPaS) / fromViscosityPaS;
}

/**
 * Corrects a flow through a clean medium from one liquid or temperature to another at
 * the SAME ΔP: Q₂ = Q₁·μ₁/μ₂ (Darcy 1856).
 *
 * @param flowLh           flow with the first liquid, L/h (≥ 0)
 * @param fromViscosityPaS viscosity of the first liquid, Pa·s (> 0)
 * @param toViscosityPaS   viscosity of the second liquid, Pa·s (> 0)
 * @returns flow with the second liquid, L/h
 */
export function correctFlowForViscosity(flowLh: number, fromViscosityPaS: number, toViscosityPaS: number): number {
  requireNonNegative('flow', flowLh);
  requirePositive('viscosity of the first liquid', fromViscosityPaS);
  requirePositive('viscosity of the second liquid', toViscosityPaS);
  return (flowLh * fromViscosityPaS) / toViscosityPaS;
}

/**
 * Water-temperature correction of a clean ΔP at constant flow: ΔP(t₂) = ΔP(t₁)·μ(t₂)/μ(t₁)
 * with water viscosity from IAPWS R12-08 (Darcy 1856).
 *
 * @param dpBar     ΔP at `fromTempC`, bar
 * @param fromTempC water temperature of the known ΔP, °C (0–100)
 * @param toTempC   water temperature wanted, °C (0–100)
 * @returns ΔP at `toTempC`, bar
 */
export function correctDpForWaterTemperature(dpBar: number, fromTempC: number, toTempC: number): number {
  return correctDpForViscosity(dpBar, waterViscosity(fromTempC), waterViscosity(toTempC));
}

// ---------------------------------------------------------------------------
// Pipe and hose friction
// ---------------------------------------------------------------------------

/** Reynolds number below which the flow is treated as laminar (f = 64/Re). */
export const LAMINAR_REYNOLDS_LIMIT = 2000;
/** Reynolds number from which Colebrook–White alone is used. */
export const TURBULENT_REYNOLDS_LIMIT = 4000;

/**
 * Colebrook–White Darcy friction factor (Colebrook, J. ICE 11 (1939) 133–156):
 * 1/√f = −2·log10(ε/(3.7·D) + 2.51/(Re·√f)), solved by Newton's method on x = 1/√f from the
 * Swamee–Jain (1976) explicit estimate, to |Δx| ≤ 1e-15·x (machine precision).
 *
 * @param reynolds           Reynolds number (> 0)
 * @param relativeRoughness  ε/D (0–0.1)
 * @returns Darcy friction factor
 */
export function colebrookFrictionFactor(reynolds: number, relativeRoughness: number): number {
  requirePositive('Reynolds number', reynolds);
  requireRange('relative roughness', relativeRoughness, 0, 0.1);
  const a = relativeRoughness / 3.7;
  const b = 2.51 / reynolds;
  // Swamee & Jain, J. Hydraul. Div. ASCE 102 (1976): f ≈ 0.25/[log10(ε/3.7D + 5.74/Re^0.9)]²
  const sj = 0.25 / Math.log10(a + 5.74 / reynolds ** 0.9) ** 2;
  let x = 1 / Math.sqrt(sj);
  const k = 2 / Math.LN10;
  for (let i = 0; i < 50; i++) {
    const arg = a + b * x;
    const g = x + 2 * Math.log10(arg);
    const dg = 1 + (k * b) / arg;
    const dx = g / dg;
    x -= dx;
    if (Math.abs(dx) <= 1e-15 * Math.abs(x)) break;
  }
  return 1 / (x * x);
}

/**
 * Darcy (Moody) friction factor for flow in a round pipe or hose.
 *
 * - Re < 2000: laminar, f = 64/Re (Hagen–Poiseuille).
 * - Re ≥ 4000: Colebrook–White (Colebrook 1939), solved to machine precision
 *   ({@link colebrookFrictionFactor}); Moody, Trans. ASME 66 (1944) charts the same law.
 * - 2000 ≤ Re < 4000 (transition, no reliable law): returns the LARGER of 64/Re and the
 *   Colebrook value — a deliberately conservative choice for pressure-drop sizing. In
 *   practice the Colebrook value is the larger one throughout this band, so f jumps up at
 *   Re = 2000 and is continuous at Re = 4000.
 *
 * @param reynolds           Reynolds number ρ·v·D/μ (> 0)
 * @param relativeRoughness  ε/D (0–0.1)
 * @returns Darcy friction factor (= 4 × Fanning)
 */
export function frictionFactor(reynolds: number, relativeRoughness: number): number {
  requirePositive('Reynolds number', reynolds);
  requireRange('relative roughness', relativeRoughness, 0, 0.1);
  const laminar = 64 / reynolds;
  if (reynolds < LAMINAR_REYNOLDS_LIMIT) return laminar;
  const turbulent = colebrookFrictionFactor(reynolds, relativeRoughness);
  if (reynolds < TURBULENT_REYNOLDS_LIMIT) return Math.max(laminar, turbulent);
  return turbulent;
}

/** Inputs of {@link lineLossBar} and {@link lineFlowDetails}. */
export interface LineArgs {
  /** Flow, L/h (≥ 0). */
  flowLh: number;
  /** Inside diameter, mm (> 0). */
  diameterMm: number;
  /** Length of straight pipe or hose, m (≥ 0). */
  lengthM: number;
  /** Absolute roughness ε, mm (≥ 0; drawn stainless ≈ 0.0015, commercial steel 0.046). */
  roughnessMm: number;
  /** Liquid density, kg/m³ (> 0). */
  densityKgM3: number;
  /** Liquid viscosity, Pa·s (> 0). */
  viscosityPaS: number;
  /** Sum of fitting loss coefficients K on the line velocity (≥ 0, default 0). */
  sumK?: number;
}

/** Breakdown of a line loss computed by {@link lineFlowDetails}. */
export interface LineFlowDetails {
  /** Mean velocity, m/s. */
  velocityMS: number;
  /** Reynolds number. */
  reynolds: number;
  /** Darcy friction factor used. */
  frictionFactor: number;
  /** Straight-length (friction) loss, Pa. */
  frictionLossPa: number;
  /** Fitting (minor) loss, Pa. */
  fittingLossPa: number;
  /** Total loss, bar. */
  totalBar: number;
}

/**
 * Velocity, Reynolds number, friction factor and pressure losses of a line
 * (Darcy–Weisbach: ΔP = (f·L/D + ΣK)·ρv²/2, v = 4Q/(πD²), Re = ρvD/μ; f from
 * {@link frictionFactor}). Zero flow gives zero loss.
 */
export function lineFlowDetails(args: LineArgs): LineFlowDetails {
  const sumK = args.sumK ?? 0;
  requireNonNegative('flow', args.flowLh);
  requirePositive('pipe diameter', args.diameterMm);
  requireNonNegative('pipe length', args.lengthM);
  requireNonNegative('pipe roughness', args.roughnessMm);
  requirePositive('density', args.densityKgM3);
  requirePositive('viscosity', args.viscosityPaS);
  requireNonNegative('sum of fitting K factors', sumK);
  const D = args.diameterMm / 1000;
  const relRough = args.roughnessMm / args.diameterMm;
  requireRange('relative roughness (roughness ÷ diameter)', relRough, 0, 0.1);
  if (args.flowLh === 0) {
    return { velocityMS: 0, reynolds: 0, frictionFactor: 0, frictionLossPa: 0, fittingLossPa: 0, totalBar: 0 };
  }
  const Q = args.flowLh * M3S_PER_LH;
  const v = (4 * Q) / (Math.PI * D * D);
  const re = (args.densityKgM3 * v * D) / args.viscosityPaS;
  const f = frictionFactor(re, relRough);
  const dyn = (args.densityKgM3 * v * v) / 2;
  const frictionLossPa = ((f * args.lengthM) / D) * dyn;
  const fittingLossPa = sumK * dyn;
  return {
    velocityMS: v,
    reynolds: re,
    frictionFactor: f,
    frictionLossPa,
    fittingLossPa,
    totalBar: (frictionLossPa + fittingLossPa) / PA_PER_BAR,
  };
}

/**
 * Pressure loss of a pipe or hose run, bar: Darcy–Weisbach with the Darcy friction
 * factor of {@link frictionFactor} (Colebrook 1939 / laminar 64/Re) plus fitting losses
 * ΣK·ρv²/2 (Crane Co., Technical Paper No. 410).
 *
 * @returns loss, bar (6 m³/h water at 20 °C, D 40 mm, 10 m, ε 0.0015 mm → 0.04559 bar)
 */
export function lineLossBar(args: LineArgs): number {
  return lineFlowDetails(args).totalBar;
}

// ---------------------------------------------------------------------------
// Fittings — Crane TP-410 style K = n·f_T
// ---------------------------------------------------------------------------

/** How confident the tabulated value is. */
export type FittingSourceTag = 'read-in-source' | 'from-memory';

/** One fitting type with its loss coefficient rule. */
export interface FittingK {
  /** Stable identifier used in saved data. */
  id: string;
  /** Plain label. */
  label: string;
  /** 'nfT': K = n × f_T (f_T = fully turbulent friction factor of the size); 'fixed': K = value. */
  kind: 'nfT' | 'fixed';
  /** n for 'nfT', K for 'fixed'. */
  value: number;
  /** Where the number comes from. */
  source: string;
  /** Whether the number was read in the source or is recalled from memory. */
  tag: FittingSourceTag;
}

const CRANE = 'Crane Co., Technical Paper No. 410 (1988 and later eds.)';

/**
 * Fitting loss coefficients in the Crane TP-410 style (K = n·f_T for valves and fittings,
 * fixed K for entrances and exits). Hygienic clamp/DIN 11851 fittings have no standard K
 * tables; these are estimates that users may override.
 */
export const FITTING_K_FACTORS: readonly FittingK[] = [
  { id: 'elbow-90-standard', label: '90° standard (threaded) elbow', kind: 'nfT', value: 30, source: CRANE, tag: 'read-in-source' },
  { id: 'elbow-45-standard', label: '45° standard elbow', kind: 'nfT', value: 16, source: CRANE, tag: 'read-in-source' },
  { id: 'bend-90-r1.5', label: '90° bend / butt-weld elbow, r/d = 1.5', kind: 'nfT', value: 14, source: `${CRANE}, p. A-29`, tag: 'read-in-source' },
  { id: 'bend-90-r1', label: '90° bend, r/d = 1', kind: 'nfT', value: 20, source: CRANE, tag: 'from-memory' },
  { id: 'bend-90-r2', label: '90° bend, r/d = 2', kind: 'nfT', value: 12, source: CRANE, tag: 'from-memory' },
  { id: 'bend-90-r3', label: '90° bend, r/d = 3', kind: 'nfT', value: 12, source: CRANE, tag: 'from-memory' },
  { id: 'tee-run', label: 'Tee, flow through run', kind: 'nfT', value: 20, source: CRANE, tag: 'from-memory' },
  { id: 'tee-branch', label: 'Tee, flow through branch', kind: 'nfT', value: 60, source: CRANE, tag: 'from-memory' },
  { id: 'gate-valve-open', label: 'Gate valve, fully open', kind: 'nfT', value: 8, source: CRANE, tag: 'from-memory' },
  { id: 'ball-valve-full-bore', label: 'Ball valve, full bore, open', kind: 'nfT', value: 3, source: CRANE, tag: 'from-memory' },
  { id: 'butterfly-valve-open', label: 'Butterfly valve (2–8 in), open', kind: 'nfT', value: 45, source: CRANE, tag: 'from-memory' },
  { id: 'globe-valve-open', label: 'Globe valve, open', kind: 'nfT', value: 340, source: CRANE, tag: 'from-memory' },
  { id: 'swing-check-valve', label: 'Swing check valve (conventional)', kind: 'nfT', value: 100, source: CRANE, tag: 'from-memory' },
  { id: 'entrance-sharp', label: 'Pipe entrance, sharp-edged', kind: 'fixed', value: 0.5, source: CRANE, tag: 'from-memory' },
  { id: 'entrance-projecting', label: 'Pipe entrance, inward-projecting', kind: 'fixed', value: 0.78, source: CRANE, tag: 'from-memory' },
  { id: 'entrance-rounded', label: 'Pipe entrance, rounded (r/d ≥ 0.15)', kind: 'fixed', value: 0.04, source: CRANE, tag: 'from-memory' },
  { id: 'exit', label: 'Exit into a tank', kind: 'fixed', value: 1.0, source: CRANE, tag: 'from-memory' },
];

/**
 * Fully turbulent friction factor f_T by nominal pipe size (inches), as tabulated in
 * Crane TP-410, "Pipe friction data for clean commercial steel pipe with flow in zone of
 * complete turbulence" (p. A-26; A-25 in older printings). Rows: [largest nominal size
 * in the band, f_T].
 */
export const CRANE_FT_BY_NOMINAL_INCH: ReadonlyArray<readonly [number, number]> = [
  [0.5, 0.027],
  [0.75, 0.025],
  [1, 0.023],
  [1.25, 0.022],
  [1.5, 0.021],
  [2, 0.019],
  [3, 0.018],
  [4, 0.017],
  [5, 0.016],
  [6, 0.015],
  [10, 0.014],
  [16, 0.013],
  [24, 0.012],
];

/**
 * Fully turbulent friction factor of clean commercial steel pipe of a given inside
 * diameter: f_T = 0.25/[log10(ε/(3.7·D))]² with ε = 0.046 mm (Crane TP-410; the
 * rough-pipe limit of Colebrook 1939). Crane's printed table is this formula rounded.
 *
 * @param diameterMm inside diameter, mm (> 0.2)
 * @param roughnessMm absolute roughness, mm (default 0.046, commercial steel)
 * @returns f_T
 */
export function turbulentFrictionFactor(diameterMm: number, roughnessMm = 0.046): number {
  requirePositive('pipe diameter', diameterMm);
  requirePositive('pipe roughness', roughnessMm);
  const rr = roughnessMm / diameterMm;
  requireRange('relative roughness (roughness ÷ diameter)', rr, 0, 0.1);
  return 0.25 / Math.log10(rr / 3.7) ** 2;
}

/**
 * K of one fitting for a line of fully turbulent friction factor `fT`
 * (Crane TP-410: K = n·f_T, or the fixed K).
 *
 * @param fittingId an id of {@link FITTING_K_FACTORS}
 * @param fT        fully turbulent friction factor of the size (> 0), e.g. {@link turbulentFrictionFactor}
 */
export function fittingK(fittingId: string, fT: number): number {
  requirePositive('turbulent friction factor', fT);
  const item = FITTING_K_FACTORS.find((x) => x.id === fittingId);
  if (!item) throw new RangeError(`Unknown fitting "${fittingId}".`);
  return item.kind === 'nfT' ? item.value * fT : item.value;
}

/**
 * Sum of fitting loss coefficients ΣK for a line, to pass as `sumK` to
 * {@link lineLossBar} (Crane TP-410). Each entry is a catalogue fitting (with a count)
 * or a user-given K (with a count), e.g. for a hygienic fitting.
 *
 * @param fittings list of { fittingId, count? } or { k, count? }
 * @param fT       fully turbulent friction factor of the line size (> 0)
 * @returns ΣK (dimensionless)
 */
export function sumFittingsK(
  fittings: ReadonlyArray<{ fittingId: string; count?: number } | { k: number; count?: number }>,
  fT: number,
): number {
  requirePositive('turbulent friction factor', fT);
  let sum = 0;
  for (const f of fittings) {
    const count = f.count ?? 1;
    requireNonNegative('fitting count', count);
    if (!Number.isInteger(count)) throw new RangeError(`Fitting count must be a whole number (got ${String(count)}).`);
    let k: number;
    if ('k' in f) {
      requireNonNegative('fitting K factor', f.k);
      k = f.k;
    } else {
      k = fittingK(f.fittingId, fT);
    }
    sum += count * k;
  }
  requireFinite('sum of K factors', sum);
  return sum;
}
