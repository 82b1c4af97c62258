/**
 * Forecast of a run at constant flow: litres and clock time left before a stage
 * reaches its terminal ΔP, from a blocking-law fit of the run's readings (Hermia,
 * Trans. IChemE 60 (1982) 183–187, constant-flux forms; see fit-constant-flow.ts).
 *
 * Uncertainty band: the fit's parameter covariance σ²(JᵀJ)⁻¹ is propagated to the
 * volume at terminal ΔP by the delta method (first-order error propagation), and the
 * band is that volume ± 2 standard errors (about 95 % when the readings' scatter is
 * small and the law stays the same). It does not cover a change of fouling mechanism
 * later in the run, a change of flow or temperature, or a wine change.
 */
import { requireFinite, requireNonNegative, requirePositive } from './errors';
import { fitConstantFlow, volumeAtDp, volumeAtDpGradient, type ConstantFlowFit } from './fit-constant-flow';
import type { BlockingLaw } from './blocking';

/** Forecast of litres and time left before terminal ΔP. Volumes in L, times in h. */
export type RunForecast = {
  /** law the forecast comes from */
  law: BlockingLaw;
  /** terminal ΔP used, bar */
  terminalDpBar: number;
  /** litres filtered so far in this run, L */
  currentVolumeL: number;
  /** fitted litres since the start of the run when ΔP reaches terminal, L */
  volumeAtTerminalL: number;
  /** standard error of volumeAtTerminalL (delta method), L */
  volumeSeL: number;
  /** litres left before terminal ΔP (0 when already reached), L */
  volumeLeftL: number;
  /** lower end of the ≈95 % band on litres left (−2 standard errors, not below 0), L */
  low: number;
  /** upper end of the ≈95 % band on litres left (+2 standard errors), L */
  high: number;
  /** clock time left at the current flow, hours (decimal) */
  hoursLeft: number;
  /** time left at the current flow for the band's low and high ends, hours */
  hoursLeftLow: number;
  hoursLeftHigh: number;
  /** hoursLeft split into whole hours and whole minutes (rounded down) */
  timeLeft: { hours: number; minutes: number };
  /** true when the fitted ΔP at the current volume is already at or above terminal */
  reachedTerminal: boolean;
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

/**
 * Forecasts litres and clock time left before the stage reaches `terminalDpBar`, from a
 * constant-flow blocking-law fit (Hermia 1982), with a ±2-standard-error band from the
 * fit's covariance (delta method).
 * @param p.fit a valid fit from fitConstantFlow (usually the first, best-AIC one)
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
  const vT = volumeAtDp(fit, p.terminalDpBar);
  const [gA, gK] = volumeAtDpGradient(fit, p.terminalDpBar);
  const c = fit.covariance;
  const variance = gA * gA * c.dp0Dp0 + 2 * gA * gK * c.dp0K + gK * gK * c.kK;
  // a non-finite covariance (degenerate readings) gives the widest sensible band: ±100 %
  const se = Number.isFinite(variance) && variance >= 0 ? Math.sqrt(variance) : vT / 2;
  const cur = p.currentVolumeL;
  const volumeLeftL = Math.max(0, vT - cur);
  const low = Math.max(0, vT - 2 * se - cur);
  const high = Math.max(0, vT + 2 * se - cur);
  const hoursLeft = volumeLeftL / p.flowLh;
  const out: RunForecast = {
    law: fit.law,
    terminalDpBar: p.terminalDpBar,
    currentVolumeL: cur,
    volumeAtTerminalL: vT,
    volumeSeL: se,
    volumeLeftL,
    low,
    high,
    hoursLeft,
    hoursLeftLow: low / p.flowLh,
    hoursLeftHigh: high / p.flowLh,
    timeLeft: splitHours(hoursLeft),
    reachedTerminal: vT <= cur,
  };
  if (p.nowMs !== undefined) {
    out.endMs = p.nowMs + out.hoursLeft * MS_PER_HOUR;
    out.endMsLow = p.nowMs + out.hoursLeftLow * MS_PER_HOUR;
    out.endMsHigh = p.nowMs + out.hoursLeftHigh * MS_PER_HOUR;
  }
  return out;
}

/**
 * Fits the run's readings (fitConstantFlow) and forecasts from the best physically
 * valid law. The current volume defaults to the largest volume among the readings.
 * @param p.points readings { volumeL (L since start), dpBar (bar) }
 * @param p.terminalDpBar terminal ΔP, bar; p.flowLh current flow, L/h; p.nowMs optional clock
 * @returns the forecast and the fits it was chosen from
 * @throws RangeError when no law gives a physically valid fit (e.g. ΔP not rising)
 */
export function forecastRunFromReadings(p: {
  points: { volumeL: number; dpBar: number }[];
  terminalDpBar: number;
  flowLh: number;
  currentVolumeL?: number;
  nowMs?: number;
}): { forecast: RunForecast; fits: ConstantFlowFit[] } {
  const fits = fitConstantFlow(p.points);
  const best = fits.find((f) => f.valid && f.kPerL > 0);
  if (!best) {
    throw new RangeError('ΔP is not rising on these readings, so no fouling forecast can be made yet (check for a bypass or a faulty gauge).');
  }
  const forecast = forecastRun({
    fit: best,
    currentVolumeL: p.currentVolumeL ?? best.volumeMaxL,
    terminalDpBar: p.terminalDpBar,
    flowLh: p.flowLh,
    nowMs: p.nowMs,
  });
  return { forecast, fits };
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
