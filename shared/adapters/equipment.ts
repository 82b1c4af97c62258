// From stored equipment rows (housings, lines, cartridge types) to the engine's figures: the same
// functions serve the server's DTOs and the forms' live preview.
import { cleanDpBar, DEFAULT_FLOW_MARGIN_PCT, DEFAULT_WATER_SPEC_TEMP_C, elementEquivalents, mediumResistance, requiredFlowLh, waterViscosity } from '../engine';

/** Runs an engine calculation; null when the inputs are outside its validity (a half-typed form). */
function attempt<T>(calc: () => T): T | null {
  try {
    return calc();
  } catch (error) {
    if (error instanceof RangeError) return null;
    throw error;
  }
}

/**
 * 10-inch element equivalents of a housing: rounds × lengthIn / 10 (a 30-inch cartridge is
 * three 10-inch modules), the count the train sizing uses. Null for invalid input.
 */
export function housingElementEquivalents(h: { rounds: number; lengthIn: number }): number | null {
  if (!Number.isInteger(h.rounds) || h.rounds < 1) return null;
  return attempt(() => elementEquivalents({ cartridges: h.rounds, lengthIn: h.lengthIn }));
}

/** Filter area of a full housing with one cartridge type, m²: equivalents × area per 10-inch module. */
export function housingAreaM2(elementEquivalents: number, areaM2Per10in: number): number | null {
  if (!(elementEquivalents > 0) || !(areaM2Per10in > 0)) return null;
  return elementEquivalents * areaM2Per10in;
}

export type LineFigures = {
  /** What the filler draws, L/h (bottles/h × bottle volume). */
  fillerFlowLh: number;
  /** Flow the filters must carry with the default margin, L/h. */
  requiredFlowLh: number;
  /** The margin used, %. */
  marginPct: number;
};

/** Flows of a bottling line from the engine's requiredFlowLh (with and without the default margin). */
export function lineFigures(l: { bottlesPerHour: number; bottleMl: number }): LineFigures | null {
  return attempt(() => ({
    fillerFlowLh: requiredFlowLh({ bottlesPerHour: l.bottlesPerHour, bottleMl: l.bottleMl, marginPct: 0 }),
    requiredFlowLh: requiredFlowLh({ bottlesPerHour: l.bottlesPerHour, bottleMl: l.bottleMl }),
    marginPct: DEFAULT_FLOW_MARGIN_PCT,
  }));
}

export type CartridgeTypeFigures = {
  /** Clean-medium resistance from the clean-water spec, 1/m (engine mediumResistance). */
  resistancePerM: number;
  /** Water temperature the spec is taken at, °C. */
  specTempC: number;
  /** Clean-water ΔP of one 10-inch module at the design flow, bar (engine cleanDpBar), or null without a design flow. */
  cleanWaterDpBarAtDesignFlux: number | null;
};

/**
 * Clean-water figures of a cartridge type per 10-inch module: the medium's resistance from
 * the water-flow spec (Darcy) and the clean-water ΔP at the design flow, both at 20 °C.
 */
export function cartridgeTypeFigures(t: {
  waterFlowLhPer10in: number;
  waterDpBar: number;
  areaM2Per10in: number;
  designFluxLhPer10in?: number | null;
}): CartridgeTypeFigures | null {
  const specTempC = DEFAULT_WATER_SPEC_TEMP_C;
  const resistancePerM = attempt(() =>
    mediumResistance({ waterFlowLh: t.waterFlowLhPer10in, dpBar: t.waterDpBar, areaM2: t.areaM2Per10in, tempC: specTempC }),
  );
  if (resistancePerM === null) return null;
  const flux = t.designFluxLhPer10in;
  const cleanWaterDpBarAtDesignFlux =
    flux === null || flux === undefined
      ? null
      : attempt(() => cleanDpBar({ flowLh: flux, areaM2: t.areaM2Per10in, resistancePerM, viscosityPaS: waterViscosity(specTempC) }));
  return { resistancePerM, specTempC, cleanWaterDpBarAtDesignFlux };
}
