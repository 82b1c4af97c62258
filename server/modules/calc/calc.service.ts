import {
  cartridgeLife,
  cloggingIndex,
  cloggingIndexBand,
  discAreaM2FromDiameterMm,
  fitConstantFlow,
  fitConstantPressure,
  foulingCheck,
  forecastRunFromReadings,
  modifiedCloggingIndex,
  runAlarm,
  sizeTrain,
  vmaxSizing,
  DP_NOT_RISING_MESSAGE,
} from '../../../shared/engine';
import type { CartridgeLifeInput, FilterabilityInput, FitRunInput, SizeTrainInput } from '../../../shared/schemas/calc';

/** The engine over HTTP: thin adapters from validated bodies to engine calls. */
export const calcService = {
  sizeTrain(input: SizeTrainInput) {
    return sizeTrain(input);
  },

  /**
   * Fits every blocking law to run readings; with a terminal ΔP and a flow, forecasts the time left.
   * `best` is the best law only when ΔP really rises (significant K, rise beyond the gauge); else
   * null with the reason in `note`.
   */
  fitRun(input: FitRunInput) {
    const fits = fitConstantFlow(input.points);
    const vMin = Math.min(...input.points.map((p) => p.volumeL));
    const best = fits.find((f) => foulingCheck(f, { resolutionBar: input.resolutionBar, volumeMinL: vMin }).fouling) ?? null;
    let forecast = null;
    let alarm = null;
    let note: string | null = best ? null : DP_NOT_RISING_MESSAGE;
    if (input.terminalDpBar !== undefined && input.flowLh !== undefined) {
      try {
        forecast = forecastRunFromReadings({
          points: input.points,
          terminalDpBar: input.terminalDpBar,
          flowLh: input.flowLh,
          tempC: input.tempC,
          currentVolumeL: input.currentVolumeL,
          nowMs: input.nowMs,
          resolutionBar: input.resolutionBar,
          restartsAtL: input.restartsAtL,
        }).forecast;
        if (input.volumeToBottleL !== undefined) alarm = runAlarm({ forecast, volumeToBottleL: input.volumeToBottleL });
      } catch (e) {
        if (!(e instanceof RangeError)) throw e;
        note = e.message;
      }
    }
    return { best: best?.law ?? null, fits, forecast, alarm, note };
  },

  /** Clogging index (and modified index), and the Vmax disc test with optional sizing. */
  filterability(input: FilterabilityInput) {
    let clogging = null;
    if (input.t200s !== undefined && input.t400s !== undefined) {
      const ci = cloggingIndex(input.t200s, input.t400s);
      clogging = {
        cloggingIndex: ci,
        band: cloggingIndexBand(ci),
        modifiedCloggingIndex: input.t600s !== undefined ? modifiedCloggingIndex(input.t200s, input.t400s, input.t600s) : null,
      };
    }
    let disc = null;
    let sizing = null;
    if (input.disc) {
      const fit = fitConstantPressure({ points: input.disc.points, discAreaM2: discAreaM2FromDiameterMm(input.disc.diameterMm) });
      disc = fit;
      if (input.sizing) {
        sizing = vmaxSizing({
          batchL: input.sizing.batchL,
          hours: input.sizing.hours,
          safetyFactor: input.sizing.safetyFactor,
          vmaxLPerM2: fit.vmaxLPerM2,
          j0LPerM2H: fit.j0LPerM2H,
          elementAreaM2: input.sizing.elementAreaM2,
        });
      }
    }
    return { clogging, disc, sizing };
  },

  cartridgeLife(input: CartridgeLifeInput) {
    return cartridgeLife(input.ratings, input.history, input.options ?? {});
  },
};
