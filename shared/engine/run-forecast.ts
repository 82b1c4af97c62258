/**
 * Forecast of a run at constant flow: litres and clock time left before a stage
 * reaches its terminal ΔP, from blocking-law fits of the run's readings (Hermia,
 * Trans. IChemE 60 (1982) 183–187, constant-flux forms; see fit-constant-flow.ts).
 *
 * What the forecast knows and says:
 * - Fouling is accepted only when the fitted K is significant (K > t(n−2)·SE(K)) and the
 *   fitted ΔP rise over the readings exceeds the gauge resolution and 5 % of ΔP0;
 *   otherwise ΔP is "not rising" and no litres are forecast (a RangeError says why).
 * - The laws are weighed by Akaike weights (AICc; Burnham & Anderson, Model Selection and
 *   Multimodel Inference, 2nd ed. 2002, §2.4 and §4.2–4.3): the volume at terminal is the
 *   weighted mean, its standard error the unconditional one of their eq. 4.9 (each law's
 *   delta-method variance plus its distance from the mean).
 * - The band is ± t(0.975; n − 2)·SE (Student t; with three readings t = 12.7, not 2).
 * - A forecast beyond 3 × the litres seen in the segment is flagged `beyondReadings`
 *   (common practice, no source: extrapolation far past the data is not trusted).
 * - Readings may carry flow and temperature: ΔP is put on the resistance basis
 *   ΔP/(μ·Q) (Darcy's law) and brought back to the current flow and temperature, with the
 *   temperature dependence of the liquid's viscosity taken as water's (IAPWS R12-08) —
 *   an approximation for wine, whose viscosity ratio follows water's within a few %.
 * - Volumes restart at a regeneration or change recorded during the run (a reading at exactly
 *   the restart volume is the first of the new segment); a segment with
 *   too few readings of its own borrows the previous segment's law and K as a prior.
 */
import { requireFinite, requireNonNegative, requirePositive } from './errors';
import { waterViscosity } from './fluids';
import { fitConstantFlow, volumeAtDp, volumeAtDpGradient, type ConstantFlowFit } from './fit-constant-flow';
import { studentTQuantile } from './stats';
import type { BlockingLaw } from './blocking';

/** Gauge resolution assumed when the stage or winery names none, bar (a 0.02 bar tick; common practice, no source). */
export const GAUGE_RESOLUTION_BAR_DEFAULT = 0.02;
/** Smallest fitted ΔP rise, as a fraction of ΔP0, that counts as fouling (common practice, no source). */
export const MIN_DP_RISE_FRACTION = 0.05;
/** A forecast volume beyond this multiple of the litres seen is "beyond the readings" (common practice, no source). */
export const BEYOND_READINGS_FACTOR = 3;
/** Message of the RangeError thrown when ΔP is not rising on a stage. */
export const DP_NOT_RISING_MESSAGE =
  'ΔP is not rising on these readings, so no litres-left forecast can be made: check for a bypass or a faulty gauge.';

/** Forecast of litres and time left before terminal ΔP. Volumes in L, times in h; every figure finite. */
export type RunForecast = {
  /** law with the largest Akaike weight (the one the forecast mostly comes from) */
  law: BlockingLaw;
  /** terminal ΔP used, bar */
  terminalDpBar: number;
  /** litres filtered so far in this run, L */
  currentVolumeL: number;
  /** forecast litres since the start of the run when ΔP reaches terminal, L */
  volumeAtTerminalL: number;
  /** standard error of volumeAtTerminalL (delta method, unconditional over the laws), L */
  volumeSeL: number;
  /** litres left before terminal ΔP (0 when already reached), L */
  volumeLeftL: number;
  /** lower end of the ≈95 % band on litres left (−t·SE, not below 0), L */
  low: number;
  /** upper end of the ≈95 % band on litres left (+t·SE), L; capped (and beyondReadings set) if not representable */
  high: number;
  /** clock time left at the current flow, hours (decimal) */
  hoursLeft: number;
  /** time left at the current flow for the band's low and high ends, hours */
  hoursLeftLow: number;
  hoursLeftHigh: number;
  /** hoursLeft split into whole hours and whole minutes (rounded down) */
  timeLeft: { hours: number; minutes: number };
  /** true when the forecast volume at terminal is at or below the current volume */
  reachedTerminal: boolean;
  /** true when the forecast reaches past BEYOND_READINGS_FACTOR × the litres seen: never show it as a bare number */
  beyondReadings: boolean;
  /** degrees of freedom of the band (readings − 2) */
  dof: number;
  /** Student t quantile used for the band, t(0.975; dof) */
  tValue: number;
  /** Akaike weight of each law that counted as fouling (sum 1) */
  weights: Partial<Record<BlockingLaw, number>>;
  /** 'readings': fitted on this segment; 'previous-segment': the previous segment's K used as a prior */
  basis: 'readings' | 'previous-segment';
  /** run volume at which the current segment (since the last regeneration or change) started, L */
  segmentStartL: number;
  /** litres seen in the segment's readings (largest volume since its start), L */
  volumeSeenL: number;
  /** forecast clock time of terminal ΔP (ms since the epoch), when nowMs was given */
  endMs?: number;
  endMsLow?: number;
  endMsHigh?: number;
};

/** The alarm decision for a run: does the forecast cover what is left to bottle? */
export type RunAlarm = {
  /** 'alarm': central forecast falls short; 'watch': only the low end falls short; 'ok' otherwise */
  level: 'ok' | 'watch' | 'alarm';
  /** true when level is 'alarm' */
  alarm: boolean;
  /** litres short on the central forecast (0 when it covers the lot), L */
  shortfallL: number;
  /** forecast litres left minus litres still to bottle (negative when short), L */
  marginL: number;
};

const MS_PER_HOUR = 3_600_000;

function splitHours(h: number): { hours: number; minutes: number } {
  const totalMin = Math.floor(h * 60 + 1e-9);
  return { hours: Math.floor(totalMin / 60), minutes: totalMin % 60 };
}

/** Largest volume figure the forecast will state, L (10 million hL: anything beyond is absurd for a stage). */
const VOLUME_CAP_L = 1e9;

/** One law's estimate of the volume at terminal ΔP, relative to the segment start. */
type LawEstimate = { law: BlockingLaw; weight: number; vRelL: number; variance: number };

function deltaVariance(fit: Pick<ConstantFlowFit, 'law' | 'dp0Bar' | 'kPerL' | 'covariance'>, terminalDpBar: number): number {
  const [gA, gK] = volumeAtDpGradient(fit, terminalDpBar);
  const c = fit.covariance;
  const v = gA * gA * c.dp0Dp0 + 2 * gA * gK * c.dp0K + gK * gK * c.kK;
  return Number.isFinite(v) && v >= 0 ? v : Infinity;
}

/** Akaike weights exp(−Δ/2)/Σ from the fits' AIC (Burnham & Anderson 2002, eq. 2.14). */
function akaikeWeights(fits: ConstantFlowFit[]): number[] {
  // AICc = AIC + 2k(k+1)/(n−k−1) adds the same term to every law here (same n, k = 3 with σ²),
  // so the AICc differences, and the weights, equal the AIC ones.
  const best = Math.min(...fits.map((f) => f.aic));
  const raw = fits.map((f) => (Number.isFinite(f.aic) ? Math.exp(-(f.aic - best) / 2) : 0));
  const sum = raw.reduce((x, y) => x + y, 0);
  return sum > 0 ? raw.map((w) => w / sum) : fits.map(() => 1 / fits.length);
}

function assemble(p: {
  estimates: LawEstimate[];
  dof: number;
  segmentStartL: number;
  volumeSeenL: number;
  currentVolumeL: number;
  terminalDpBar: number;
  flowLh: number;
  nowMs?: number;
  basis: RunForecast['basis'];
}): RunForecast {
  const est = p.estimates;
  const mean = est.reduce((acc, e) => acc + e.weight * e.vRelL, 0);
  // unconditional standard error, Burnham & Anderson (2002) eq. 4.9
  let se = est.reduce((acc, e) => acc + e.weight * Math.sqrt(e.variance + (e.vRelL - mean) ** 2), 0);
  const tValue = p.dof >= 1 ? studentTQuantile(0.975, p.dof) : Infinity;
  const top = est.reduce((x, y) => (y.weight > x.weight ? y : x));
  const cur = p.currentVolumeL;
  let vT = p.segmentStartL + mean;
  let beyond = !(mean <= BEYOND_READINGS_FACTOR * p.volumeSeenL);
  if (!Number.isFinite(se)) {
    se = VOLUME_CAP_L;
    beyond = true;
  }
  if (!(vT <= VOLUME_CAP_L)) {
    vT = VOLUME_CAP_L;
    beyond = true;
  }
  const half = Math.min(tValue * se, VOLUME_CAP_L);
  if (!(tValue * se <= VOLUME_CAP_L)) beyond = true;
  const volumeLeftL = Math.max(0, vT - cur);
  const low = Math.max(0, vT - half - cur);
  const high = Math.min(VOLUME_CAP_L, Math.max(0, vT + half - cur));
  const hoursLeft = volumeLeftL / p.flowLh;
  const weights: Partial<Record<BlockingLaw, number>> = {};
  for (const e of est) weights[e.law] = e.weight;
  const out: RunForecast = {
    law: top.law,
    terminalDpBar: p.terminalDpBar,
    currentVolumeL: cur,
    volumeAtTerminalL: vT,
    volumeSeL: Math.min(se, VOLUME_CAP_L),
    volumeLeftL,
    low,
    high,
    hoursLeft,
    hoursLeftLow: low / p.flowLh,
    hoursLeftHigh: high / p.flowLh,
    timeLeft: splitHours(hoursLeft),
    reachedTerminal: vT <= cur,
    beyondReadings: beyond,
    dof: p.dof,
    tValue: Number.isFinite(tValue) ? tValue : 0,
    weights,
    basis: p.basis,
    segmentStartL: p.segmentStartL,
    volumeSeenL: p.volumeSeenL,
  };
  if (p.nowMs !== undefined) {
    out.endMs = p.nowMs + out.hoursLeft * MS_PER_HOUR;
    out.endMsLow = p.nowMs + out.hoursLeftLow * MS_PER_HOUR;
    out.endMsHigh = p.nowMs + out.hoursLeftHigh * MS_PER_HOUR;
  }
  return out;
}

/**
 * Forecasts litres and clock time left before the stage reaches `terminalDpBar`, from one
 * constant-flow blocking-law fit (Hermia 1982), with a ± t(0.975; n − 2)·SE band from the
 * fit's covariance (delta method). Prefer {@link forecastRunFromReadings}, which also
 * checks that ΔP is really rising and weighs the four laws.
 * @param p.fit a valid fit from fitConstantFlow (K > 0)
 * @param p.currentVolumeL litres filtered since the start of the run (≥ 0)
 * @param p.terminalDpBar ΔP at which the stage must be regenerated or changed, bar (> 0)
 * @param p.flowLh current line flow, L/h (> 0)
 * @param p.nowMs optional clock time of the forecast (ms since the epoch) to return end times
 * @throws RangeError for an invalid fit, a fit without fouling (K = 0), or bad inputs
 */
export function forecastRun(p: {
  fit: ConstantFlowFit;
  currentVolumeL: number;
  terminalDpBar: number;
  flowLh: number;
  nowMs?: number;
}): RunForecast {
  const { fit } = p;
  requireNonNegative('current volume (L)', p.currentVolumeL);
  requirePositive('terminal ΔP (bar)', p.terminalDpBar);
  requirePositive('flow (L/h)', p.flowLh);
  if (p.nowMs !== undefined) requireFinite('forecast time (ms)', p.nowMs);
  if (!fit || !fit.valid) {
    const name = fit ? `${fit.law}-blocking ` : '';
    throw new RangeError(`The ${name}fit is not physically valid, so it cannot forecast the run.`);
  }
  if (!(fit.kPerL > 0)) throw new RangeError(DP_NOT_RISING_MESSAGE);
  const vT = volumeAtDp(fit, p.terminalDpBar);
  return assemble({
    estimates: [{ law: fit.law, weight: 1, vRelL: vT, variance: deltaVariance(fit, p.terminalDpBar) }],
    dof: fit.n - 2,
    segmentStartL: 0,
    volumeSeenL: fit.volumeMaxL,
    currentVolumeL: p.currentVolumeL,
    terminalDpBar: p.terminalDpBar,
    flowLh: p.flowLh,
    nowMs: p.nowMs,
    basis: 'readings',
  });
}

/** A reading for the forecast: volume since the start of the run, ΔP, and optionally the flow and temperature it was taken at. */
export type ForecastReading = { volumeL: number; dpBar: number; flowLh?: number | null; tempC?: number | null };

/** The verdict of {@link foulingCheck} on one fit. */
export type FoulingCheck = {
  /** true when the fit counts as fouling: K significant and the rise beyond the resolution and 5 % of ΔP0 */
  fouling: boolean;
  /** K > t(0.975; n − 2)·SE(K) */
  kSignificant: boolean;
  /** fitted ΔP rise across the readings' volumes, bar */
  riseBar: number;
  /** plain words */
  reason: string;
};

/** Fitted ΔP at volume V for a law (Hermia 1982, constant-flux forms), bar. */
export function fittedDpBar(fit: Pick<ConstantFlowFit, 'law' | 'dp0Bar' | 'kPerL'>, volumeL: number): number {
  const a = fit.dp0Bar;
  const kv = fit.kPerL * volumeL;
  switch (fit.law) {
    case 'complete':
      return kv < 1 ? a / (1 - kv) : Infinity;
    case 'standard':
      return kv < 1 ? a / (1 - kv) ** 2 : Infinity;
    case 'intermediate':
      return a * Math.exp(kv);
    case 'cake':
      return a * (1 + kv);
  }
}

/**
 * Does a fit show fouling, or only round-off and gauge noise? Fouling when K is
 * significant (K > t(0.975; n − 2)·SE(K), a one-parameter t-test on the least-squares
 * constant) and the fitted ΔP rise across the readings exceeds both the gauge resolution
 * and 5 % of ΔP0 (common practice, no source).
 * @param fit a fit from fitConstantFlow
 * @param opts.resolutionBar gauge resolution, bar (default 0.02)
 * @param opts.volumeMinL smallest volume among the readings (default 0), L
 */
export function foulingCheck(fit: ConstantFlowFit, opts: { resolutionBar?: number; volumeMinL?: number } = {}): FoulingCheck {
  const resolution = opts.resolutionBar ?? GAUGE_RESOLUTION_BAR_DEFAULT;
  requireNonNegative('gauge resolution (bar)', resolution);
  if (!fit.valid || !(fit.kPerL > 0)) return { fouling: false, kSignificant: false, riseBar: 0, reason: DP_NOT_RISING_MESSAGE };
  const seK = Math.sqrt(fit.covariance.kK);
  const dof = fit.n - 2;
  const kSignificant = dof >= 1 && Number.isFinite(seK) && fit.kPerL > studentTQuantile(0.975, dof) * seK;
  const rise = fittedDpBar(fit, fit.volumeMaxL) - fittedDpBar(fit, opts.volumeMinL ?? 0);
  const riseBar = Number.isFinite(rise) ? rise : 0;
  const enough = riseBar > resolution && riseBar > MIN_DP_RISE_FRACTION * fit.dp0Bar;
  return { fouling: kSignificant && enough, kSignificant, riseBar, reason: kSignificant && enough ? 'ΔP is rising.' : DP_NOT_RISING_MESSAGE };
}

/**
 * Is a stage's ΔP flat although litres are going through it (a bypass, an open drain or a
 * stuck gauge)? Flat when at least `minReadings` readings span a volume rise and the
 * least-squares straight-line ΔP rise across them does not exceed the gauge resolution
 * (common practice, no source).
 * @param points readings { volumeL, dpBar }, any order
 * @param opts.resolutionBar gauge resolution, bar (default 0.02); opts.minReadings (default 5)
 * @returns { flat, reason } with the reason in plain words
 */
export function detectFlatDp(
  points: { volumeL: number; dpBar: number }[],
  opts: { resolutionBar?: number; minReadings?: number } = {},
): { flat: boolean; reason: string } {
  const resolution = opts.resolutionBar ?? GAUGE_RESOLUTION_BAR_DEFAULT;
  const minReadings = opts.minReadings ?? 5;
  requireNonNegative('gauge resolution (bar)', resolution);
  requirePositive('minimum readings', minReadings);
  const ok = points.filter((q) => Number.isFinite(q.volumeL) && Number.isFinite(q.dpBar));
  if (ok.length < minReadings) {
    return { flat: false, reason: `Too few readings to judge (${String(ok.length)} of ${String(minReadings)}).` };
  }
  const n = ok.length;
  const mx = ok.reduce((s, q) => s + q.volumeL, 0) / n;
  const my = ok.reduce((s, q) => s + q.dpBar, 0) / n;
  let sxx = 0;
  let sxy = 0;
  let vMin = Infinity;
  let vMax = -Infinity;
  for (const q of ok) {
    sxx += (q.volumeL - mx) ** 2;
    sxy += (q.volumeL - mx) * (q.dpBar - my);
    vMin = Math.min(vMin, q.volumeL);
    vMax = Math.max(vMax, q.volumeL);
  }
  if (!(vMax > vMin) || !(sxx > 0)) return { flat: false, reason: 'The litres have not risen between the readings.' };
  const rise = (sxy / sxx) * (vMax - vMin);
  if (rise > resolution) return { flat: false, reason: 'ΔP is rising.' };
  return { flat: true, reason: 'ΔP not rising: possible bypass or gauge fault.' };
}

type SegmentFit = { fits: ConstantFlowFit[]; eligible: ConstantFlowFit[]; n: number };

function fitSegment(points: { volumeL: number; dpBar: number }[], resolutionBar: number): SegmentFit | null {
  if (points.length < 3) return null;
  const vMin = Math.min(...points.map((q) => q.volumeL));
  if (new Set(points.map((q) => q.volumeL)).size < 3) return null;
  const fits = fitConstantFlow(points);
  const eligible = fits.filter((f) => foulingCheck(f, { resolutionBar, volumeMinL: vMin }).fouling);
  return { fits, eligible, n: points.length };
}

/**
 * Fits the run's readings and forecasts the litres and time left before terminal ΔP,
 * saying what it knows: only a significant, measurable ΔP rise counts as fouling; the
 * four laws are averaged by Akaike weight; the band uses Student's t for n − 2 degrees of
 * freedom; a forecast far past the readings is flagged `beyondReadings`. Readings with a
 * flow and temperature are brought to the current flow and temperature (Darcy: ΔP ∝ μ·Q).
 * @param p.points readings { volumeL (L since the run's start), dpBar (bar), flowLh?, tempC? }
 * @param p.terminalDpBar terminal ΔP, bar; p.flowLh current flow, L/h; p.tempC current temperature, °C
 * @param p.currentVolumeL litres so far (default: the largest reading volume)
 * @param p.resolutionBar gauge resolution of the stage, bar (default 0.02)
 * @param p.restartsAtL run volumes at which the stage was regenerated or changed, L
 * @param p.nowMs optional clock for end times
 * @returns the forecast and the fits it was made from
 * @throws RangeError when ΔP is not rising (message: check for a bypass or the gauge), or for bad inputs
 */
export function forecastRunFromReadings(p: {
  points: ForecastReading[];
  terminalDpBar: number;
  flowLh: number;
  tempC?: number;
  currentVolumeL?: number;
  nowMs?: number;
  resolutionBar?: number;
  restartsAtL?: number[];
}): { forecast: RunForecast; fits: ConstantFlowFit[] } {
  if (!Array.isArray(p.points)) throw new RangeError('Readings must be a list of { volumeL, dpBar } points.');
  requirePositive('terminal ΔP (bar)', p.terminalDpBar);
  requirePositive('flow (L/h)', p.flowLh);
  const resolution = p.resolutionBar ?? GAUGE_RESOLUTION_BAR_DEFAULT;
  requireNonNegative('gauge resolution (bar)', resolution);
  p.points.forEach((q, i) => {
    requireNonNegative(`volume of reading ${String(i + 1)} (L)`, q.volumeL);
    requirePositive(`ΔP of reading ${String(i + 1)} (bar)`, q.dpBar);
    if (q.flowLh !== undefined && q.flowLh !== null) requirePositive(`flow of reading ${String(i + 1)} (L/h)`, q.flowLh);
    if (q.tempC !== undefined && q.tempC !== null) requireFinite(`temperature of reading ${String(i + 1)} (°C)`, q.tempC);
  });
  const maxV = p.points.reduce((m, q) => Math.max(m, q.volumeL), 0);
  const current = p.currentVolumeL ?? maxV;
  requireNonNegative('current volume (L)', current);

  // Darcy: ΔP = μ·R·Q/A, so a reading at (Q_i, T_i) reads ΔP_i·(μ_now·Q_now)/(μ_i·Q_i) at today's flow
  const byVolume = [...p.points].sort((x, y) => x.volumeL - y.volumeL);
  const tempNow = p.tempC ?? [...byVolume].reverse().find((q) => q.tempC !== undefined && q.tempC !== null)?.tempC ?? null;
  const muNow = tempNow !== null ? waterViscosity(tempNow) : null;
  const normalised = byVolume.map((q) => {
    let f = 1;
    if (q.flowLh !== undefined && q.flowLh !== null) f *= p.flowLh / q.flowLh;
    if (muNow !== null && q.tempC !== undefined && q.tempC !== null) f *= muNow / waterViscosity(q.tempC);
    return { volumeL: q.volumeL, dpBar: q.dpBar * f };
  });

  const restarts = [...new Set((p.restartsAtL ?? []).filter((r) => Number.isFinite(r) && r > 0 && r <= current))].sort((x, y) => x - y);
  const start = restarts.length > 0 ? restarts[restarts.length - 1] : 0;
  const prevStart = restarts.length > 1 ? restarts[restarts.length - 2] : 0;
  const segment = normalised.filter((q) => q.volumeL >= start).map((q) => ({ volumeL: q.volumeL - start, dpBar: q.dpBar }));
  const previous =
    restarts.length > 0
      ? normalised.filter((q) => q.volumeL >= prevStart && q.volumeL < start).map((q) => ({ volumeL: q.volumeL - prevStart, dpBar: q.dpBar }))
      : [];

  const own = fitSegment(segment, resolution);
  const common = { currentVolumeL: current, terminalDpBar: p.terminalDpBar, flowLh: p.flowLh, nowMs: p.nowMs, segmentStartL: start };
  if (own && own.eligible.length > 0) {
    const w = akaikeWeights(own.eligible);
    const forecast = assemble({
      ...common,
      estimates: own.eligible.map((f, i) => ({
        law: f.law,
        weight: w[i],
        vRelL: volumeAtDp(f, p.terminalDpBar),
        variance: deltaVariance(f, p.terminalDpBar),
      })),
      dof: own.n - 2,
      volumeSeenL: Math.max(...segment.map((q) => q.volumeL)),
      basis: 'readings',
    });
    return { forecast, fits: own.fits };
  }

  const prior = previous.length > 0 ? fitSegment(previous, resolution) : null;
  if (prior && prior.eligible.length > 0) {
    // the previous segment's law and K, with ΔP0 re-estimated from this segment's readings
    const w = akaikeWeights(prior.eligible);
    const estimates = prior.eligible.map((f, i) => {
      let dp0 = f.dp0Bar;
      if (segment.length > 0) {
        const ratios = segment.map((q) => q.dpBar / fittedDpBar({ ...f, dp0Bar: 1 }, q.volumeL)).filter((r) => Number.isFinite(r) && r > 0);
        if (ratios.length > 0) dp0 = ratios.reduce((x, y) => x + y, 0) / ratios.length;
      }
      const g = { ...f, dp0Bar: dp0 };
      return { law: f.law, weight: w[i], vRelL: volumeAtDp(g, p.terminalDpBar), variance: deltaVariance(g, p.terminalDpBar) };
    });
    const forecast = assemble({
      ...common,
      estimates,
      dof: prior.n - 2,
      volumeSeenL: Math.max(...previous.map((q) => q.volumeL)),
      basis: 'previous-segment',
    });
    return { forecast, fits: prior.fits };
  }
  const since = start > 0 ? ' since the last regeneration or change' : '';
  if (segment.length < 3) {
    throw new RangeError(`At least 3 readings are needed to fit a fouling law (got ${String(segment.length)}${since}).`);
  }
  if (new Set(segment.map((q) => q.volumeL)).size < 3) {
    throw new RangeError(`Readings at 3 or more different volumes are needed${since}: two volumes fit any law exactly and say nothing about the band.`);
  }
  throw new RangeError(DP_NOT_RISING_MESSAGE);
}

/**
 * Alarm decision for a run: alarm when the forecast litres left before terminal ΔP are
 * fewer than the litres still to bottle; 'watch' when only the band's low end is short
 * (common practice, no source).
 * @param p.forecast forecast from forecastRun
 * @param p.volumeToBottleL litres of the lot still to filter (≥ 0)
 */
export function runAlarm(p: { forecast: RunForecast; volumeToBottleL: number }): RunAlarm {
  requireNonNegative('volume still to bottle (L)', p.volumeToBottleL);
  const f = p.forecast;
  const marginL = f.volumeLeftL - p.volumeToBottleL;
  const alarm = marginL < 0;
  const level: RunAlarm['level'] = alarm ? 'alarm' : f.low < p.volumeToBottleL ? 'watch' : 'ok';
  return { level, alarm, shortfallL: Math.max(0, -marginL), marginL };
}
