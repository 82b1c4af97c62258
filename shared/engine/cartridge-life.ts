/**
 * Life forecast of one filter cartridge from its type's ratings and its own history:
 * litres filtered, care cycles (steam, hot water, chemical, backflush) with the clean-
 * water flow measured after regeneration, and integrity tests.
 *
 * A cartridge is retired when its flow no longer recovers after regeneration, when it
 * fails integrity, or when it reaches the rated number of thermal or chemical cycles
 * (or cumulative steam time, or litres) its maker gives. The maker's own figures govern;
 * the typical values exported here are only fallbacks and carry their provenance.
 *
 * Flow recovery: clean water at a fixed reference pressure and temperature, after
 * regeneration, divided by the flow of the new cartridge (or, when the new flow was not
 * recorded, by the first flow measured after a regeneration). By Darcy's law
 * (Darcy 1856) the flow at a fixed ΔP is inversely proportional to the medium's
 * resistance, so a recovery of 50 % means the clean-water ΔP at a fixed flow has doubled.
 * Flows should be measured at the same water temperature, or corrected for viscosity.
 */
import { requireFinite, requireNonNegative, requirePositive, requireRange } from './errors';
import { waterViscosity } from './fluids';

// ---------------------------------------------------------------------------
// Types
// ---------------------------------------------------------------------------

/** Kind of care cycle. Backflush counts against no rated budget. */
export type CareCycleKind = 'steam' | 'hot-water' | 'chemical' | 'backflush';

/** Care cycle kinds. */
export const CARE_CYCLE_KINDS: readonly CareCycleKind[] = ['steam', 'hot-water', 'chemical', 'backflush'];

/** One care cycle of a cartridge. */
export type CareCycle = {
  kind: CareCycleKind;
  /** temperature of the cycle, °C (0–200) */
  tempC?: number;
  /** duration, min (≥ 0) */
  durationMin?: number;
  /** cleaning or sanitising agent, free text */
  agent?: string;
  /** clean-water flow before the cycle, L/h (≥ 0) */
  waterFlowBeforeLh?: number;
  /** clean-water flow after the cycle, L/h (≥ 0) */
  waterFlowAfterLh?: number;
  /** order number (cycles are sorted by seq when every cycle has one) */
  seq?: number;
  /** time, ms since the Unix epoch (used for order when every cycle has it and seq is not
   *  on every cycle; otherwise cycles keep the order given) */
  atMs?: number;
  /** true when the cycle ran above the cartridge's (or housing's) temperature rating */
  aboveRating?: boolean;
};

/** One integrity test result. Tests are ordered by atMs when every test has it, else as given. */
export type IntegrityResult = { pass: boolean; atMs?: number };

/** Ratings of the cartridge type (from the maker's data sheet). */
export type CartridgeRatings = {
  /** rated steam-sterilisation cycles */
  ratedSteamCycles?: number;
  /** rated hot-water sanitation cycles */
  ratedHotWaterCycles?: number;
  /** rated chemical cleaning cycles */
  ratedChemicalCycles?: number;
  /** rated throughput over the cartridge's life, L */
  ratedLitres?: number;
  /** flow recovery below which the cartridge is spent, % of the new (or first) flow, (0, 100] */
  flowRecoveryMinPct: number;
  /** rated cumulative steam time, min */
  ratedSteamMinutes?: number;
};

/** History of one cartridge. */
export type CartridgeHistory = {
  /** litres filtered so far, L (≥ 0) */
  litresFiltered: number;
  cycles: CareCycle[];
  integrity?: IntegrityResult[];
  /** clean-water flow of the new cartridge at the reference pressure, L/h (> 0) */
  waterFlowNewLh?: number;
};

/** Options of the forecast. */
export type CartridgeLifeOptions = {
  /** average care cycles per week, for a date estimate (> 0) */
  cyclesPerWeek?: number;
  /** the current time, ms since the Unix epoch, for a date estimate */
  nowMs?: number;
  /**
   * Which integrity failures end life: 'latest' (default) — the most recent test failed,
   * so a failure cleared by a passing re-test after re-wetting does not end life, as a
   * membrane maker's note on false integrity failures advises; 'any' — any failure.
   */
  integrityRule?: 'latest' | 'any';
};

/** What limits (or ended) the cartridge's life. */
export type LimitingFactor =
  | 'steam cycles'
  | 'hot-water cycles'
  | 'chemical cycles'
  | 'steam minutes'
  | 'litres'
  | 'flow recovery'
  | 'integrity';

/** Budget factors (rated quantities). */
export type BudgetFactor = 'steam cycles' | 'hot-water cycles' | 'chemical cycles' | 'steam minutes' | 'litres';

/** Use of one rated budget. */
export type BudgetUse = {
  factor: BudgetFactor;
  unit: 'cycles' | 'min' | 'L';
  /** used so far (for steam minutes, unknown durations are filled with the longest logged); null if unknown */
  used: number | null;
  /** the rating, or null if the type gives none */
  rated: number | null;
  /** used ÷ rated (may exceed 1), or null */
  fraction: number | null;
  /** rated − used, never below 0, or null */
  remaining: number | null;
  /** further care cycles before this budget runs out, or null if it cannot be counted in cycles */
  cyclesLeft: number | null;
};

/** Flow recovery measured after one care cycle. */
export type RecoveryPoint = {
  /** 1-based position of the cycle among all care cycles, in order */
  cycle: number;
  kind: CareCycleKind;
  waterFlowAfterLh: number;
  /** after ÷ basis × 100 */
  recoveryPct: number;
  /** after ÷ before × 100 when the flow before was logged, else null */
  gainPct: number | null;
};

/** Trend of flow recovery against the cycle count. */
export type RecoveryTrend = {
  /**
   * 'linear': recovery = interceptPct + slopePctPerCycle·n (least squares);
   * 'exponential': recovery = interceptPct·exp(ratePerCycle·n) (least squares on ln).
   */
  model: 'linear' | 'exponential' | 'quadratic';
  interceptPct: number;
  /** linear slope, % per cycle (null for exponential) */
  slopePctPerCycle: number | null;
  /** exponential rate, 1/cycle (null for linear) */
  ratePerCycle: number | null;
  /** quadratic term c of a + b·n + c·n², % per cycle² (null unless quadratic) */
  curvaturePctPerCycle2: number | null;
  /** residual sum of squares in %², on recovery itself */
  rss: number;
  /** coefficient of determination on recovery itself */
  r2: number;
  /** cycle count at which the trend reaches the minimum recovery, or null if it does not fall */
  cycleAtMinimum: number | null;
};

/** The life forecast. */
export type CartridgeLife = {
  counts: {
    steam: number;
    hotWater: number;
    chemical: number;
    backflush: number;
    total: number;
    /** cycles that ran above the temperature rating (each still counts against its budget) */
    aboveRating: number;
  };
  litresFiltered: number;
  /** litres filtered ÷ care cycles, L, or null with no cycles or no litres */
  litresPerCycle: number | null;
  /** every budget, rated or not */
  budgets: BudgetUse[];
  /** used ÷ rated per budget, null where not rated or unknown */
  fractionUsed: {
    steamCycles: number | null;
    hotWaterCycles: number | null;
    chemicalCycles: number | null;
    litres: number | null;
    steamMinutes: number | null;
  };
  recovery: {
    basis: 'new' | 'first-after' | null;
    minPct: number;
    points: RecoveryPoint[];
    latestPct: number | null;
    trend: RecoveryTrend | null;
    /** further care cycles before the trend falls below minPct, or null */
    cyclesLeft: number | null;
  };
  integrity: { tests: number; failures: number; latestPass: boolean | null };
  /** what ends (or will first end) life, or null when nothing is known */
  limitingFactor: LimitingFactor | null;
  /** further care cycles of any kind before the first limit (0 when ended), or null */
  remainingCycles: number | null;
  /** further litres before the first limit (0 when ended), or null */
  remainingLitres: number | null;
  ended: boolean;
  /** plain reasons why life has ended */
  endedBecause: string[];
  /** estimated end of life, ms since the Unix epoch, or null */
  estimatedEndMs: number | null;
  /** plain statements of what the forecast knows */
  known: string[];
  /** plain statements of what it is missing */
  missing: string[];
};

// ---------------------------------------------------------------------------
// Typical figures
// ---------------------------------------------------------------------------

/**
 * Typical ratings of wine membrane cartridges, for when the maker's figures are not to
 * hand. Ranges, each with its provenance:
 * - hot water at 80–90 °C: ≥ 50–100 cycles of 30 min (from memory, typical wine-membrane
 *   data sheets);
 * - steam at 121 °C: about 30–100 cycles of 30 min, or a cumulative 15–50 h (from memory,
 *   typical wine-membrane data sheets); PP prefilters similar or lower, glass-fibre
 *   prefilters often fewer;
 * - spent when the clean-water ΔP will not come back to about 1.5–2× its new value
 *   (common practice, no source), i.e. a flow recovery at fixed ΔP of 1/2–1/1.5,
 *   50–67 % (Darcy's law).
 * Makers give no pass criterion for flow recovery in their regeneration guides.
 */
export const TYPICAL_CARTRIDGE_RATINGS = {
  hotWaterCycles: { min: 50, max: 100, tempC: [80, 90], cycleMin: 30, source: 'from memory (typical wine-membrane data sheets)' },
  steamCycles: { min: 30, max: 100, tempC: 121, cycleMin: 30, source: 'from memory (typical wine-membrane data sheets)' },
  steamMinutes: { min: 15 * 60, max: 50 * 60, source: 'from memory (typical wine-membrane data sheets)' },
  flowRecoveryMinPct: {
    min: 50,
    max: 100 / 1.5,
    source: 'common practice, no source (clean-water ΔP back to within 1.5–2× new; flow ∝ 1/ΔP by Darcy 1856)',
  },
} as const;

/**
 * Conservative default ratings: the low end of each typical range (and the higher
 * recovery floor, 1/1.5 = 66.7 %). No typical chemical-cycle or litre rating is known.
 * Sources as {@link TYPICAL_CARTRIDGE_RATINGS}: from memory / common practice, no source.
 */
export const conservativeCartridgeRatings: CartridgeRatings = {
  ratedSteamCycles: TYPICAL_CARTRIDGE_RATINGS.steamCycles.min,
  ratedHotWaterCycles: TYPICAL_CARTRIDGE_RATINGS.hotWaterCycles.min,
  ratedSteamMinutes: TYPICAL_CARTRIDGE_RATINGS.steamMinutes.min,
  flowRecoveryMinPct: TYPICAL_CARTRIDGE_RATINGS.flowRecoveryMinPct.max,
};

// ---------------------------------------------------------------------------
// Trend fitting
// ---------------------------------------------------------------------------

type Line = { a: number; b: number };

function leastSquaresLine(xs: number[], ys: number[]): Line | null {
  const n = xs.length;
  if (n < 2) return null;
  let mx = 0;
  let my = 0;
  for (let i = 0; i < n; i++) {
    mx += xs[i];
    my += ys[i];
  }
  mx /= n;
  my /= n;
  let sxx = 0;
  let sxy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (xs[i] - mx) ** 2;
    sxy += (xs[i] - mx) * (ys[i] - my);
  }
  if (!(sxx > 0)) return null;
  const b = sxy / sxx;
  return { a: my - b * mx, b };
}

function rssAndR2(ys: number[], pred: number[]): { rss: number; r2: number } {
  const my = ys.reduce((s, y) => s + y, 0) / ys.length;
  let rss = 0;
  let syy = 0;
  for (let i = 0; i < ys.length; i++) {
    rss += (ys[i] - pred[i]) ** 2;
    syy += (ys[i] - my) ** 2;
  }
  const r2 = syy > 0 ? 1 - rss / syy : rss === 0 ? 1 : 0;
  return { rss, r2 };
}

/** AICc of a least-squares fit with p constants (k = p + 1 with σ²; Burnham & Anderson 2002, eq. 2.2 and 7.x); null when n − k − 1 ≤ 0. */
function aiccLs(rss: number, n: number, p: number): number | null {
  const k = p + 1;
  if (n - k - 1 <= 0) return null;
  return n * Math.log(Math.max(rss / n, 1e-12)) + 2 * k + (2 * k * (k + 1)) / (n - k - 1);
}

/** Least-squares parabola y = a + b·x + c·x² (normal equations, Cramer's rule); null when degenerate. */
function leastSquaresParabola(xs: number[], ys: number[]): { a: number; b: number; c: number } | null {
  const n = xs.length;
  if (n < 3) return null;
  const mx = xs.reduce((s, x) => s + x, 0) / n;
  let s1 = 0, s2 = 0, s3 = 0, s4 = 0, t0 = 0, t1 = 0, t2 = 0;
  for (let i = 0; i < n; i++) {
    const x = xs[i] - mx;
    const y = ys[i];
    s1 += x;
    s2 += x * x;
    s3 += x * x * x;
    s4 += x * x * x * x;
    t0 += y;
    t1 += x * y;
    t2 += x * x * y;
  }
  const det3 = (m: number[][]) =>
    m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) + m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
  const M = [
    [n, s1, s2],
    [s1, s2, s3],
    [s2, s3, s4],
  ];
  const D = det3(M);
  if (!(Math.abs(D) > 1e-12) || !Number.isFinite(D)) return null;
  const rhs = [t0, t1, t2];
  const solve = (col: number) => det3(M.map((row, i) => row.map((v, j) => (j === col ? rhs[i] : v)))) / D;
  const a0 = solve(0);
  const b0 = solve(1);
  const c = solve(2);
  // back from x − mx to x
  return { a: a0 - b0 * mx + c * mx * mx, b: b0 - 2 * c * mx, c };
}

/**
 * Fit flow recovery (%) against the cycle count n, by ordinary least squares, as a
 * straight line r = a + b·n, as an exponential r = A·e^(k·n) (least squares on ln r, all
 * r > 0) and, from six measurements, as a parabola r = a + b·n + c·n² (an accelerating or
 * slowing decline). With five or more measurements the model with the lowest AICc is kept
 * (Burnham & Anderson, Model Selection and Multimodel Inference, 2002); with fewer, the one
 * with the smaller residual sum of squares on r itself, the line on a tie (it reaches a
 * falling threshold sooner, conservative).
 * `cycleAtMinimum` projects the kept model's shape from the latest measurement (the curve
 * is shifted to pass through it) down to r = minPct, when it is falling there.
 *
 * @param points  at least two points with distinct cycle counts; otherwise null
 * @param minPct  recovery floor, % (> 0)
 */
export function fitRecoveryTrend(points: { cycle: number; recoveryPct: number }[], minPct: number): RecoveryTrend | null {
  requirePositive('minimum flow recovery', minPct);
  for (const p of points) {
    requireFinite('cycle count', p.cycle);
    requireNonNegative('flow recovery', p.recoveryPct);
  }
  const xs = points.map((p) => p.cycle);
  const ys = points.map((p) => p.recoveryPct);
  const n = xs.length;
  const lin = leastSquaresLine(xs, ys);
  if (!lin) return null;
  const last = points.reduce((m, p) => (p.cycle >= m.cycle ? p : m), points[0]);
  const linFit = rssAndR2(
    ys,
    xs.map((x) => lin.a + lin.b * x),
  );
  const candidates: { trend: RecoveryTrend; p: number }[] = [];
  {
    const shift = last.recoveryPct - (lin.a + lin.b * last.cycle);
    candidates.push({
      p: 2,
      trend: {
        model: 'linear',
        interceptPct: lin.a,
        slopePctPerCycle: lin.b,
        ratePerCycle: null,
        curvaturePctPerCycle2: null,
        rss: linFit.rss,
        r2: linFit.r2,
        cycleAtMinimum: lin.b < 0 ? (minPct - lin.a - shift) / lin.b : null,
      },
    });
  }
  if (ys.every((y) => y > 0)) {
    const ln = leastSquaresLine(
      xs,
      ys.map((y) => Math.log(y)),
    );
    if (ln) {
      const A = Math.exp(ln.a);
      const expFit = rssAndR2(
        ys,
        xs.map((x) => A * Math.exp(ln.b * x)),
      );
      const shift = last.recoveryPct - A * Math.exp(ln.b * last.cycle);
      const target = (minPct - shift) / A;
      candidates.push({
        p: 2,
        trend: {
          model: 'exponential',
          interceptPct: A,
          slopePctPerCycle: null,
          ratePerCycle: ln.b,
          curvaturePctPerCycle2: null,
          rss: expFit.rss,
          r2: expFit.r2,
          cycleAtMinimum: ln.b < 0 && target > 0 ? Math.log(target) / ln.b : null,
        },
      });
    }
  }
  if (n >= 6) {
    const q = leastSquaresParabola(xs, ys);
    if (q) {
      const qFit = rssAndR2(
        ys,
        xs.map((x) => q.a + q.b * x + q.c * x * x),
      );
      const shift = last.recoveryPct - (q.a + q.b * last.cycle + q.c * last.cycle * last.cycle);
      // smallest root beyond the latest cycle of c·x² + b·x + (a + shift − min) = 0
      const c0 = q.a + shift - minPct;
      let at: number | null = null;
      const slopeAtLast = q.b + 2 * q.c * last.cycle;
      if (slopeAtLast < 0) {
        if (Math.abs(q.c) < 1e-12) at = -c0 / q.b;
        else {
          const disc = q.b * q.b - 4 * q.c * c0;
          if (disc >= 0) {
            const r1 = (-q.b - Math.sqrt(disc)) / (2 * q.c);
            const r2 = (-q.b + Math.sqrt(disc)) / (2 * q.c);
            const roots = [r1, r2].filter((r) => r >= last.cycle - 1e-9).sort((u, v) => u - v);
            at = roots.length ? roots[0] : null;
          }
        }
      }
      candidates.push({
        p: 3,
        trend: {
          model: 'quadratic',
          interceptPct: q.a,
          slopePctPerCycle: q.b,
          ratePerCycle: null,
          curvaturePctPerCycle2: q.c,
          rss: qFit.rss,
          r2: qFit.r2,
          cycleAtMinimum: at,
        },
      });
    }
  }
  let best = candidates[0];
  if (n >= 5) {
    let bestScore = aiccLs(best.trend.rss, n, best.p) ?? Infinity;
    for (const c of candidates.slice(1)) {
      const score = aiccLs(c.trend.rss, n, c.p);
      if (score !== null && score < bestScore - 1e-9) {
        best = c;
        bestScore = score;
      }
    }
  } else {
    for (const c of candidates.slice(1)) {
      const tol = 1e-9 * Math.max(1, best.trend.rss);
      if (c.p === 2 && c.trend.rss < best.trend.rss - tol) best = c;
    }
  }
  return best.trend;
}

/**
 * Clean-water flow brought to the reference the recovery is judged on: per cartridge (a
 * housing's flow ÷ its cartridges' 10-inch equivalents × the cartridge's), at 20 °C
 * (Darcy: Q ∝ 1/μ at equal ΔP, IAPWS R12-08 water viscosity) and at the reference ΔP
 * (Q ∝ ΔP). See engineering reference §5.
 * @param p.flowLh measured water flow, L/h (> 0)
 * @param p.basis 'cartridge' (this cartridge alone) or 'housing' (the whole housing)
 * @param p.cartridgeEquivalents this cartridge's 10-inch equivalents; p.housingEquivalents the housing's (for 'housing')
 * @param p.waterTempC water temperature of the measurement, °C (0–100; default 20)
 * @param p.dpBar ΔP of the measurement and p.refDpBar the reference ΔP, bar (both or neither)
 * @returns per-cartridge flow at 20 °C and the reference ΔP, L/h
 */
export function normalisedWaterFlowLh(p: {
  flowLh: number;
  basis?: 'cartridge' | 'housing';
  cartridgeEquivalents?: number;
  housingEquivalents?: number;
  waterTempC?: number;
  dpBar?: number;
  refDpBar?: number;
}): number {
  requirePositive('water flow (L/h)', p.flowLh);
  let q = p.flowLh;
  if (p.basis === 'housing') {
    requirePositive('cartridge 10-inch equivalents', p.cartridgeEquivalents ?? NaN);
    requirePositive('housing 10-inch equivalents', p.housingEquivalents ?? NaN);
    q = (q * (p.cartridgeEquivalents as number)) / (p.housingEquivalents as number);
  }
  if (p.waterTempC !== undefined) q = (q * waterViscosity(p.waterTempC)) / waterViscosity(20);
  if (p.dpBar !== undefined || p.refDpBar !== undefined) {
    requirePositive('ΔP of the measurement (bar)', p.dpBar ?? NaN);
    requirePositive('reference ΔP (bar)', p.refDpBar ?? NaN);
    q = (q * (p.refDpBar as number)) / (p.dpBar as number);
  }
  return q;
}

/** Usual sanitation temperatures of wine practice, °C: hot water about 82 °C, steam about 121 °C (engineering and trade references; from memory). */
export const USUAL_CARE_TEMP_C = { 'hot-water': 82, steam: 121 } as const;

/**
 * The temperature hint for a care cycle, never above the rating: the usual temperature when the
 * cartridge and housing are rated for it, else the rating itself with a plain word that the
 * usual temperature is not allowed for this type (common practice, no source).
 * @param kind cycle kind; ratingC the lower of the cartridge's and the housing's maximum temperature, °C
 * @returns { suggestC: the temperature to aim for (≤ ratingC) or null for chemical and backflush, text }
 */
export function careTemperatureHint(kind: CareCycleKind, ratingC: number): { suggestC: number | null; text: string } {
  requireFinite('temperature rating (°C)', ratingC);
  if (kind !== 'hot-water' && kind !== 'steam') return { suggestC: null, text: '' };
  const usual = USUAL_CARE_TEMP_C[kind];
  const r = Math.round(ratingC);
  if (kind === 'steam' && ratingC < usual) {
    return { suggestC: null, text: `Not rated for steam: this cartridge is rated to ${String(r)} °C. Use hot water at or below ${String(r)} °C, as its maker allows.` };
  }
  if (ratingC < usual) {
    return { suggestC: ratingC, text: `Hold at no more than ${String(r)} °C (its rating) for at least 20–30 min, measured at the far end of the line, and follow the maker's sanitation instructions.` };
  }
  return kind === 'hot-water'
    ? { suggestC: usual, text: `Common wine practice: about ${String(usual)} °C for at least 20–30 min, measured at the far end of the line.` }
    : { suggestC: usual, text: 'Hold at least 15 min once live steam shows at every outlet.' };
}

/** Recovery above this % of the basis is suspect: likely a housing's flow entered as one cartridge's (common practice, no source). */
export const RECOVERY_SUSPECT_PCT = 105;

// ---------------------------------------------------------------------------
// Forecast
// ---------------------------------------------------------------------------

const WEEK_MS = 7 * 24 * 3600 * 1000;
const EPS = 1e-9;

/** A number for a message: rounded to `maxDecimals`, trailing zeros dropped, thousands separated by commas. */
function fmtNum(x: number, maxDecimals = 1): string {
  const fixed = (Math.round(x * 10 ** maxDecimals) / 10 ** maxDecimals).toFixed(maxDecimals);
  const [int, dec = ''] = fixed.split('.');
  const sign = int.startsWith('-') ? '-' : '';
  const digits = sign ? int.slice(1) : int;
  const grouped = digits.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  const frac = dec.replace(/0+$/, '');
  const out = `${sign}${grouped}${frac ? `.${frac}` : ''}`;
  return out === '-0' ? '0' : out;
}

function checkOptionalPositive(name: string, v: number | undefined): void {
  if (v !== undefined) requirePositive(name, v);
}

function orderCycles(cycles: CareCycle[]): CareCycle[] {
  const idx = cycles.map((c, i) => ({ c, i }));
  if (cycles.length > 0 && cycles.every((c) => c.seq !== undefined)) {
    idx.sort((p, q) => (p.c.seq as number) - (q.c.seq as number) || p.i - q.i);
  } else if (cycles.length > 0 && cycles.every((c) => c.atMs !== undefined)) {
    idx.sort((p, q) => (p.c.atMs as number) - (q.c.atMs as number) || p.i - q.i);
  }
  return idx.map((p) => p.c);
}

function validate(ratings: CartridgeRatings, history: CartridgeHistory, options: CartridgeLifeOptions): void {
  checkOptionalPositive('rated steam cycles', ratings.ratedSteamCycles);
  checkOptionalPositive('rated hot-water cycles', ratings.ratedHotWaterCycles);
  checkOptionalPositive('rated chemical cycles', ratings.ratedChemicalCycles);
  checkOptionalPositive('rated litres', ratings.ratedLitres);
  checkOptionalPositive('rated steam minutes', ratings.ratedSteamMinutes);
  requireFinite('minimum flow recovery', ratings.flowRecoveryMinPct);
  if (!(ratings.flowRecoveryMinPct > 0 && ratings.flowRecoveryMinPct <= 100)) {
    throw new RangeError(
      `Minimum flow recovery must be above 0 % and at most 100 % (got ${String(ratings.flowRecoveryMinPct)} %).`,
    );
  }
  requireNonNegative('litres filtered', history.litresFiltered);
  if (!Array.isArray(history.cycles)) throw new RangeError('Cycles must be a list (it may be empty).');
  checkOptionalPositive('as-new clean-water flow', history.waterFlowNewLh);
  history.cycles.forEach((c, i) => {
    const n = `cycle ${String(i + 1)}`;
    if (!CARE_CYCLE_KINDS.includes(c.kind)) {
      throw new RangeError(`Unknown kind "${String(c.kind)}" for ${n}: use steam, hot-water, chemical or backflush.`);
    }
    if (c.tempC !== undefined) requireRange(`${n} temperature`, c.tempC, 0, 200, '°C');
    if (c.durationMin !== undefined) requireNonNegative(`${n} duration`, c.durationMin);
    if (c.waterFlowBeforeLh !== undefined) requireNonNegative(`${n} water flow before`, c.waterFlowBeforeLh);
    if (c.waterFlowAfterLh !== undefined) requireNonNegative(`${n} water flow after`, c.waterFlowAfterLh);
    if (c.seq !== undefined) requireFinite(`${n} sequence number`, c.seq);
    if (c.atMs !== undefined) requireFinite(`${n} time`, c.atMs);
  });
  (history.integrity ?? []).forEach((t, i) => {
    if (typeof t.pass !== 'boolean') throw new RangeError(`Integrity test ${String(i + 1)} must say pass or fail.`);
    if (t.atMs !== undefined) requireFinite(`integrity test ${String(i + 1)} time`, t.atMs);
  });
  checkOptionalPositive('cycles per week', options.cyclesPerWeek);
  if (options.nowMs !== undefined) requireFinite('current time', options.nowMs);
  if (options.integrityRule !== undefined && options.integrityRule !== 'latest' && options.integrityRule !== 'any') {
    throw new RangeError(`Unknown integrity rule "${String(options.integrityRule)}": use latest or any.`);
  }
}

function cycleBudget(factor: BudgetFactor, used: number, rated: number | undefined): BudgetUse {
  if (rated === undefined) {
    return { factor, unit: 'cycles', used, rated: null, fraction: null, remaining: null, cyclesLeft: null };
  }
  const remaining = Math.max(0, rated - used);
  return { factor, unit: 'cycles', used, rated, fraction: used / rated, remaining, cyclesLeft: remaining };
}

/** Tie-break order of limiting factors (first wins on equal cycles left). */
const FACTOR_ORDER: readonly LimitingFactor[] = [
  'integrity',
  'steam cycles',
  'steam minutes',
  'hot-water cycles',
  'chemical cycles',
  'litres',
  'flow recovery',
];

/**
 * Life forecast of one cartridge.
 *
 * - Budgets: used ÷ rated for steam, hot-water and chemical cycles, cumulative steam
 *   minutes (unknown steam durations are filled with the longest logged one, so the use
 *   is not under-stated) and litres. Backflushes count against no budget.
 * - Remaining cycles, counted in care cycles of any kind: the smallest of
 *   rated − used per cycle budget (a lower bound whatever the future mix of kinds), the
 *   remaining steam minutes ÷ the longest logged steam cycle, the remaining litres ÷
 *   litres per cycle so far, and the cycles before the flow-recovery trend falls below
 *   `flowRecoveryMinPct` (see {@link fitRecoveryTrend}); rounded down. Remaining litres:
 *   the smaller of rated − filtered and litres per cycle × remaining cycles.
 * - Life has ended (remaining 0) when integrity failed (see `integrityRule`), when any
 *   budget is used up (≥ 100 %), or when the latest measured recovery is below the floor.
 * - Date: now + remaining cycles ÷ cycles per week, when both are given.
 *
 * Sources: rated-cycle practice and recovery floors as {@link TYPICAL_CARTRIDGE_RATINGS};
 * Darcy's law for flow vs resistance; ordinary least squares for the trend.
 *
 * @throws RangeError for invalid ratings, history or options
 */
export function cartridgeLife(
  ratings: CartridgeRatings,
  history: CartridgeHistory,
  options: CartridgeLifeOptions = {},
): CartridgeLife {
  return lifeForecast(ratings, history, options, true);
}

/** The forecast's figures and verdict, without its plain-words account (`known`, `missing`). */
export type CartridgeLifeVerdict = Omit<CartridgeLife, 'known' | 'missing'>;

/**
 * The same forecast as {@link cartridgeLife}, field for field, without building the plain
 * statements of what it knows and misses: for screens that only need the verdict and the
 * figures of many cartridges at once (Today). Same validation and errors; same sources.
 *
 * @throws RangeError for invalid ratings, history or options
 */
export function cartridgeLifeVerdict(
  ratings: CartridgeRatings,
  history: CartridgeHistory,
  options: CartridgeLifeOptions = {},
): CartridgeLifeVerdict {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  const { known, missing, ...verdict } = lifeForecast(ratings, history, options, false);
  return verdict;
}

const ignore = (): void => {};
const collect = (list: string[], line: () => string): void => {
  list.push(line());
};

/** The plain-words account of a forecast: lines are closures, built only when `say` is `collect`. */
type Notes = { known: string[]; missing: string[]; say: (list: string[], line: () => string) => void };

/**
 * The forecast in named steps: what is known, the budgets (care cycles by kind, steam
 * minutes, litres), the flow-recovery trend, the integrity tests, whether life has ended,
 * what limits it and how much is left, and the date.
 */
function lifeForecast(ratings: CartridgeRatings, history: CartridgeHistory, options: CartridgeLifeOptions, explain: boolean): CartridgeLife {
  validate(ratings, history, options);
  // The plain statements are built only when asked for (each line is a closure, evaluated by `collect`).
  const notes: Notes = { known: [], missing: [], say: explain ? collect : ignore };
  const cycles = orderCycles(history.cycles);
  const counts = careCounts(cycles);
  const litres = history.litresFiltered;
  const litresPerCycle = counts.total > 0 && litres > 0 ? litres / counts.total : null;

  noteRatingsAndUse(ratings, counts, litres, notes);
  const budgets = cycleBudgets(ratings, counts, notes);
  budgets.push(steamMinutesBudget(ratings, cycles, notes));
  budgets.push(litresBudget(ratings, litres, litresPerCycle, notes));
  const { say, known } = notes;
  if (litresPerCycle !== null) say(known, () => `Litres per care cycle so far: ${fmtNum(litresPerCycle, 0)} L.`);

  const recovery = recoveryState(ratings.flowRecoveryMinPct, cycles, history, notes);
  const integrity = integrityState(history, notes);
  const end = endOfLife(options.integrityRule ?? 'latest', integrity, budgets, recovery);
  const left = remainingLife(budgets, recovery.cyclesLeft, end, litresPerCycle, notes);
  const estimatedEndMs = estimatedEnd(options, left.remainingCycles, end.ended, notes);

  const frac = (f: BudgetFactor) => (budgets.find((b) => b.factor === f) as BudgetUse).fraction;
  return {
    counts,
    litresFiltered: litres,
    litresPerCycle,
    budgets,
    fractionUsed: {
      steamCycles: frac('steam cycles'),
      hotWaterCycles: frac('hot-water cycles'),
      chemicalCycles: frac('chemical cycles'),
      litres: frac('litres'),
      steamMinutes: frac('steam minutes'),
    },
    recovery,
    integrity,
    limitingFactor: left.limitingFactor,
    remainingCycles: left.remainingCycles,
    remainingLitres: left.remainingLitres,
    ended: end.ended,
    endedBecause: end.endedBecause,
    estimatedEndMs,
    known: notes.known,
    missing: notes.missing,
  };
}

/** Care cycles by kind, and how many ran above the temperature rating. */
function careCounts(cycles: CareCycle[]): CartridgeLife['counts'] {
  const total = cycles.length;
  const count = (k: CareCycleKind) => cycles.filter((c) => c.kind === k).length;
  const aboveRating = cycles.filter((c) => c.aboveRating === true).length;
  return { steam: count('steam'), hotWater: count('hot-water'), chemical: count('chemical'), backflush: count('backflush'), total, aboveRating };
}

/** Which ratings the type gives, the recovery floor, the litres and cycles so far; a caution for cycles above the rating. */
function noteRatingsAndUse(ratings: CartridgeRatings, counts: CartridgeLife['counts'], litres: number, { known, missing, say }: Notes): void {
  const ratingLines: [number | undefined, string, string][] = [
    [ratings.ratedSteamCycles, 'rated steam cycles', ''],
    [ratings.ratedHotWaterCycles, 'rated hot-water cycles', ''],
    [ratings.ratedChemicalCycles, 'rated chemical cycles', ''],
    [ratings.ratedSteamMinutes, 'rated cumulative steam time', ' min'],
    [ratings.ratedLitres, 'rated litres', ' L'],
  ];
  for (const [v, name, unit] of ratingLines) {
    if (v !== undefined) say(known, () => `${name[0].toUpperCase()}${name.slice(1)}: ${fmtNum(v)}${unit}.`);
    else say(missing, () => `The cartridge type gives no ${name}.`);
  }
  const { total, aboveRating } = counts;
  say(known, () => `Flow recovery floor: ${fmtNum(ratings.flowRecoveryMinPct)} %.`);
  say(known, () => `Litres filtered: ${fmtNum(litres, 0)} L.`);
  say(known, () =>
    `${String(total)} care cycle${total === 1 ? '' : 's'} logged (${String(counts.steam)} steam, ${String(counts.hotWater)} hot-water, ${String(counts.chemical)} chemical, ${String(counts.backflush)} backflush).`,
  );

  if (aboveRating > 0) {
    missing.push(
      `${String(aboveRating)} cycle${aboveRating === 1 ? '' : 's'} ran above the temperature rating: the maker's cycle ratings may no longer hold, so treat the life left as shorter and test integrity before use.`,
    );
  }
}

/** Steam, hot-water and chemical cycles used against their ratings. Backflushes count against none. */
function cycleBudgets(ratings: CartridgeRatings, counts: CartridgeLife['counts'], { missing, say }: Notes): BudgetUse[] {
  const budgets: BudgetUse[] = [
    cycleBudget('steam cycles', counts.steam, ratings.ratedSteamCycles),
    cycleBudget('hot-water cycles', counts.hotWater, ratings.ratedHotWaterCycles),
    cycleBudget('chemical cycles', counts.chemical, ratings.ratedChemicalCycles),
  ];
  for (const b of budgets) {
    if (b.rated === null && b.used !== null && b.used > 0) say(missing, () => `No rating for ${b.factor}, though the cartridge has had ${String(b.used)}.`);
  }
  return budgets;
}

/**
 * Cumulative steam minutes against the rating: unknown durations count at the longest logged
 * one (so the use is not under-stated); cycles left = remaining minutes ÷ that longest cycle.
 */
function steamMinutesBudget(ratings: CartridgeRatings, cycles: CareCycle[], { known, missing, say }: Notes): BudgetUse {
  const steam = cycles.filter((c) => c.kind === 'steam');
  const durations = steam.filter((c) => c.durationMin !== undefined).map((c) => c.durationMin as number);
  const unknownDur = steam.length - durations.length;
  const longest = durations.length ? Math.max(...durations) : null;
  let steamMinutesUsed: number | null;
  if (steam.length === 0) steamMinutesUsed = 0;
  else if (longest === null) steamMinutesUsed = null;
  else steamMinutesUsed = durations.reduce((s, d) => s + d, 0) + unknownDur * longest;
  if (steam.length > 0) {
    if (unknownDur === 0) say(known, () => `Steam time: ${fmtNum(steamMinutesUsed as number)} min over ${String(steam.length)} steam cycles.`);
    else if (longest !== null)
      say(missing, () =>
        `Duration of ${String(unknownDur)} of ${String(steam.length)} steam cycles (counted at the longest logged, ${fmtNum(longest)} min).`,
      );
    else say(missing, () => `Duration of all ${String(steam.length)} steam cycles, so steam time is unknown.`);
  }
  const rated = ratings.ratedSteamMinutes;
  if (rated === undefined || steamMinutesUsed === null) {
    return { factor: 'steam minutes', unit: 'min', used: steamMinutesUsed, rated: rated ?? null, fraction: null, remaining: null, cyclesLeft: null };
  }
  const remaining = Math.max(0, rated - steamMinutesUsed);
  return {
    factor: 'steam minutes',
    unit: 'min',
    used: steamMinutesUsed,
    rated,
    fraction: steamMinutesUsed / rated,
    remaining,
    cyclesLeft: longest !== null && longest > 0 ? remaining / longest : remaining === 0 ? 0 : null,
  };
}

/** Litres filtered against the rating; cycles left = remaining litres ÷ litres per cycle so far. */
function litresBudget(ratings: CartridgeRatings, litres: number, litresPerCycle: number | null, { missing, say }: Notes): BudgetUse {
  const rated = ratings.ratedLitres;
  if (rated === undefined) {
    return { factor: 'litres', unit: 'L', used: litres, rated: null, fraction: null, remaining: null, cyclesLeft: null };
  }
  const remaining = Math.max(0, rated - litres);
  if (litresPerCycle === null) {
    say(missing, () => 'Litres per cycle (no cycles or no litres logged yet), so the litres budget cannot be counted in cycles.');
  }
  return {
    factor: 'litres',
    unit: 'L',
    used: litres,
    rated,
    fraction: litres / rated,
    remaining,
    cyclesLeft: remaining === 0 ? 0 : litresPerCycle !== null ? remaining / litresPerCycle : null,
  };
}

/**
 * Flow recovery after each measured cycle against the as-new flow (or, lacking it, the first
 * flow after a regeneration, which overstates recovery), its trend ({@link fitRecoveryTrend})
 * and the cycles before the trend reaches the floor.
 */
function recoveryState(minPct: number, cycles: CareCycle[], history: CartridgeHistory, { known, missing, say }: Notes): CartridgeLife['recovery'] {
  const total = cycles.length;
  const measured = cycles
    .map((c, i) => ({ c, cycle: i + 1 }))
    .filter((p) => p.c.waterFlowAfterLh !== undefined);
  let basis: 'new' | 'first-after' | null = null;
  let basisLh: number | null = null;
  if (history.waterFlowNewLh !== undefined) {
    basis = 'new';
    const newLh = history.waterFlowNewLh;
    basisLh = newLh;
    say(known, () => `As-new clean-water flow: ${fmtNum(newLh, 0)} L/h.`);
  } else {
    say(missing, () => 'As-new clean-water flow, so recovery is measured against the first flow after a regeneration (this overstates recovery).');
    const firstPositive = measured.find((p) => (p.c.waterFlowAfterLh as number) > 0);
    if (firstPositive) {
      basis = 'first-after';
      basisLh = firstPositive.c.waterFlowAfterLh as number;
    }
  }
  const points: RecoveryPoint[] =
    basisLh === null
      ? []
      : measured.map((p) => {
          const after = p.c.waterFlowAfterLh as number;
          const before = p.c.waterFlowBeforeLh;
          return {
            cycle: p.cycle,
            kind: p.c.kind,
            waterFlowAfterLh: after,
            recoveryPct: (after / (basisLh as number)) * 100,
            gainPct: before !== undefined && before > 0 ? (after / before) * 100 : null,
          };
        });
  if (points.length > 0) {
    say(known, () => `Water flow after the cycle for ${String(points.length)} of ${String(total)} cycles.`);
  } else if (total > 0) {
    say(missing, () => 'Water flow after regeneration, so flow recovery cannot be followed.');
  } else {
    say(missing, () => 'Care cycles with water flow after regeneration (none logged yet).');
  }
  const trend = fitRecoveryTrend(points, minPct);
  if (points.length === 1) say(missing, () => 'A second flow-recovery measurement, needed for a trend.');
  const latestPct = points.length ? points[points.length - 1].recoveryPct : null;
  let cyclesLeft: number | null = null;
  if (trend) {
    say(known, () =>
      trend.model === 'linear'
        ? `Flow recovery trend: linear, ${fmtNum(trend.slopePctPerCycle as number, 2)} % per cycle (r² ${fmtNum(trend.r2, 3)}).`
        : trend.model === 'quadratic'
          ? `Flow recovery trend: ${(trend.curvaturePctPerCycle2 as number) < 0 ? 'accelerating' : 'slowing'} decline (quadratic, r² ${fmtNum(trend.r2, 3)}).`
          : `Flow recovery trend: exponential, ${fmtNum((Math.exp(trend.ratePerCycle as number) - 1) * 100, 2)} % per cycle (r² ${fmtNum(trend.r2, 3)}).`,
    );
    if (trend.cycleAtMinimum !== null) cyclesLeft = Math.max(0, trend.cycleAtMinimum - total);
  }
  return { basis, minPct, points, latestPct, trend, cyclesLeft };
}

/** Integrity tests: how many, how many failed, and whether the latest (by time when every test has one) passed. */
function integrityState(history: CartridgeHistory, { known, missing, say }: Notes): CartridgeLife['integrity'] {
  const tests = history.integrity ?? [];
  const orderedTests =
    tests.length > 0 && tests.every((t) => t.atMs !== undefined)
      ? [...tests].map((t, i) => ({ t, i })).sort((p, q) => (p.t.atMs as number) - (q.t.atMs as number) || p.i - q.i).map((p) => p.t)
      : tests;
  const failures = tests.filter((t) => !t.pass).length;
  const latestPass = orderedTests.length ? orderedTests[orderedTests.length - 1].pass : null;
  if (tests.length === 0) say(missing, () => 'Integrity test results.');
  else
    say(known, () =>
      `${String(tests.length)} integrity test${tests.length === 1 ? '' : 's'}, ${String(failures)} failed; latest ${latestPass ? 'passed' : 'failed'}.`,
    );
  return { tests: tests.length, failures, latestPass };
}

/** Life has ended when integrity failed (by the rule), a budget is used up, or the latest recovery is below the floor. */
function endOfLife(
  rule: NonNullable<CartridgeLifeOptions['integrityRule']>,
  integrity: CartridgeLife['integrity'],
  budgets: BudgetUse[],
  recovery: CartridgeLife['recovery'],
): { ended: boolean; endedBecause: string[]; endFactors: LimitingFactor[] } {
  const endedBecause: string[] = [];
  const endFactors: LimitingFactor[] = [];
  const { failures, latestPass } = integrity;
  if ((rule === 'latest' && latestPass === false) || (rule === 'any' && failures > 0)) {
    endedBecause.push(rule === 'latest' ? 'The latest integrity test failed.' : `${String(failures)} integrity test(s) failed.`);
    endFactors.push('integrity');
  }
  for (const b of budgets) {
    if (b.fraction !== null && b.rated !== null && b.used !== null && b.used >= b.rated) {
      endedBecause.push(`${b.factor[0].toUpperCase()}${b.factor.slice(1)} used up: ${fmtNum(b.used)} of ${fmtNum(b.rated)}${b.unit === 'cycles' ? '' : ` ${b.unit}`}.`);
      endFactors.push(b.factor);
    }
  }
  const { latestPct, minPct } = recovery;
  if (latestPct !== null && latestPct < minPct) {
    endedBecause.push(`Flow recovered to only ${fmtNum(latestPct)} %, below the ${fmtNum(minPct)} % floor.`);
    endFactors.push('flow recovery');
  }
  return { ended: endedBecause.length > 0, endedBecause, endFactors };
}

/**
 * What limits life and how much is left: the fewest cycles left over the budgets and the
 * recovery trend (ties by {@link FACTOR_ORDER}), rounded down; litres left = the smaller of
 * the litres budget and litres per cycle × cycles left. Zero when life has ended.
 */
function remainingLife(
  budgets: BudgetUse[],
  flowCyclesLeft: number | null,
  end: { ended: boolean; endFactors: LimitingFactor[] },
  litresPerCycle: number | null,
  { missing, say }: Notes,
): { limitingFactor: LimitingFactor | null; remainingCycles: number | null; remainingLitres: number | null } {
  if (end.ended) {
    return { limitingFactor: FACTOR_ORDER.find((f) => end.endFactors.includes(f)) ?? null, remainingCycles: 0, remainingLitres: 0 };
  }
  const candidates: { factor: LimitingFactor; cyclesLeft: number }[] = [];
  for (const b of budgets) if (b.cyclesLeft !== null) candidates.push({ factor: b.factor, cyclesLeft: b.cyclesLeft });
  if (flowCyclesLeft !== null) candidates.push({ factor: 'flow recovery', cyclesLeft: flowCyclesLeft });

  let limitingFactor: LimitingFactor | null = null;
  let remainingCycles: number | null = null;
  let remainingLitres: number | null = null;
  let best: { factor: LimitingFactor; cyclesLeft: number } | null = null;
  for (const c of candidates) {
    if (
      best === null ||
      c.cyclesLeft < best.cyclesLeft - EPS ||
      (Math.abs(c.cyclesLeft - best.cyclesLeft) <= EPS && FACTOR_ORDER.indexOf(c.factor) < FACTOR_ORDER.indexOf(best.factor))
    ) {
      best = c;
    }
  }
  const litresUse = budgets.find((b) => b.factor === 'litres') as BudgetUse;
  if (best) {
    limitingFactor = best.factor;
    remainingCycles = Math.floor(best.cyclesLeft + EPS);
  }
  const litreOptions: number[] = [];
  if (litresUse.remaining !== null) litreOptions.push(litresUse.remaining);
  if (remainingCycles !== null && litresPerCycle !== null) litreOptions.push(litresPerCycle * remainingCycles);
  if (litreOptions.length) remainingLitres = Math.min(...litreOptions);
  if (limitingFactor === null && litresUse.remaining !== null) limitingFactor = 'litres';
  if (limitingFactor === null) say(missing, () => 'Any rating or trend that limits life, so no forecast can be made.');
  return { limitingFactor, remainingCycles, remainingLitres };
}

/** Estimated end of life: now + cycles left ÷ cycles per week, when both are given. */
function estimatedEnd(options: CartridgeLifeOptions, remainingCycles: number | null, ended: boolean, { missing, say }: Notes): number | null {
  if (options.cyclesPerWeek !== undefined && options.nowMs !== undefined) {
    return remainingCycles !== null ? options.nowMs + (remainingCycles / options.cyclesPerWeek) * WEEK_MS : null;
  }
  if (!ended) say(missing, () => 'Average care cycles per week and the current date, for a date estimate.');
  return null;
}
