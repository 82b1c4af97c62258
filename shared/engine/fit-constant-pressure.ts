/**
 * The lab's disc test at constant pressure: filtrate volume against time through a
 * small membrane disc, fitted to the four blocking laws of Hermia, Trans. IChemE 60
 * (1982) 183–187, and reduced to Vmax and the initial flux by the standard-blocking
 * straight line t/V = 1/Q0 + t/Vmax (Badmington, Wilkins, Payne, Honig, Pharm.
 * Technol. 19(9) (1995) 64–76; analysed by Zydney & Ho, Desalination 146 (2002) 75–81).
 *
 * Per-area units inside: t in min, v in L m⁻², J in L m⁻² min⁻¹ (the units of
 * blockingVolume), so a fit's { k, j0LPerM2Min } can be passed straight to it.
 *
 * Each law is written v = J0·F(c, t) with one shape constant c, which makes v linear in
 * J0 once c is known (variable projection, Golub & Pereyra, SIAM J. Numer. Anal. 10
 * (1973) 413–432):
 *   complete      F = (1 − e^(−ct))/c          c = k_b
 *   standard      F = t/(1 + ct)               c = k_s·J0/2
 *   intermediate  F = ln(1 + ct)/c             c = k_i·J0
 *   cake          F = (√(1 + 2ct) − 1)/c       c = k_c·J0²
 * c is first located on a logarithmic grid of the profiled RSS, then (J0, c) are
 * polished by Levenberg–Marquardt (Marquardt 1963) with analytic derivatives. Laws are
 * ranked by AIC = n ln(RSS/n) + 2p (Akaike 1974), p = 2.
 */
import type { BlockingLaw } from './blocking';
import { requireFinite, requireNonNegative, requirePositive } from './errors';

/** One blocking law fitted to a constant-pressure test, per unit area. */
export type ConstantPressureLawFit = {
  law: BlockingLaw;
  /** blocking constant k of the law with t in min and v in L m⁻² (as blockingVolume) */
  k: number;
  /** fitted initial flux, L m⁻² min⁻¹ */
  j0LPerM2Min: number;
  /** fitted initial flux, L m⁻² h⁻¹ */
  j0LPerM2H: number;
  /** residual sum of squares, (L m⁻²)² */
  rss: number;
  /** n ln(RSS/n) + 2·2, lower is better */
  aic: number;
  /** 1 − RSS/TSS */
  r2: number;
  /** readings fitted */
  n: number;
  /** false when k < 0 (flux not declining) or J0 ≤ 0 */
  valid: boolean;
  note?: string;
  /** measured − fitted v for each reading, in input order, L m⁻² */
  residualsLPerM2: number[];
  iterations: number;
};

/** Result of a Vmax disc test. */
export type ConstantPressureFit = {
  /** Vmax of the disc from the t/V line (1/slope), L */
  vmaxL: number;
  /** Vmax per unit filter area, L m⁻² */
  vmaxLPerM2: number;
  /** initial flow through the disc from the t/V line (1/intercept), L/min */
  q0LPerMin: number;
  /** initial flux, L m⁻² h⁻¹ */
  j0LPerM2H: number;
  /** r² of the t/V against t straight line */
  r2: number;
  /** the four laws fitted by non-linear least squares on v(t), valid ones first, best AIC first */
  fits: ConstantPressureLawFit[];
  /** disc filtration area used, m² */
  discAreaM2: number;
  /** readings used in the t/V line (those with t > 0 and V > 0) */
  nLine: number;
};

const P = 2;
const MAX_ITER = 60;
/** A fitted J0 above this multiple of the largest observed mean flux v/t is a runaway. */
const J0_RUNAWAY = 5;
const LAWS: readonly BlockingLaw[] = ['complete', 'standard', 'intermediate', 'cake'];

/**
 * Filtration area of a disc from its diameter: π·d²/4. Use the effective (wetted,
 * unclamped) diameter of the holder, not the membrane's cut diameter.
 * @param diameterMm effective diameter, mm (> 0)
 * @returns area, m²
 */
export function discAreaM2FromDiameterMm(diameterMm: number): number {
  requirePositive('disc diameter (mm)', diameterMm);
  const d = diameterMm / 1000;
  return (Math.PI * d * d) / 4;
}

// F(c, t) and ∂F/∂c, written to these two slots to avoid allocation in the loops.
const OUT = new Float64Array(2);

/** Evaluates the law's shape F(c, t) and ∂F/∂c; returns false outside the law's domain. */
function shape(law: BlockingLaw, c: number, t: number): boolean {
  const z = c * t;
  switch (law) {
    case 'complete': {
      // F = t·φ(z), φ = (1 − e^−z)/z, φ' = (e^−z(1 + z) − 1)/z²
      if (Math.abs(z) < 1e-4) {
        OUT[0] = t * (1 - z / 2 + (z * z) / 6);
        OUT[1] = t * t * (-0.5 + z / 3 - (z * z) / 8);
      } else {
        const e = Math.exp(-z);
        OUT[0] = (t * -Math.expm1(-z)) / z;
        OUT[1] = (t * t * (e * (1 + z) - 1)) / (z * z);
      }
      return Number.isFinite(OUT[0]) && Number.isFinite(OUT[1]);
    }
    case 'standard': {
      const d = 1 + z;
      if (!(d > 0)) return false;
      OUT[0] = t / d;
      OUT[1] = -(t * t) / (d * d);
      return true;
    }
    case 'intermediate': {
      // F = t·ψ(z), ψ = ln(1 + z)/z, ψ' = (z/(1 + z) − ln(1 + z))/z²
      if (!(1 + z > 0)) return false;
      if (Math.abs(z) < 1e-4) {
        OUT[0] = t * (1 - z / 2 + (z * z) / 3);
        OUT[1] = t * t * (-0.5 + (2 * z) / 3 - (3 * z * z) / 4);
      } else {
        const l = Math.log1p(z);
        OUT[0] = (t * l) / z;
        OUT[1] = (t * t * (z / (1 + z) - l)) / (z * z);
      }
      return true;
    }
    case 'cake': {
      const q = 1 + 2 * z;
      if (!(q > 0)) return false;
      const s = Math.sqrt(q);
      OUT[0] = (2 * t) / (1 + s);
      OUT[1] = (-2 * t * t) / (s * (1 + s) * (1 + s));
      return true;
    }
  }
}

/** Profiled RSS at shape constant c: J0 = Σv·F/ΣF², RSS = Σv² − (Σv·F)²/ΣF²; null outside the domain. */
function profile(law: BlockingLaw, c: number, t: Float64Array, v: Float64Array, n: number, svv: number): [number, number] | null {
  let sfv = 0;
  let sff = 0;
  for (let i = 0; i < n; i++) {
    if (!shape(law, c, t[i])) return null;
    const f = OUT[0];
    sfv += f * v[i];
    sff += f * f;
  }
  if (!(sff > 0)) return null;
  const rss = Math.max(svv - (sfv * sfv) / sff, 0);
  return Number.isFinite(rss) ? [rss, sfv / sff] : null;
}

/** RSS at (J0, c) with the normal equations in s = [JᵀJ00, JᵀJ01, JᵀJ11, Jᵀr0, Jᵀr1]. */
function evaluate(
  law: BlockingLaw,
  j0: number,
  c: number,
  t: Float64Array,
  v: Float64Array,
  n: number,
  res: Float64Array | null,
  s: Float64Array,
): number {
  let a00 = 0, a01 = 0, a11 = 0, b0 = 0, b1 = 0, rss = 0;
  for (let i = 0; i < n; i++) {
    if (!shape(law, c, t[i])) return Infinity;
    const g0 = OUT[0];
    const g1 = j0 * OUT[1];
    const r = v[i] - j0 * g0;
    if (res) res[i] = r;
    rss += r * r;
    a00 += g0 * g0;
    a01 += g0 * g1;
    a11 += g1 * g1;
    b0 += g0 * r;
    b1 += g1 * r;
  }
  s[0] = a00;
  s[1] = a01;
  s[2] = a11;
  s[3] = b0;
  s[4] = b1;
  return Number.isFinite(rss) ? rss : Infinity;
}

function kFromC(law: BlockingLaw, c: number, j0: number): number {
  switch (law) {
    case 'complete':
      return c;
    case 'standard':
      return (2 * c) / j0;
    case 'intermediate':
      return c / j0;
    case 'cake':
      return c / (j0 * j0);
  }
}

function fitLaw(
  law: BlockingLaw,
  t: Float64Array,
  v: Float64Array,
  n: number,
  tMax: number,
  tss: number,
  secantMax: number,
): ConstantPressureLawFit {
  // 1. grid of c·tMax from 0 to 1e4 (logarithmic), profiled RSS
  let svv = 0;
  for (let i = 0; i < n; i++) svv += v[i] * v[i];
  let bestC = 0;
  let best = profile(law, 0, t, v, n, svv);
  for (let e = -4; e <= 4; e += 0.5) {
    const c = 10 ** e / tMax;
    const pr = profile(law, c, t, v, n, svv);
    if (pr && (!best || pr[0] < best[0])) {
      best = pr;
      bestC = c;
    }
  }
  let j0 = best ? best[1] : v[n - 1] / tMax;
  let c = bestC;
  // 2. Levenberg–Marquardt on (J0, c)
  const s = new Float64Array(5);
  const sT = new Float64Array(5);
  let rss = evaluate(law, j0, c, t, v, n, null, s);
  let lambda = 1e-6;
  let iterations = 1;
  let failures = 0;
  while (Number.isFinite(rss) && iterations < MAX_ITER && failures < 12) {
    const d00 = s[0] * (1 + lambda);
    const d11 = s[2] * (1 + lambda);
    const det = d00 * d11 - s[1] * s[1];
    if (!(det > 0) || !Number.isFinite(det)) {
      lambda = Math.max(lambda * 10, 1e-6);
      failures++;
      continue;
    }
    const dj = (d11 * s[3] - s[1] * s[4]) / det;
    const dc = (d00 * s[4] - s[1] * s[3]) / det;
    const predicted = dj * s[3] + dc * s[4];
    if (predicted <= (1e-8 * rss) / Math.max(n - P, 1) || predicted <= 1e-300) break;
    const rssT = evaluate(law, j0 + dj, c + dc, t, v, n, null, sT);
    iterations++;
    if (rssT < rss) {
      j0 += dj;
      c += dc;
      rss = rssT;
      s.set(sT);
      if (j0 > J0_RUNAWAY * secantMax) break; // running away: reported as invalid below
      lambda = Math.max(lambda * 0.1, 1e-12);
      failures = 0;
    } else {
      lambda = Math.max(lambda * 10, 1e-6);
      failures++;
    }
  }
  const res = new Float64Array(n);
  rss = evaluate(law, j0, c, t, v, n, res, s);
  const residualsLPerM2 = Array.from(res);
  const k = kFromC(law, c, j0);
  let valid = Number.isFinite(rss) && Number.isFinite(k);
  let note: string | undefined;
  if (!valid) note = `The ${law}-blocking fit did not converge on these readings.`;
  else if (!(j0 > 0)) {
    valid = false;
    note = `The ${law}-blocking fit gives an initial flux of zero or less, which is not physical.`;
  } else if (k < 0) {
    valid = false;
    note = 'The flux does not decline during the test, so no blocking law applies.';
  } else if (j0 > J0_RUNAWAY * secantMax) {
    valid = false;
    note = `The ${law}-blocking fit needs an initial flux far above any measured flux: this law's shape does not match the test.`;
  }
  const aic = Number.isFinite(rss) ? n * Math.log(Math.max(rss / n, 1e-300)) + 2 * P : Infinity;
  const r2 = tss > 0 ? 1 - rss / tss : 0;
  const fit: ConstantPressureLawFit = {
    law,
    k: Number.isFinite(k) ? k : 0,
    j0LPerM2Min: j0,
    j0LPerM2H: j0 * 60,
    rss: Number.isFinite(rss) ? rss : Infinity,
    aic,
    r2: Number.isFinite(r2) ? r2 : 0,
    n,
    valid,
    residualsLPerM2,
    iterations,
  };
  if (note) fit.note = note;
  return fit;
}

/**
 * Fits the four Hermia (1982) laws to per-area constant-pressure data v(t) by
 * non-linear least squares on v (see the module notes).
 * @param points readings: timeMin since the start (≥ 0, min), volumeLPerM2 filtered per
 *   unit area (≥ 0, L m⁻²). At least 3 readings at 2 or more times after the start.
 * @returns one fit per law, valid ones first, lowest AIC first
 */
export function fitConstantPressureLaws(points: { timeMin: number; volumeLPerM2: number }[]): ConstantPressureLawFit[] {
  if (!Array.isArray(points) || points.length < 3) {
    throw new RangeError('At least 3 readings are needed to fit a blocking law.');
  }
  const n = points.length;
  const t = new Float64Array(n);
  const v = new Float64Array(n);
  let tMax = 0;
  let sv = 0;
  let secantMax = 0;
  const times = new Set<number>();
  for (let i = 0; i < n; i++) {
    requireNonNegative(`time of reading ${String(i + 1)} (min)`, points[i].timeMin);
    requireNonNegative(`volume of reading ${String(i + 1)} (L/m²)`, points[i].volumeLPerM2);
    t[i] = points[i].timeMin;
    v[i] = points[i].volumeLPerM2;
    if (t[i] > tMax) tMax = t[i];
    if (t[i] > 0) {
      times.add(t[i]);
      secantMax = Math.max(secantMax, v[i] / t[i]);
    }
    sv += v[i];
  }
  if (times.size < 2) throw new RangeError('Readings must include at least two different times after the start.');
  const mean = sv / n;
  let tss = 0;
  for (let i = 0; i < n; i++) tss += (v[i] - mean) ** 2;
  const fits = LAWS.map((law) => fitLaw(law, t, v, n, tMax, tss, secantMax));
  fits.sort((p, q) => (p.valid === q.valid ? p.aic - q.aic : p.valid ? -1 : 1));
  return fits;
}

/**
 * Vmax disc test at constant pressure: the standard-blocking line t/V = 1/Q0 + t/Vmax
 * (Badmington et al. 1995; Zydney & Ho 2002) by least squares on t/V against t, plus the
 * four blocking laws fitted to v(t) (Hermia 1982).
 * @param p.points readings { timeS (s since the start, ≥ 0), volumeMl (filtrate, mL, ≥ 0) };
 *   readings at t = 0 or V = 0 are used by the law fits but not by the t/V line
 * @param p.discAreaM2 effective filtration area of the disc, m² (see discAreaM2FromDiameterMm)
 * @returns Vmax (L and L m⁻²), Q0 (L/min), J0 (L m⁻² h⁻¹), r² of the line, and the law fits
 * @throws RangeError when t/V does not rise with t (the disc did not plug during the test)
 */
export function fitConstantPressure(p: {
  points: { timeS: number; volumeMl: number }[];
  discAreaM2: number;
}): ConstantPressureFit {
  requirePositive('disc area (m²)', p.discAreaM2);
  if (!Array.isArray(p.points)) throw new RangeError('Readings must be a list of { timeS, volumeMl } points.');
  const A = p.discAreaM2;
  let n = 0;
  let st = 0, stt = 0, sy = 0, sty = 0, syy = 0;
  const perArea = p.points.map((pt, i) => {
    requireFinite(`time of reading ${String(i + 1)} (s)`, pt.timeS);
    requireFinite(`volume of reading ${String(i + 1)} (mL)`, pt.volumeMl);
    requireNonNegative(`time of reading ${String(i + 1)} (s)`, pt.timeS);
    requireNonNegative(`volume of reading ${String(i + 1)} (mL)`, pt.volumeMl);
    const tMin = pt.timeS / 60;
    const vL = pt.volumeMl / 1000;
    if (tMin > 0 && vL > 0) {
      const yv = tMin / vL; // min/L
      n++;
      st += tMin;
      stt += tMin * tMin;
      sy += yv;
      sty += tMin * yv;
      syy += yv * yv;
    }
    return { timeMin: tMin, volumeLPerM2: vL / A };
  });
  const fits = fitConstantPressureLaws(perArea);
  if (n < 2) throw new RangeError('At least two readings after the start are needed for the t/V line.');
  const sxx = stt - (st * st) / n;
  const sxy = sty - (st * sy) / n;
  const syyC = syy - (sy * sy) / n;
  if (!(sxx > 0)) throw new RangeError('Readings must include at least two different times after the start.');
  const slope = sxy / sxx; // 1/Vmax, 1/L
  const intercept = (sy - slope * st) / n; // 1/Q0, min/L
  if (!(slope > 0)) {
    throw new RangeError('t/V does not rise with time: the disc did not plug during the test, so Vmax cannot be estimated (run the test longer).');
  }
  if (!(intercept > 0)) {
    throw new RangeError('The t/V line has no positive intercept, so the initial flow cannot be estimated: the data do not follow standard blocking.');
  }
  const vmaxL = 1 / slope;
  const q0LPerMin = 1 / intercept;
  const r2 = syyC > 0 ? Math.min(1, Math.max(0, (sxy * sxy) / (sxx * syyC))) : 1;
  return {
    vmaxL,
    vmaxLPerM2: vmaxL / A,
    q0LPerMin,
    j0LPerM2H: (q0LPerMin * 60) / A,
    r2,
    fits,
    discAreaM2: A,
    nLine: n,
  };
}
