import {
  cartridgeLife,
  cloggingIndex,
  cloggingIndexBand,
  discAreaM2FromDiameterMm,
  fitConstantFlow,
  fitConstantPressure,
  forecastRun,
  modifiedCloggingIndex,
  runAlarm,
  sizeTrain,
  vmaxSizing,
} from '../../../shared/engine';
import type { CartridgeLifeInput, FilterabilityInput, FitRunInput, SizeTrainInput } from '../../../shared/schemas/calc';

/** The engine over HTTP: thin adapters from validated bodies to engine calls. */
export const calcService = {
  sizeTrain(input: SizeTrainInput) {
    return sizeTrain(input);
  },

  /** Fits every blocking law to run readings; with a terminal ΔP and a flow, forecasts the time left. */
  fitRun(input: FitRunInput) {
    const fits = fitConstantFlow(input.points);
    const best = fits.find((f) => f.valid && f.kPerL > 0) ?? null;
    let forecast = null;
    let alarm = null;
    if (best && input.terminalDpBar !== undefined && input.flowLh !== undefined) {
      const currentVolumeL = input.currentVolumeL ?? Math.max(...input.points.map((p) => p.volumeL));
      forecast = forecastRun({ fit: best, currentVolumeL, terminalDpBar: input.terminalDpBar, flowLh: input.flowLh, nowMs: input.nowMs });
      if (input.volumeToBottleL !== undefined) alarm = runAlarm({ forecast, volumeToBottleL: input.volumeToBottleL });
    }
    return { best: best?.law ?? null, fits, forecast, alarm };
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
