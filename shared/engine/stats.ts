/**
 * Small statistics the forecasts need: the log-gamma function, the regularized incomplete
 * beta function, and Student's t distribution (CDF and quantile).
 *
 * Sources: Lanczos, J. SIAM Numer. Anal. B 1 (1964) 86–96 (log-gamma, g = 7, n = 9
 * coefficients as tabulated by Godfrey); Abramowitz & Stegun, Handbook of Mathematical
 * Functions (1964) 26.5.8 (continued fraction of the incomplete beta, evaluated by the
 * modified Lentz method, Lentz, Appl. Opt. 15 (1976) 668) and 26.7.1 (the t CDF through
 * the incomplete beta).
 */
import { requirePositive, requireRange } from './errors';

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** Natural log of the gamma function for x > 0 (Lanczos 1964). */
export function logGamma(x: number): number {
  requirePositive('x', x);
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const z = x - 1;
  let a = LANCZOS[0];
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += LANCZOS[i] / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

function betaContinuedFraction(a: number, b: number, x: number): number {
  const TINY = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 300; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-15) break;
  }
  return h;
}

/** Regularized incomplete beta function I_x(a, b), 0 ≤ x ≤ 1, a, b > 0 (A&S 26.5.8). */
export function incompleteBeta(x: number, a: number, b: number): number {
  requireRange('x', x, 0, 1);
  requirePositive('a', a);
  requirePositive('b', b);
  if (x === 0 || x === 1) return x;
  const lbt = logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x);
  const bt = Math.exp(lbt);
  if (x < (a + 1) / (a + b + 2)) return (bt * betaContinuedFraction(a, b, x)) / a;
  return 1 - (bt * betaContinuedFraction(b, a, 1 - x)) / b;
}

/** Student's t cumulative distribution P(T ≤ t) with `dof` degrees of freedom (A&S 26.7.1). */
export function studentTCdf(t: number, dof: number): number {
  requirePositive('degrees of freedom', dof);
  if (!Number.isFinite(t)) {
    if (Number.isNaN(t)) throw new RangeError('t must be a number.');
    return t > 0 ? 1 : 0;
  }
  const tail = 0.5 * incompleteBeta(dof / (dof + t * t), dof / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/**
 * Quantile of Student's t distribution: the t with P(T ≤ t) = p, `dof` degrees of
 * freedom (> 0), 0 < p < 1. Solved by bisection on {@link studentTCdf} to 1e-12 relative.
 * Check values: t(0.975; 1) = 12.706, t(0.975; 2) = 4.303, t(0.975; 10) = 2.228.
 */
export function studentTQuantile(p: number, dof: number): number {
  requirePositive('degrees of freedom', dof);
  if (!(p > 0 && p < 1)) throw new RangeError(`The probability must be between 0 and 1 (got ${String(p)}).`);
  if (p === 0.5) return 0;
  if (p < 0.5) return -studentTQuantile(1 - p, dof);
  let lo = 0;
  let hi = 1;
  while (studentTCdf(hi, dof) < p) {
    hi *= 2;
    if (hi > 1e12) return Infinity;
  }
  for (let i = 0; i < 200 && hi - lo > 1e-12 * hi; i++) {
    const mid = 0.5 * (lo + hi);
    if (studentTCdf(mid, dof) < p) lo = mid;
    else hi = mid;
  }
  return 0.5 * (lo + hi);
}
