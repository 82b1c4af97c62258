/**
 * The four classical blocking (fouling) laws of dead-end filtration, per unit of
 * filter area, after Hermia, Trans. IChemE 60 (1982) 183–187 (standard blocking
 * after Grace, AIChE J. 2 (1956) 307).
 *
 * Units: any consistent set. Typical: time t in min, filtered volume per area v in
 * L m⁻², flux J in L m⁻² min⁻¹. The constant `k` of each law is
 * - complete:     k_b (1/time)
 * - standard:     k_s (area/volume; v_max = 2/k_s)
 * - intermediate: k_i (area/volume)
 * - cake:         k_c (time·area²/volume²)
 * so that, at constant pressure with initial flux J0,
 * - complete:     v = (J0/k_b)(1 − e^(−k_b t))
 * - standard:     v = J0 t / (1 + k_s J0 t / 2)
 * - intermediate: v = ln(1 + k_i J0 t) / k_i
 * - cake:         v = (√(1 + 2 k_c J0² t) − 1)/(k_c J0)
 * and at constant flux J0 the pressure ratio after a volume v is
 * - complete 1/(1 − k_b v/J0); standard (1 − k_s v/2)^−2; intermediate e^(k_i v); cake 1 + k_c J0 v.
 * The fouled state depends on v only, so ΔP/ΔP0 at constant flux equals J0/J at
 * the same v under constant pressure.
 */
import { requireFinite, requireNonNegative, requirePositive } from './errors';

/** A Hermia (1982) blocking mechanism. */
export type BlockingLaw = 'complete' | 'standard' | 'intermediate' | 'cake';

/** The four blocking laws, in Hermia's order of decreasing exponent n (2, 1.5, 1, 0). */
export const BLOCKING_LAWS: readonly BlockingLaw[] = ['complete', 'standard', 'intermediate', 'cake'];

function checkLaw(law: BlockingLaw): void {
  if (!BLOCKING_LAWS.includes(law)) {
    throw new RangeError(`Unknown blocking law "${String(law)}": use complete, standard, intermediate or cake.`);
  }
}

function checkKJ0(k: number, j0: number): void {
  requireNonNegative('blocking constant k', k);
  requirePositive('initial flux J0', j0);
}

/** The arguments of the time forms (v(t), J(t)): a known law, k ≥ 0, J0 > 0, t ≥ 0. */
function checkTimeArgs(law: BlockingLaw, p: { k: number; j0: number; t: number }): void {
  checkLaw(law);
  checkKJ0(p.k, p.j0);
  requireNonNegative('time t', p.t);
}

/** (1 − e^(−z))/z, accurate near z = 0. */
function oneMinusExpOverZ(z: number): number {
  return z === 0 ? 1 : -Math.expm1(-z) / z;
}

/** ln(1 + z)/z, accurate near z = 0. */
function log1pOverZ(z: number): number {
  return z === 0 ? 1 : Math.log1p(z) / z;
}

/**
 * Filtered volume per unit area v(t) at constant pressure (Hermia 1982).
 * @param law blocking law
 * @param p.k blocking constant of that law (see module notes for its units), ≥ 0
 * @param p.j0 initial flux J0 (volume per area per time), > 0
 * @param p.t time since the start, ≥ 0
 * @returns v in the volume-per-area unit of J0·t (e.g. L m⁻² with J0 in L m⁻² min⁻¹ and t in min)
 */
export function blockingVolume(law: BlockingLaw, p: { k: number; j0: number; t: number }): number {
  checkTimeArgs(law, p);
  const { k, j0, t } = p;
  switch (law) {
    case 'complete':
      return j0 * t * oneMinusExpOverZ(k * t);
    case 'standard':
      return (j0 * t) / (1 + (k * j0 * t) / 2);
    case 'intermediate':
      return j0 * t * log1pOverZ(k * j0 * t);
    case 'cake':
      // (√(1 + 2kJ0²t) − 1)/(kJ0) written without cancellation
      return (2 * j0 * t) / (1 + Math.sqrt(1 + 2 * k * j0 * j0 * t));
  }
}

/**
 * Flux J(t) = dv/dt at constant pressure (Hermia 1982).
 * @param law blocking law
 * @param p.k blocking constant (≥ 0), p.j0 initial flux (> 0), p.t time (≥ 0)
 * @returns J in the unit of J0
 */
export function blockingFlux(law: BlockingLaw, p: { k: number; j0: number; t: number }): number {
  checkTimeArgs(law, p);
  const { k, j0, t } = p;
  switch (law) {
    case 'complete':
      return j0 * Math.exp(-k * t);
    case 'standard': {
      const d = 1 + (k * j0 * t) / 2;
      return j0 / (d * d);
    }
    case 'intermediate':
      return j0 / (1 + k * j0 * t);
    case 'cake':
      return j0 / Math.sqrt(1 + 2 * k * j0 * j0 * t);
  }
}

/**
 * Pressure ratio ΔP/ΔP0 at constant flux J0 after a filtered volume per area v
 * (Hermia 1982, constant-flux forms). Equal to J0/J at the same v under constant pressure.
 * Complete and standard blocking have an asymptote (v = J0/k_b, v = 2/k_s) where the
 * filter is fully plugged; a v at or beyond it throws a RangeError.
 * @param law blocking law
 * @param p.k blocking constant (≥ 0), p.j0 imposed flux (> 0), p.v volume per area (≥ 0)
 * @returns ΔP/ΔP0 (dimensionless, ≥ 1)
 */
export function blockingPressureRatio(law: BlockingLaw, p: { k: number; j0: number; v: number }): number {
  checkLaw(law);
  checkKJ0(p.k, p.j0);
  requireNonNegative('volume per area v', p.v);
  const { k, j0, v } = p;
  switch (law) {
    case 'complete': {
      const open = 1 - (k * v) / j0;
      if (open <= 0) {
        throw new RangeError(
          `Volume per area ${String(v)} reaches or passes the complete-blocking limit J0/k = ${String(j0 / k)}: the filter is fully plugged.`,
        );
      }
      return 1 / open;
    }
    case 'standard': {
      const open = 1 - (k * v) / 2;
      if (open <= 0) {
        throw new RangeError(
          `Volume per area ${String(v)} reaches or passes v_max = 2/k = ${String(2 / k)}: the filter is fully plugged.`,
        );
      }
      return 1 / (open * open);
    }
    case 'intermediate': {
      const r = Math.exp(k * v);
      if (!Number.isFinite(r)) throw new RangeError('Pressure ratio overflows: k·v is far too large.');
      return r;
    }
    case 'cake':
      return 1 + k * j0 * v;
  }
}

/**
 * Volume per area v at which ΔP/ΔP0 at constant flux (or J0/J at constant pressure)
 * reaches `ratio` (Hermia 1982): complete (J0/k)(1 − 1/r); standard (2/k)(1 − r^−½);
 * intermediate ln(r)/k; cake (r − 1)/(k J0).
 * @param law blocking law
 * @param p.k blocking constant (> 0), p.j0 flux (> 0), p.ratio r (≥ 1)
 * @returns v in the volume-per-area unit of J0·time
 */
export function blockingVolumeAtRatio(law: BlockingLaw, p: { k: number; j0: number; ratio: number }): number {
  checkLaw(law);
  requirePositive('blocking constant k', p.k);
  requirePositive('initial flux J0', p.j0);
  requireFinite('pressure ratio', p.ratio);
  if (p.ratio < 1) {
    throw new RangeError(`Pressure ratio must be 1 or more (got ${String(p.ratio)}): fouling only raises ΔP.`);
  }
  const { k, j0, ratio: r } = p;
  switch (law) {
    case 'complete':
      return (j0 / k) * (1 - 1 / r);
    case 'standard':
      return (2 / k) * (1 - 1 / Math.sqrt(r));
    case 'intermediate':
      return Math.log(r) / k;
    case 'cake':
      return (r - 1) / (k * j0);
  }
}
