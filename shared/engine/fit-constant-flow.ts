/**
 * Fitting the pressure readings of a run at constant flow (the bottling case) to the
 * four blocking laws of Hermia, Trans. IChemE 60 (1982) 183–187, in their
 * constant-flux form. With V the litres filtered since the start of the run and
 * K = kPerL:
 *
 *   complete      ΔP = ΔP0 / (1 − K·V)
 *   standard      ΔP = ΔP0 / (1 − K·V)²
 *   intermediate  ΔP = ΔP0 · exp(K·V)
 *   cake          ΔP = ΔP0 · (1 + K·V)
 *
 * Each law is fitted by non-linear least squares on the original variables (ΔP against
 * V), Levenberg–Marquardt (Levenberg 1944; Marquardt, J. SIAM 11 (1963) 431–441) with
 * analytic Jacobians. The classical linearised plots (1/ΔP, ΔP^−½, ln ΔP against V) are
 * used only, weighted so they approximate the least-squares problem, for starting
 * values. Laws are ranked by the Akaike information criterion AIC = n ln(RSS/n) + 2p
 * (Akaike, IEEE Trans. Autom. Control 19 (1974) 716–723), p = 2 constants each.
 */
import type { BlockingLaw } from './blocking';
import { requireFinite, requireNonNegative, requirePositive } from './errors';

/** Result of fitting one blocking law to (V, ΔP) readings at constant flow. */
export type ConstantFlowFit = {
  /** blocking law */
  law: BlockingLaw;
  /** fitted clean (initial) ΔP at V = 0, bar */
  dp0Bar: number;
  /** fitted law constant K, 1/L (see the module notes for each law's ΔP(V)) */
  kPerL: number;
  /** residual sum of squares, bar² */
  rss: number;
  /** Akaike information criterion n ln(RSS/n) + 2·2 (lower is better) */
  aic: number;
  /** coefficient of determination 1 − RSS/TSS */
  r2: number;
  /** number of readings fitted */
  n: number;
  /** false when the best constants are non-physical (ΔP0 ≤ 0 or K < 0) or the fit failed */
  valid: boolean;
  /** plain-English reason when `valid` is false */
  note?: string;
  /** residual standard deviation √(RSS/(n − 2)), bar */
  sigmaBar: number;
  /** covariance of (ΔP0, K) from σ²(JᵀJ)⁻¹ at the optimum: bar², bar/L, 1/L² */
  covariance: { dp0Dp0: number; dp0K: number; kK: number };
  /** measured ΔP − fitted ΔP for each reading, in input order, bar */
  residuals: number[];
  /** largest volume among the readings, L */
  volumeMaxL: number;
  /** Levenberg–Marquardt passes used */
  iterations: number;
};

const P = 2; // fitted constants per law

type NonlinearLaw = Exclude<BlockingLaw, 'cake'>;
const NONLINEAR_LAWS: readonly NonlinearLaw[] = ['complete', 'standard', 'intermediate'];
const MAX_ITER = 100;

/**
 * Normal-equation sums written by {@link pass}, with ΔP0 = a factored out:
 * [Σg², Σg·q, Σq², Σg·r, Σq·r, Σr·∂q/∂K] where g = g(K·x) is the law's shape, q = x·g'(K·x)
 * (so ∂m/∂a = g, ∂m/∂K = a·q) and r = y − a·g. Then JᵀJ = [[Σg², aΣgq], [aΣgq, a²Σq²]],
 * Jᵀr = [Σgr, aΣqr], and the second-order Hessian terms are Σr·∂²m/∂a∂K = Σqr and
 * Σr·∂²m/∂K² = a·Σr·∂q/∂K.
 */
type Sums = Float64Array;

// exp(u) for the intermediate-law pass: 2^(k/64)·e^ρ with |ρ| ≤ ln2/128 and a degree-5
// Taylor polynomial (relative error < 1e-15 for |u| ≤ 700, the reduction of Tang,
// ACM TOMS 15 (1989) 144–157); about 4× cheaper than Math.exp in the inner loop.
const EXP_N = 64;
const EXP_INV = EXP_N / Math.LN2;
const EXP_HI = 6.93147180369123816490e-1 / EXP_N; // fdlibm ln2_hi, exact multiples
const EXP_LO = 1.90821492927058770002e-10 / EXP_N;
const EXP_SHIFT = 6755399441055744; // 1.5·2^52: adding and removing it rounds to an integer
const EXP_FRAC = new Float64Array(EXP_N);
const EXP_POW2 = new Float64Array(2046); // 2^e for e = −1022 … 1023
for (let j = 0; j < EXP_N; j++) EXP_FRAC[j] = Math.pow(2, j / EXP_N);
for (let e = -1022; e <= 1023; e++) EXP_POW2[e + 1022] = Math.pow(2, e);

/** e^u: 2^(k/64)·e^ρ as above for |u| < 700, Math.exp beyond. */
function fastExp(u: number): number {
  if (!(u > -700 && u < 700)) return Math.exp(u);
  const kf = u * EXP_INV + EXP_SHIFT - EXP_SHIFT;
  const rho = u - kf * EXP_HI - kf * EXP_LO;
  const k = kf | 0;
  const poly = 1 + rho * (1 + rho * (0.5 + rho * (1 / 6 + rho * (1 / 24 + rho * (1 / 120)))));
  return EXP_FRAC[k & 63] * EXP_POW2[(k >> 6) + 1022] * poly;
}

/**
 * One pass over the data at (a = ΔP0, K): writes residuals r = y − a·g(K·x) into `res`
 * and the sums of {@link Sums} into `s`. Returns RSS (Infinity when not finite).
 * Per law, with h = 1/(1 − Kx) for the two with an asymptote and h = 1 otherwise:
 *   complete      g = h,        q = x·h²,    ∂q/∂K = 2x·h·q
 *   standard      g = h²,       q = 2x·h³,   ∂q/∂K = 3x·h·q
 *   intermediate  g = e^(Kx),   q = x·g,     ∂q/∂K = x·q
 *   cake          g = 1 + Kx,   q = x,       ∂q/∂K = 0
 */
function pass(
  law: BlockingLaw,
  a: number,
  K: number,
  x: Float64Array,
  y: Float64Array,
  n: number,
  res: Float64Array,
  s: Sums,
): number {
  const asymptote = law === 'complete' || law === 'standard';
  const squared = law === 'standard';
  const exponential = law === 'intermediate';
  let gg = 0;
  let gq = 0;
  let qq = 0;
  let gr = 0;
  let qr = 0;
  let rdq = 0;
  let rss = 0;
  for (let i = 0; i < n; i++) {
    const xi = x[i];
    let g: number;
    let h = 1;
    let q: number;
    if (asymptote) {
      h = 1 / (1 - K * xi);
      g = squared ? h * h : h;
      q = (squared ? 2 * xi : xi) * g * h;
    } else if (exponential) {
      g = fastExp(K * xi);
      q = xi * g;
    } else {
      g = 1 + K * xi;
      q = xi;
    }
    const r = y[i] - a * g;
    res[i] = r;
    const rq = r * q;
    rss += r * r;
    gg += g * g;
    gq += g * q;
    qq += q * q;
    gr += g * r;
    qr += rq;
    rdq += rq * xi * h;
  }
  s[0] = gg;
  s[1] = gq;
  s[2] = qq;
  s[3] = gr;
  s[4] = qr;
  // Σr·∂q/∂K = c·Σr·q·x·h with c = 2, 3, 1 (cake: 0)
  s[5] = law === 'cake' ? 0 : rdq * (law === 'complete' ? 2 : law === 'standard' ? 3 : 1);
  return Number.isFinite(rss) ? rss : Infinity;
}

/** Sums of a weighted straight line z = c0 + c1·x: Σw, Σw·x, Σw·x², Σw·z, Σw·z·x. */
type LineSums = { w: number; x: number; xx: number; z: number; xz: number };

const lineSums = (): LineSums => ({ w: 0, x: 0, xx: 0, z: 0, xz: 0 });

/** Adds a point at x with weight w and weighted value wz = w·z. */
function addPoint(l: LineSums, xi: number, w: number, wz: number): void {
  l.w += w;
  l.x += w * xi;
  l.xx += w * xi * xi;
  l.z += wz;
  l.xz += wz * xi;
}

/** Weighted straight line z = c0 + c1·x from accumulated sums; null when degenerate. */
function line({ w: sw, x: sx, xx: sxx, z: sz, xz: sxz }: LineSums): [number, number] | null {
  const det = sw * sxx - sx * sx;
  if (!(det > 0) || !Number.isFinite(det)) return null;
  const c1 = (sw * sxz - sx * sz) / det;
  const c0 = (sz - c1 * sx) / sw;
  return Number.isFinite(c0) && Number.isFinite(c1) ? [c0, c1] : null;
}

type Start = { a: number; K: number };

/** Starting constants for every law from the linearised plots, in one pass. */
function starts(x: Float64Array, y: Float64Array, n: number): Record<NonlinearLaw, Start | null> {
  // complete: 1/ΔP = 1/a − (K/a)V, weight ΔP⁴; standard: ΔP^−½ = a^−½(1 − KV), weight ΔP³;
  // intermediate: ln ΔP = ln a + KV, weight ΔP². (Cake is fitted exactly in closed form.)
  const complete = lineSums();
  const standard = lineSums();
  const intermediate = lineSums();
  for (let i = 0; i < n; i++) {
    const xi = x[i];
    const yi = y[i];
    const y2 = yi * yi;
    const y3 = y2 * yi;
    // complete: z = 1/y, w = y⁴ → w·z = y³
    addPoint(complete, xi, y2 * y2, y3);
    // standard: z = y^−½, w = y³ → w·z = y^2.5
    addPoint(standard, xi, y3, y2 * Math.sqrt(yi));
    // intermediate: z = ln y, w = y²
    addPoint(intermediate, xi, y2, y2 * Math.log(yi));
  }
  const out: Record<NonlinearLaw, Start | null> = { complete: null, standard: null, intermediate: null };
  const c = line(complete);
  if (c && c[0] > 0) out.complete = { a: 1 / c[0], K: -c[1] / c[0] };
  const s = line(standard);
  if (s && s[0] > 0) out.standard = { a: 1 / (s[0] * s[0]), K: -s[1] / s[0] };
  const m = line(intermediate);
  if (m) out.intermediate = { a: Math.exp(m[0]), K: m[1] };
  return out;
}

type Data = { x: Float64Array; y: Float64Array; n: number };

type Scratch = { resA: Float64Array; resB: Float64Array; sA: Sums; sB: Sums };

type LmState = { a: number; K: number; rss: number; iterations: number; res: Float64Array; s: Sums };

/**
 * Levenberg–Marquardt (Marquardt 1963) on (a = ΔP0, K). Each step solves
 * (H + λ·diag(JᵀJ))·δ = Jᵀr with H the exact Hessian JᵀJ − Σr·∇²m when it is positive
 * definite (quadratic convergence even when the law matches the data poorly and the
 * residuals are large), the Gauss–Newton matrix JᵀJ otherwise. Stops when the predicted
 * RSS decrease falls below 1e-4·σ² (the step is then under 1 % of a standard error of
 * the constants), when steps stop lowering RSS, or after maxIter passes.
 */
function lm(
  law: BlockingLaw,
  a0: number,
  K0: number,
  d: Data,
  xMax: number,
  sc: Scratch,
  maxIter: number,
): LmState {
  const { x, y, n } = d;
  const asymptote = law === 'complete' || law === 'standard';
  let a = a0;
  let K = K0;
  let res = sc.resA;
  let trialRes = sc.resB;
  let s = sc.sA;
  let trialS = sc.sB;
  let rss = pass(law, a, K, x, y, n, res, s);
  let iterations = 1;
  let lambda = 1e-9;
  let failures = 0;
  const tolScale = 1e-4 / Math.max(n - P, 1);
  while (Number.isFinite(rss) && iterations < maxIter && failures < 10) {
    const j00 = s[0];
    const j01 = a * s[1];
    const j11 = a * a * s[2];
    const b0 = s[3];
    const b1 = a * s[4];
    let h01 = j01 - s[4];
    let h11 = j11 - a * s[5];
    if (!(j00 * h11 - h01 * h01 > 0 && h11 > 0)) {
      h01 = j01;
      h11 = j11;
    }
    const d00 = j00 * (1 + lambda);
    const d11 = h11 + lambda * j11;
    const det = d00 * d11 - h01 * h01;
    if (!(det > 0) || !Number.isFinite(det)) {
      lambda = Math.max(lambda * 10, 1e-6);
      failures++;
      continue;
    }
    const da = (d11 * b0 - h01 * b1) / det;
    const dK = (d00 * b1 - h01 * b0) / det;
    const predicted = da * b0 + dK * b1; // predicted RSS decrease of the quadratic model
    if (predicted <= tolScale * rss || predicted <= 1e-300) break;
    const aT = a + da;
    const KT = K + dK;
    if (asymptote && KT * xMax >= 1) {
      lambda = Math.max(lambda * 10, 1e-6);
      failures++;
      continue;
    }
    const rssT = pass(law, aT, KT, x, y, n, trialRes, trialS);
    iterations++;
    if (rssT < rss) {
      a = aT;
      K = KT;
      rss = rssT;
      [res, trialRes] = [trialRes, res];
      [s, trialS] = [trialS, s];
      lambda = Math.max(lambda * 0.1, 1e-12);
      failures = 0;
    } else {
      lambda = Math.max(lambda * 10, 1e-6);
      failures++;
    }
  }
  return { a, K, rss, iterations, res, s };
}

/** Usable starting point: positive a, finite K inside the asymptote. */
function clampStart(law: BlockingLaw, st: Start | null, yMean: number, xMax: number): Start {
  let a = st ? st.a : yMean;
  let K = st ? st.K : 0;
  if (!(a > 0) || !Number.isFinite(a)) a = yMean;
  if (!Number.isFinite(K)) K = 0;
  if ((law === 'complete' || law === 'standard') && K * xMax >= 1) K = 0.99 / xMax;
  return { a, K };
}

function finish(law: BlockingLaw, st: LmState, n: number, xMax: number, tss: number): ConstantFlowFit {
  const { a, K, res, s } = st;
  let rss = st.rss;
  const sigma2 = n > P ? rss / (n - P) : 0;
  // covariance σ²(JᵀJ)⁻¹ with JᵀJ = [[Σg², aΣgq], [aΣgq, a²Σq²]]
  const j00 = s[0];
  const j01 = a * s[1];
  const j11 = a * a * s[2];
  const det = j00 * j11 - j01 * j01;
  const covariance =
    det > 0 && Number.isFinite(det)
      ? { dp0Dp0: (sigma2 * j11) / det, dp0K: (-sigma2 * j01) / det, kK: (sigma2 * j00) / det }
      : { dp0Dp0: Infinity, dp0K: 0, kK: Infinity };
  const residuals = new Array<number>(n);
  for (let i = 0; i < n; i++) residuals[i] = res[i];

  let valid = true;
  let note: string | undefined;
  if (!Number.isFinite(rss)) {
    valid = false;
    note = `The ${law}-blocking fit did not converge on these readings.`;
    rss = Infinity;
  } else if (!(a > 0)) {
    valid = false;
    note = `The ${law}-blocking fit gives a clean ΔP of zero or less, which is not physical.`;
  } else if (K < 0) {
    valid = false;
    note = 'ΔP does not rise with volume on these readings, so no fouling law applies (check for a bypass or a faulty gauge).';
  }
  const aic = Number.isFinite(rss) ? n * Math.log(Math.max(rss / n, 1e-300)) + 2 * P : Infinity;
  const r2 = tss > 0 ? 1 - rss / tss : rss === 0 ? 1 : 0;
  const fit: ConstantFlowFit = {
    law,
    dp0Bar: a,
    kPerL: K,
    rss,
    aic,
    r2: Number.isFinite(r2) ? r2 : 0,
    n,
    valid,
    sigmaBar: Math.sqrt(sigma2),
    covariance,
    residuals,
    volumeMaxL: xMax,
    iterations: st.iterations,
  };
  if (note) fit.note = note;
  return fit;
}

/** Above this many readings, iterate first on an evenly strided subsample. */
const COARSE_N = 2000;
const COARSE_TARGET = 1000;

/**
 * Fits all four Hermia (1982) blocking laws, in their constant-flux form, to readings
 * of a run at constant flow, by Levenberg–Marquardt least squares on ΔP against V.
 * @param points readings: volumeL = litres filtered since the start of the run (≥ 0),
 *   dpBar = differential pressure across the stage at that volume (bar, > 0). At least
 *   3 readings at 2 or more different volumes.
 * @returns one fit per law; physically valid fits first, ordered by AIC (lowest, i.e.
 *   best, first), then the rejected ones (`valid: false`, with a `note`).
 */
export function fitConstantFlow(points: { volumeL: number; dpBar: number }[]): ConstantFlowFit[] {
  if (!Array.isArray(points)) throw new RangeError('Readings must be a list of { volumeL, dpBar } points.');
  const n = points.length;
  if (n < 3) throw new RangeError(`At least 3 readings are needed to fit a fouling law (got ${String(n)}).`);
  const x = new Float64Array(n);
  const y = new Float64Array(n);
  // one pass: copy, check, and shifted moments for the total sum of squares and the
  // closed-form cake fit (ΔP = a + b·V is linear in a and b = a·K)
  const x0 = points[0].volumeL;
  const y0 = points[0].dpBar;
  let xMin = Infinity;
  let xMax = -Infinity;
  let sx = 0;
  let sxx = 0;
  let sy = 0;
  let syy = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    const p = points[i];
    const v = p.volumeL;
    const d = p.dpBar;
    if (!(v >= 0 && d > 0 && v < Infinity && d < Infinity)) {
      requireNonNegative(`volume of reading ${String(i + 1)} (L)`, v);
      requirePositive(`ΔP of reading ${String(i + 1)} (bar)`, d);
    }
    x[i] = v;
    y[i] = d;
    if (v < xMin) xMin = v;
    if (v > xMax) xMax = v;
    const dx = v - x0;
    const dy = d - y0;
    sx += dx;
    sxx += dx * dx;
    sy += dy;
    syy += dy * dy;
    sxy += dx * dy;
  }
  if (!(xMax > xMin)) throw new RangeError('Readings must span at least two different volumes.');
  const tss = Math.max(syy - (sy * sy) / n, 0);
  const yMean = y0 + sy / n;
  const full: Data = { x, y, n };
  const sc: Scratch = {
    resA: new Float64Array(n),
    resB: new Float64Array(n),
    sA: new Float64Array(6),
    sB: new Float64Array(6),
  };

  // cake: exact linear least squares, then one pass for residuals and covariance
  const slope = (n * sxy - sx * sy) / (n * sxx - sx * sx);
  const cakeA = y0 + (sy - slope * sx) / n - slope * x0;
  const cakeK = cakeA !== 0 ? slope / cakeA : 0;
  const cakeRss = pass('cake', cakeA, cakeK, x, y, n, sc.resA, sc.sA);
  const fits: ConstantFlowFit[] = [
    finish('cake', { a: cakeA, K: cakeK, rss: cakeRss, iterations: 1, res: sc.resA, s: sc.sA }, n, xMax, tss),
  ];

  // Coarse-to-fine for the non-linear laws: on long logs, converge on an evenly
  // strided subsample (cheap), then polish on every reading. The answer is the
  // full-data least-squares optimum either way.
  let coarse: Data | null = null;
  if (n > COARSE_N) {
    const stride = Math.ceil(n / COARSE_TARGET);
    const m = Math.ceil(n / stride);
    const xs = new Float64Array(m);
    const ys = new Float64Array(m);
    let cMin = Infinity;
    let cMax = -Infinity;
    for (let j = 0, i = 0; j < m; j++, i += stride) {
      xs[j] = x[i];
      ys[j] = y[i];
      if (x[i] < cMin) cMin = x[i];
      if (x[i] > cMax) cMax = x[i];
    }
    if (cMax > cMin) coarse = { x: xs, y: ys, n: m };
  }
  const st = coarse ? starts(coarse.x, coarse.y, coarse.n) : starts(x, y, n);
  for (const law of NONLINEAR_LAWS) {
    let p0 = clampStart(law, st[law], yMean, xMax);
    let used = 0;
    if (coarse) {
      const c = lm(law, p0.a, p0.K, coarse, xMax, sc, MAX_ITER);
      if (Number.isFinite(c.rss)) p0 = clampStart(law, { a: c.a, K: c.K }, yMean, xMax);
      used = c.iterations;
    }
    const state = lm(law, p0.a, p0.K, full, xMax, sc, MAX_ITER);
    const fit = finish(law, state, n, xMax, tss);
    fit.iterations += used;
    fits.push(fit);
  }
  fits.sort((p, q) => (p.valid === q.valid ? p.aic - q.aic : p.valid ? -1 : 1));
  return fits;
}

/**
 * Litres filtered (since the start of the run) when the fitted ΔP reaches `dpBar`, by
 * inverting the constant-flux law (Hermia 1982) with r = dpBar/ΔP0 and K = kPerL:
 * complete (1 − 1/r)/K; standard (1 − r^−½)/K; intermediate ln(r)/K; cake (r − 1)/K.
 * A dpBar at or below the fitted clean ΔP is reached from the start: returns 0.
 * @param fit a valid fit from {@link fitConstantFlow} (kPerL > 0, dp0Bar > 0)
 * @param dpBar target differential pressure, bar (> 0)
 * @returns volume, L
 */
export function volumeAtDp(
  fit: Pick<ConstantFlowFit, 'law' | 'dp0Bar' | 'kPerL'> & { valid?: boolean },
  dpBar: number,
): number {
  requirePositive('target ΔP (bar)', dpBar);
  requireFinite('fitted clean ΔP (bar)', fit.dp0Bar);
  requireFinite('fitted constant K (1/L)', fit.kPerL);
  if (fit.valid === false || fit.dp0Bar <= 0 || fit.kPerL < 0) {
    throw new RangeError('This fit is not physically valid (clean ΔP ≤ 0 or ΔP not rising), so it cannot forecast a volume.');
  }
  const r = dpBar / fit.dp0Bar;
  if (r <= 1) return 0;
  const K = fit.kPerL;
  if (K === 0) {
    throw new RangeError('The fit shows no rise of ΔP with volume, so the target ΔP is never reached.');
  }
  let v: number;
  switch (fit.law) {
    case 'complete':
      v = (1 - 1 / r) / K;
      break;
    case 'standard':
      v = (1 - 1 / Math.sqrt(r)) / K;
      break;
    case 'intermediate':
      v = Math.log(r) / K;
      break;
    case 'cake':
      v = (r - 1) / K;
      break;
    default:
      throw new RangeError(`Unknown blocking law "${String(fit.law)}".`);
  }
  if (!Number.isFinite(v)) throw new RangeError('The forecast volume is too large to represent.');
  return v;
}

/**
 * Gradient of {@link volumeAtDp} with respect to (ΔP0, K), for propagating the fit's
 * covariance to a forecast volume (delta method). Requires r = dpBar/ΔP0 > 1 and K > 0.
 * @returns [∂V/∂ΔP0 in L/bar, ∂V/∂K in L²]
 */
export function volumeAtDpGradient(fit: Pick<ConstantFlowFit, 'law' | 'dp0Bar' | 'kPerL'>, dpBar: number): [number, number] {
  const V = volumeAtDp(fit, dpBar);
  const r = dpBar / fit.dp0Bar;
  const K = fit.kPerL;
  if (r <= 1 || K <= 0) return [0, 0];
  const base = -1 / (fit.dp0Bar * K);
  let dDp0: number;
  switch (fit.law) {
    case 'complete':
      dDp0 = base / r;
      break;
    case 'standard':
      dDp0 = base / (2 * Math.sqrt(r));
      break;
    case 'intermediate':
      dDp0 = base;
      break;
    case 'cake':
      dDp0 = base * r;
      break;
  }
  return [dDp0, -V / K];
}
