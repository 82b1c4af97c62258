import { BEYOND_READINGS_FACTOR, formatDurationWords, MAX_DURATION_HOURS, type RunForecast } from '@shared/engine';

/** Largest litres figure a forecast screen will show, L; anything larger is absurd for one stage. */
export const MAX_SHOWN_LITRES = 1e8;

/** What the stage card says about the litres left, in words and checked figures only. */
export type ForecastView =
  | { kind: 'none'; headline: string }
  | { kind: 'reached'; headline: string; detail: string }
  | { kind: 'beyond'; headline: string; detail: string }
  | { kind: 'figure'; headline: string; band: string };

const showable = (x: number, max: number) => Number.isFinite(x) && x >= 0 && x <= max;

/**
 * Turns a stage's forecast into text. A figure is shown only when every number in it is
 * finite and sensible; a forecast beyond the readings is said in words, never as a bare
 * number; durations read "about 21 min", never like a clock.
 * @param f the forecast, or null
 * @param note the server's reason when there is no forecast
 * @param volume formats litres in the person's units
 */
export function forecastView(f: RunForecast | null, note: string | null, volume: (litres: number) => string): ForecastView {
  if (!f) return { kind: 'none', headline: note ?? 'No forecast yet.' };
  if (f.reachedTerminal) {
    return { kind: 'reached', headline: 'Terminal ΔP reached', detail: 'Regenerate or change this stage’s cartridges.' };
  }
  const figuresOk =
    showable(f.volumeLeftL, MAX_SHOWN_LITRES) &&
    showable(f.low, MAX_SHOWN_LITRES) &&
    showable(f.high, MAX_SHOWN_LITRES) &&
    showable(f.hoursLeft, MAX_DURATION_HOURS);
  if (f.beyondReadings || !figuresOk) {
    const seen = showable(f.volumeSeenL, MAX_SHOWN_LITRES) ? volume(f.volumeSeenL) : 'the litres logged';
    return {
      kind: 'beyond',
      headline: 'Beyond the readings',
      detail: `ΔP is rising, but terminal ΔP lies more than ${String(BEYOND_READINGS_FACTOR)} × past the ${seen} logged${f.segmentStartL > 0 ? ' since the last regeneration or change' : ''}. Log more readings for a figure.`,
    };
  }
  const prior = f.basis === 'previous-segment' ? ' (from the fouling before the last regeneration or change)' : '';
  return {
    kind: 'figure',
    headline: `≈ ${volume(f.volumeLeftL)} left · ${formatDurationWords(f.hoursLeft)}`,
    band: `≈95 % band ${volume(f.low)} – ${volume(f.high)}${prior}`,
  };
}
