/**
 * Filter-train sizing for a bottling line: element equivalents, filter area, flux per
 * 10-inch module, clean pressure drop of the wine (Darcy's law), capacity to terminal ΔP,
 * regenerations or changes the lot needs, run time, hold-up, cost per hL and the pump
 * pressure the train needs — with typed warnings where a limit is broken.
 *
 * Model: every stage of the train carries the whole line flow in series. The clean-water
 * specification of a 10-inch module gives the medium's resistance R_m (Darcy 1856:
 * R_m = ΔP·A/(μ_water·Q)); the wine's clean ΔP is ΔP = μ_wine·R_m·Q/A (same source). The
 * line losses, static head and filler inlet pressure are all placed after the last stage,
 * which gives the highest (safest) inlet pressure for every stage.
 *
 * Pure and allocation-light: the plan screen recomputes it on every keystroke.
 */
import { requireFinite, requireNonNegative, requirePositive, requireRange } from './errors';
import { ethanolMassFraction, ethanolWaterDensity, wineViscosity } from './fluids';
import type { SanitationKind } from './day-timeline';
import { cleanDpBar, lineLossBar, mediumResistance } from './flow';
import type { PastRunsCapacity } from './past-runs-capacity';

// ---------------------------------------------------------------------------------------
// Constants
// ---------------------------------------------------------------------------------------

/**
 * Default flow margin over the filler's consumption, % (10 %). Common practice, no
 * source. Planners who also want to cover filler-bowl refill surges and the ΔP rise over
 * the day often take 20–50 % instead (common practice, no source).
 */
export const DEFAULT_FLOW_MARGIN_PCT = 10;

/**
 * Largest clean ΔP, as a fraction of the terminal ΔP, at which a stage still has room to
 * foul (1/3). Common practice, no source.
 */
export const CLEAN_DP_MAX_FRACTION_OF_TERMINAL = 1 / 3;

/** Temperature of the clean-water flow specification of a cartridge when none is given, °C (20 °C, the usual data-sheet basis). */
export const DEFAULT_WATER_SPEC_TEMP_C = 20;

/**
 * Default absolute roughness of a smooth food-grade hose or drawn stainless tube, mm
 * (0.0015 mm = 0.000005 ft, "drawn tubing" on Moody's chart, Moody, Trans. ASME 66 (1944)
 * 671–684; value from memory).
 */
export const DEFAULT_HOSE_ROUGHNESS_MM = 0.0015;

/**
 * Apparent rise of wine density per g/L of dissolved sugar, (kg/m³)/(g/L): 1 − v̄·ρ with a
 * partial specific volume of sucrose/hexoses v̄ ≈ 0.62 cm³/g (from memory). Used only for
 * hose losses, where it is a small correction.
 */
export const SUGAR_DENSITY_RISE_PER_G_L = 0.38;

/**
 * Wine temperatures, °C, inside which the sizing's viscosity model is backed by measured
 * wine viscosities (2–50 °C: Neto et al., J. Sci. Food Agric. 95 (2015) 1421–1427 measured
 * 2–26 °C; Havlíček, Severa & Křivánek, Acta Univ. Agric. Silvic. Mendel. Brun. 55(1)
 * (2007) 59–64 measured 20–50 °C). Outside it (but inside 0–60 °C, the range of the
 * Bingham & Jackson 1918 ethanol–water table) the sizing still runs and warns; outside
 * 0–60 °C it throws.
 */
export const SIZING_VALID_TEMP_C = { minC: 2, maxC: 50 } as const;

/**
 * Usual sanitation temperatures before a bottling day, °C: hot water at 82 °C (180 °F) for
 * at least 20–30 min measured at the point furthest from the heater (US wine microbiology
 * practice and the UC Davis bottling workshop, see shared reference "trade practice" §5.2),
 * and saturated steam at 121 °C (≈1 bar gauge) for in-place sterilisation (typical maker
 * data, from memory; §5.3).
 */
export const SANITATION_TEMP_C = { 'hot-water': 82, steam: 121 } as const;

/**
 * Default safety factor on capacity from a Vmax disc test (1.5; "SF commonly 1.5–2", shared
 * reference "engineering" §7.5, from memory).
 */
export const DEFAULT_VMAX_SAFETY_FACTOR = 1.5;

/**
 * Litres per m² a membrane takes to its terminal ΔP at constant flow, from the lot's Vmax
 * disc test: v_T = v_max·(1 − √(ΔP0/ΔP_terminal)) / SF (standard blocking at constant flux,
 * shared reference "engineering" §7.6; Hermia 1982; Zydney & Ho 2002). ΔP0 is the stage's own
 * clean ΔP with this wine at its temperature. A clean ΔP at or above the terminal ΔP leaves
 * no capacity (0). v_max holds for the test's ΔP, temperature and wine lot only.
 *
 * @param p.vmaxLPerM2 v_max of the disc test, L/m² (> 0)
 * @param p.cleanDpBar the stage's clean ΔP, bar (> 0)
 * @param p.terminalDpBar the stage's terminal ΔP, bar (> 0)
 * @param p.safetyFactor SF ≥ 1 (default {@link DEFAULT_VMAX_SAFETY_FACTOR})
 * @returns L/m² to terminal ΔP
 */
export function capacityFromVmax(p: { vmaxLPerM2: number; cleanDpBar: number; terminalDpBar: number; safetyFactor?: number }): number {
  requirePositive('Vmax per area (L/m²)', p.vmaxLPerM2);
  requirePositive('clean ΔP (bar)', p.cleanDpBar);
  requirePositive('terminal ΔP (bar)', p.terminalDpBar);
  const sf = p.safetyFactor ?? DEFAULT_VMAX_SAFETY_FACTOR;
  requireFinite('safety factor', sf);
  if (sf < 1) throw new RangeError(`Safety factor must be at least 1 (got ${String(sf)}).`);
  if (p.cleanDpBar >= p.terminalDpBar) return 0;
  return (p.vmaxLPerM2 * (1 - Math.sqrt(p.cleanDpBar / p.terminalDpBar))) / sf;
}

/** Default largest number of parallel housings per stage that {@link suggestTrain} tries (4). A planning limit, not a physical one. */
export const DEFAULT_MAX_HOUSINGS_PER_STAGE = 4;

const HOUSING_LENGTHS_IN: readonly number[] = [10, 20, 30, 40];

// ---------------------------------------------------------------------------------------
// Input types
// ---------------------------------------------------------------------------------------

/** The wine being filtered. */
export interface SizingWine {
  /** Wine temperature at the filters, °C (0–60; warnings outside 2–50). */
  tempC: number;
  /** Alcoholic strength, % vol at 20 °C. */
  ethanolPctVol: number;
  /** Residual sugar, g/L (default 0). */
  sugarGPerL?: number;
  /** Dry-extract viscosity factor (default 1.00). */
  extractFactor?: number;
  /** v_max of the lot's latest Vmax disc test, L/m²; gives membrane stages their capacity when none is typed. */
  vmaxLPerM2?: number;
  /** Safety factor on that capacity (default {@link DEFAULT_VMAX_SAFETY_FACTOR}). */
  vmaxSafetyFactor?: number;
}

/** The bottling line, which sets the flow the train must carry. */
export interface SizingLine {
  /** Filler speed, bottles per hour. */
  bottlesPerHour: number;
  /** Fill volume per bottle, mL. */
  bottleMl: number;
  /** Flow margin over the filler's consumption, % (default {@link DEFAULT_FLOW_MARGIN_PCT}). */
  marginPct?: number;
}

/** One hose or pipe run between the tank, the filters and the filler. */
export interface SizingHose {
  /** Inner diameter, mm. */
  diameterMm: number;
  /** Length, m. */
  lengthM: number;
  /** Absolute roughness, mm (default {@link DEFAULT_HOSE_ROUGHNESS_MM}). */
  roughnessMm?: number;
  /** Sum of fitting loss coefficients K on this run (default 0). */
  sumK?: number;
}

/** Pressure needed outside the filters. */
export interface SizingLineLosses {
  /** Hoses and pipes; friction by Darcy–Weisbach with the Colebrook (1939) factor. */
  hoses: SizingHose[];
  /** Static head from pump to filler inlet, bar (may be negative when the filler is lower; default 0). */
  staticHeadBar?: number;
  /** Pressure the filler wants at its inlet, bar gauge (default 0). */
  fillerInletBar?: number;
}

/** A cartridge type, per 10-inch module. */
export interface SizingCartridgeType {
  kind: 'prefilter' | 'membrane';
  /** Micron rating, µm. */
  ratingUm: number;
  /** Filter area per 10-inch module, m². */
  areaM2Per10in: number;
  /** Clean-water flow per 10-inch module at {@link waterDpBar}, L/h. */
  waterFlowLhPer10in: number;
  /** Clean-water ΔP at {@link waterFlowLhPer10in}, bar. */
  waterDpBar: number;
  /** Water temperature of that specification, °C (default {@link DEFAULT_WATER_SPEC_TEMP_C}). */
  waterSpecTempC?: number;
  /** Maker's maximum forward ΔP, bar. */
  maxDpForwardBar: number;
  /** Maker's maximum operating temperature, °C (optional). */
  maxTempC?: number;
  /** ΔP at which the stage is changed or regenerated, bar. */
  terminalDpBar: number;
  /** Design wine flow per 10-inch module, L/h. */
  designFluxLhPer10in: number;
  /** Expected litres per m² to terminal ΔP for this wine, typed by the person (overrides every other source); unknown when absent. */
  capacityLPerM2?: number;
  /**
   * Capacity learned from the winery's closed runs of similar wines ({@link capacityFromPastRuns});
   * used when nothing is typed and no Vmax test gives one.
   */
  pastRuns?: PastRunsCapacity;
  /**
   * The type's nominal capacity to terminal ΔP, L/m²: the maker's or the winery's usual figure for an
   * average wine. The last source, used when nothing is typed, no Vmax test applies and no past runs match.
   */
  nominalCapacityLPerM2?: number;
  /** Whether a blocked set can be regenerated during the lot (default false: it is changed). */
  regenerable?: boolean;
  /** Most regenerations one set may take within a lot before it is changed (default unlimited when regenerable). */
  maxRegenerationsPerLot?: number;
  /** Price per 10-inch module (a 30-inch cartridge costs 3×). */
  pricePer10in?: number;
  /**
   * Loads one set of a regenerable type serves over its whole service life (its rated
   * regeneration cycles + 1, or the winery's own history). When given, the cost of a
   * regenerable set is spread over its life instead of charged whole to one lot.
   */
  serviceLifeLoads?: number;
  /** Currency code of the price, e.g. "EUR". */
  currency?: string;
}

/**
 * 10-inch element equivalents of cartridges built from 10-inch modules: count × length / 10
 * (a 30-inch cartridge is three modules). Trade convention for stating filter capacity.
 * @param p.cartridges number of cartridges (rounds × housings); p.lengthIn 10, 20, 30 or 40
 */
export function elementEquivalents(p: { cartridges: number; lengthIn: number }): number {
  if (!Number.isInteger(p.cartridges) || p.cartridges < 0) throw new RangeError('The number of cartridges must be a whole number, 0 or more.');
  if (![10, 20, 30, 40].includes(p.lengthIn)) throw new RangeError('Cartridge length must be 10, 20, 30 or 40 inches.');
  return p.cartridges * (p.lengthIn / 10);
}

/** A housing. */
export interface SizingHousing {
  /** Identity of the physical housing; {@link suggestTrain} never gives one housing to two stages. */
  id?: string;
  /** Cartridge positions. */
  rounds: number;
  /** Cartridge length, inches. */
  lengthIn: 10 | 20 | 30 | 40;
  /** Maximum working pressure, bar gauge. */
  maxPressureBar: number;
  /** Maximum temperature, °C (optional). */
  maxTempC?: number;
  /** Wine held up in the housing, L. */
  holdUpL: number;
}

/** One stage of the train (stages are listed from the tank towards the filler). */
export interface SizingStage {
  name?: string;
  /** Identity of the physical housing, so one housing placed in two stages is caught (optional). */
  housingId?: string;
  cartridgeType: SizingCartridgeType;
  housing: SizingHousing;
  /** Identical housings in parallel (default 1). */
  housingCount?: number;
}

/** Input of {@link sizeTrain}. */
export interface TrainSizingInput {
  wine: SizingWine;
  line: SizingLine;
  /** Volume of the lot, L. */
  batchL: number;
  lineLosses?: SizingLineLosses;
  stages: SizingStage[];
  /** Sanitation before the wine; its temperature is checked against every cartridge's and housing's rating. */
  sanitation?: { kind: SanitationKind; tempC?: number };
}

// ---------------------------------------------------------------------------------------
// Output types
// ---------------------------------------------------------------------------------------

/** Codes of the warnings {@link sizeTrain} raises. */
export type SizingWarningCode =
  | 'flux-above-design'
  | 'clean-dp-above-third-of-terminal'
  | 'inlet-pressure-above-housing-rating'
  | 'stage-dp-above-cartridge-max-dp'
  | 'stage-infeasible'
  | 'housing-in-two-stages'
  | 'membrane-without-prefilter'
  | 'temp-above-cartridge-max'
  | 'temp-above-housing-max'
  | 'temp-outside-valid-range'
  | 'sanitation-above-cartridge-max'
  | 'sanitation-above-housing-max'
  | 'mixed-currencies';

/** A broken limit, with a plain message. `stageIndex` is absent for train-level warnings. */
export interface SizingWarning {
  code: SizingWarningCode;
  message: string;
  stageIndex?: number;
}

/** What a stage needs beyond its first set of cartridges during the lot. */
export type InterventionKind = 'none' | 'regeneration' | 'change' | 'regeneration-and-change';

/** Sizing of one stage. */
export interface StageSizing {
  index: number;
  name: string;
  kind: 'prefilter' | 'membrane';
  ratingUm: number;
  /** housingCount × rounds × lengthIn/10. */
  elementEquivalents: number;
  /** Physical cartridges installed (housingCount × rounds). */
  cartridgeCount: number;
  housingCount: number;
  /** Installed filter area, m². */
  areaM2: number;
  /** Wine flow per 10-inch module, L/h. */
  fluxLhPer10in: number;
  /** Wine flux, L m⁻² h⁻¹. */
  fluxLmh: number;
  designFluxLhPer10in: number;
  /** Medium resistance from the clean-water specification, 1/m. */
  resistancePerM: number;
  /** ΔP of the clean stage with this wine at its temperature, bar. */
  cleanDpBar: number;
  terminalDpBar: number;
  /** cleanDpBar / terminalDpBar. */
  cleanDpFractionOfTerminal: number;
  /** Gauge pressure at the stage inlet with every stage clean, bar. */
  inletPressureCleanBar: number;
  /** Gauge pressure at the stage inlet with every stage at its terminal ΔP (worst case), bar. */
  inletPressureEndOfRunBar: number;
  /** Litres to terminal ΔP for one set (capacityLPerM2 × areaM2), or null when unknown. */
  capacityL: number | null;
  /** Capacity per m² used, L/m², or null when unknown. */
  capacityLPerM2: number | null;
  /** Where the capacity came from: typed on the stage, the lot's Vmax disc test, the winery's past runs of similar wines, the type's nominal figure, or unknown. */
  capacitySource: 'stage' | 'vmax' | 'past-runs' | 'nominal' | null;
  /** The past runs the capacity came from (runs, range), when capacitySource is 'past-runs'. */
  capacityPastRuns?: PastRunsCapacity;
  /** Hours of run to terminal ΔP for one set, or null when unknown. */
  hoursToTerminal: number | null;
  /** Fresh or regenerated loads the lot needs, ceil(batch/capacity), or null when capacity is unknown. */
  loadsNeeded: number | null;
  /** loadsNeeded − 1: regenerations plus changes beyond the first set. */
  interventions: number | null;
  regenerations: number | null;
  changes: number | null;
  /** Which kind of intervention the lot needs. */
  interventionKind: InterventionKind | null;
  /** Sets of cartridges used (1 + changes); 1 when capacity is unknown. */
  setsUsed: number;
  /** Hours the lot takes at the line flow. */
  runHours: number;
  /** Wine held up in this stage's housings, L. */
  holdUpL: number;
  /** Price of one set (elementEquivalents × pricePer10in), or null without a price. */
  costPerSet: number | null;
  /** costPerSet × setsUsed, or null without a price. */
  costTotal: number | null;
  /** costTotal per hL of the lot, or null without a price. */
  costPerHl: number | null;
  /** True when capacity is unknown, so the cost counts one set or load only (a lower bound). */
  costIsLowerBound: boolean;
  /**
   * How the cost was charged: `single-use` sets charged whole to the lot; `service-life` a
   * regenerable set's price spread over the loads it serves in its life; `whole-set` a
   * regenerable set charged whole because its service life is unknown (an upper bound).
   */
  costBasis: 'single-use' | 'service-life' | 'whole-set' | null;
  /** True when the clean ΔP already reaches the terminal ΔP: the stage cannot filter this wine (capacity 0). */
  infeasible: boolean;
  currency: string | null;
  warnings: SizingWarning[];
}

/** Totals of the train. */
export interface TrainTotals {
  /** Sum of the stages' clean ΔP, bar. */
  cleanDpBar: number;
  /** Sum over the stages of max(clean, terminal) ΔP, bar. */
  endOfRunDpBar: number;
  /** Friction and fitting losses of the hoses, bar. */
  lineLossBar: number;
  staticHeadBar: number;
  fillerInletBar: number;
  /** Pump pressure with the train clean: Σ clean ΔP + line losses + static head + filler inlet, bar. */
  pumpPressureCleanBar: number;
  /** Pump pressure at the end of the run (worst case): Σ max(clean, terminal) ΔP + line losses + static head + filler inlet, bar. */
  pumpPressureEndOfRunBar: number;
  /** batchL / flowLh, h. */
  runHours: number;
  holdUpL: number;
  /** Sum of the priced stages' costs, or null when none is priced or currencies differ. */
  costTotal: number | null;
  costPerHl: number | null;
  /** True when any priced stage's cost is a lower bound, or a stage has no price: the total is "at least". */
  costIsLowerBound: boolean;
  currency: string | null;
  /** Indices of stages without a price. */
  unpricedStages: number[];
  /** Stage with the fewest litres to terminal ΔP, or null when no capacity is known. */
  limitingStageIndex: number | null;
  limitingCapacityL: number | null;
}

/** Result of {@link sizeTrain}. */
export interface TrainSizingResult {
  /** Required flow, L/h = bottles/h × bottle volume × (1 + margin). */
  flowLh: number;
  batchL: number;
  /** Wine viscosity at its temperature, Pa·s. */
  wineViscosityPaS: number;
  /** Wine density at its temperature, kg/m³ (only computed when hoses are given; else null). */
  wineDensityKgM3: number | null;
  stages: StageSizing[];
  totals: TrainTotals;
  /** Every warning: train-level ones first, then each stage's in order. */
  warnings: SizingWarning[];
}

// ---------------------------------------------------------------------------------------
// Validation
// ---------------------------------------------------------------------------------------

function requirePositiveInteger(name: string, v: number): void {
  requirePositive(name, v);
  if (!Number.isInteger(v)) throw new RangeError(`${name[0].toUpperCase()}${name.slice(1)} must be a whole number (got ${String(v)}).`);
}

function validateCartridge(c: SizingCartridgeType, s: string): void {
  if (c.kind !== 'prefilter' && c.kind !== 'membrane') {
    throw new RangeError(`${s}: cartridge kind must be "prefilter" or "membrane" (got ${String(c.kind)}).`);
  }
  requirePositive(`${s} cartridge rating (µm)`, c.ratingUm);
  requirePositive(`${s} area per 10-inch module (m²)`, c.areaM2Per10in);
  requirePositive(`${s} clean-water flow per 10-inch module (L/h)`, c.waterFlowLhPer10in);
  requirePositive(`${s} clean-water ΔP (bar)`, c.waterDpBar);
  requirePositive(`${s} maximum forward ΔP (bar)`, c.maxDpForwardBar);
  requirePositive(`${s} terminal ΔP (bar)`, c.terminalDpBar);
  requirePositive(`${s} design flow per 10-inch module (L/h)`, c.designFluxLhPer10in);
  if (c.waterSpecTempC !== undefined) requireRange(`${s} clean-water specification temperature`, c.waterSpecTempC, 0, 100, '°C');
  if (c.maxTempC !== undefined) requireFinite(`${s} cartridge maximum temperature (°C)`, c.maxTempC);
  if (c.capacityLPerM2 !== undefined) requirePositive(`${s} capacity to terminal ΔP (L/m²)`, c.capacityLPerM2);
  if (c.pastRuns !== undefined) requirePositive(`${s} capacity from past runs (L/m²)`, c.pastRuns.lPerM2);
  if (c.nominalCapacityLPerM2 !== undefined) requirePositive(`${s} nominal capacity of the type (L/m²)`, c.nominalCapacityLPerM2);
  if (c.maxRegenerationsPerLot !== undefined) {
    requireNonNegative(`${s} maximum regenerations per lot`, c.maxRegenerationsPerLot);
    if (!Number.isInteger(c.maxRegenerationsPerLot)) {
      throw new RangeError(`${s}: maximum regenerations per lot must be a whole number (got ${String(c.maxRegenerationsPerLot)}).`);
    }
  }
  if (c.pricePer10in !== undefined) requireNonNegative(`${s} price per 10-inch module`, c.pricePer10in);
  if (c.serviceLifeLoads !== undefined) requirePositive(`${s} service life (loads)`, c.serviceLifeLoads);
}

function validateHousing(h: SizingHousing, s: string): void {
  requirePositiveInteger(`${s} housing rounds`, h.rounds);
  if (!HOUSING_LENGTHS_IN.includes(h.lengthIn)) {
    throw new RangeError(`${s}: housing cartridge length must be 10, 20, 30 or 40 inches (got ${String(h.lengthIn)}).`);
  }
  requirePositive(`${s} housing maximum pressure (bar)`, h.maxPressureBar);
  if (h.maxTempC !== undefined) requireFinite(`${s} housing maximum temperature (°C)`, h.maxTempC);
  requireNonNegative(`${s} housing hold-up (L)`, h.holdUpL);
}

function stageLabel(stage: SizingStage, i: number): string {
  return stage.name !== undefined && stage.name !== '' ? stage.name : `Stage ${String(i + 1)}`;
}

function fmt(v: number, digits: number): string {
  return v.toFixed(digits);
}

// ---------------------------------------------------------------------------------------
// Shared pieces
// ---------------------------------------------------------------------------------------

/**
 * Flow the train must carry, L/h: bottles/h × bottle volume (L) × (1 + margin/100).
 * Sizing rule of filler consumption plus a margin (common practice, no source).
 *
 * @param line filler speed (bottles/h), fill volume (mL) and margin (%, default 10)
 * @returns required flow, L/h
 */
export function requiredFlowLh(line: SizingLine): number {
  requirePositive('bottles per hour', line.bottlesPerHour);
  requirePositive('bottle volume (mL)', line.bottleMl);
  const margin = line.marginPct ?? DEFAULT_FLOW_MARGIN_PCT;
  requireRange('flow margin', margin, 0, 500, '%');
  return line.bottlesPerHour * (line.bottleMl / 1000) * (1 + margin / 100);
}

// One-entry memos of the wine properties. The plan screen re-sizes on every keystroke and
// the wine rarely changes between two keystrokes; the functions memoised are pure, so the
// memo changes no result, only the time (the viscosity model costs most of a sizing).
const muMemo = { t: NaN, e: NaN, s: NaN, x: NaN, value: NaN };
const rhoMemo = { t: NaN, e: NaN, s: NaN, value: NaN };

/** Wine viscosity, Pa·s (see wineViscosity), through the one-entry memo. */
function wineViscosityMemo(wine: SizingWine): number {
  const s = wine.sugarGPerL ?? 0;
  const x = wine.extractFactor ?? 1;
  if (muMemo.t === wine.tempC && muMemo.e === wine.ethanolPctVol && muMemo.s === s && muMemo.x === x) return muMemo.value;
  const value = wineViscosity({ tempC: wine.tempC, ethanolPctVol: wine.ethanolPctVol, sugarGPerL: s, extractFactor: x });
  muMemo.t = wine.tempC;
  muMemo.e = wine.ethanolPctVol;
  muMemo.s = s;
  muMemo.x = x;
  muMemo.value = value;
  return value;
}

/**
 * Wine density at its temperature for hose losses, kg/m³: the ethanol–water density of
 * OIML R 22 at the wine's strength plus {@link SUGAR_DENSITY_RISE_PER_G_L} per g/L of sugar.
 * Valid −20 to 40 °C (the range of the OIML R 22 tables).
 */
function wineDensity(wine: SizingWine): number {
  const s = wine.sugarGPerL ?? 0;
  if (rhoMemo.t === wine.tempC && rhoMemo.e === wine.ethanolPctVol && rhoMemo.s === s) return rhoMemo.value;
  const value = ethanolWaterDensity(ethanolMassFraction(wine.ethanolPctVol), wine.tempC) + SUGAR_DENSITY_RISE_PER_G_L * s;
  rhoMemo.t = wine.tempC;
  rhoMemo.e = wine.ethanolPctVol;
  rhoMemo.s = s;
  rhoMemo.value = value;
  return value;
}

interface TrainContext {
  flowLh: number;
  viscosityPaS: number;
  densityKgM3: number | null;
  lineLossBar: number;
  staticHeadBar: number;
  fillerInletBar: number;
}

function buildContext(input: TrainSizingInput): TrainContext {
  const { wine, lineLosses } = input;
  requireFinite('wine temperature', wine.tempC);
  const flowLh = requiredFlowLh(input.line);
  requirePositive('lot volume (L)', input.batchL);
  if (!Array.isArray(input.stages) || input.stages.length === 0) {
    throw new RangeError('A train needs at least one stage.');
  }
  const viscosityPaS = wineViscosityMemo(wine);
  let densityKgM3: number | null = null;
  let loss = 0;
  let staticHeadBar = 0;
  let fillerInletBar = 0;
  if (lineLosses !== undefined) {
    staticHeadBar = lineLosses.staticHeadBar ?? 0;
    fillerInletBar = lineLosses.fillerInletBar ?? 0;
    requireFinite('static head (bar)', staticHeadBar);
    requireNonNegative('filler inlet pressure (bar)', fillerInletBar);
    const hoses = lineLosses.hoses;
    if (hoses.length > 0) {
      densityKgM3 = wineDensity(wine);
      for (let h = 0; h < hoses.length; h++) {
        const hose = hoses[h];
        loss += lineLossBar({
          flowLh,
          diameterMm: hose.diameterMm,
          lengthM: hose.lengthM,
          roughnessMm: hose.roughnessMm ?? DEFAULT_HOSE_ROUGHNESS_MM,
          densityKgM3,
          viscosityPaS,
          sumK: hose.sumK ?? 0,
        });
      }
    }
  }
  return { flowLh, viscosityPaS, densityKgM3, lineLossBar: loss, staticHeadBar, fillerInletBar };
}

/** Resistance of a cartridge type's medium from its clean-water specification, 1/m (Darcy 1856). */
function cartridgeResistance(c: SizingCartridgeType): number {
  return mediumResistance({
    waterFlowLh: c.waterFlowLhPer10in,
    dpBar: c.waterDpBar,
    areaM2: c.areaM2Per10in,
    tempC: c.waterSpecTempC ?? DEFAULT_WATER_SPEC_TEMP_C,
  });
}

// ---------------------------------------------------------------------------------------
// sizeTrain
// ---------------------------------------------------------------------------------------

/**
 * Sizes a filter train for one lot on one bottling line.
 *
 * Per stage: element equivalents = housingCount × rounds × lengthIn/10; area = equivalents ×
 * area per module; flux per module = flow/equivalents; clean ΔP from Darcy's law (Darcy
 * 1856) with the medium resistance taken from the clean-water specification and the wine's
 * viscosity (IAPWS R12-08 water × Bingham & Jackson 1918 ethanol ratio × sugar and extract
 * factors); capacity to terminal ΔP = capacity per m² × area; loads = ceil(batch/capacity);
 * each set serves 1 + maxRegenerationsPerLot loads when regenerable (regeneration assumed to
 * restore the full capacity — a planning estimate), otherwise one load; cost = equivalents ×
 * price per module × sets used.
 *
 * Pump pressure: clean = Σ clean ΔP + line losses + static head + filler inlet; end of run
 * (worst case) = Σ max(clean, terminal ΔP) + the same. Hose losses use Darcy–Weisbach with
 * the Colebrook (1939) friction factor at the required flow.
 *
 * Warnings (typed codes with plain messages): flux above design; clean ΔP above a third of
 * terminal ΔP (common practice, no source); end-of-run inlet pressure above the housing's
 * rating or above the cartridge's maximum forward ΔP (the most ΔP the cartridge can see if
 * everything after it drops to atmospheric); a membrane with no prefilter before it; wine
 * temperature above the cartridge's or housing's maximum; wine temperature outside
 * {@link SIZING_VALID_TEMP_C}; prices in more than one currency.
 *
 * @throws RangeError for unusable inputs (non-positive flows, areas, volumes; wine outside
 *   0–60 °C or outside the viscosity model; hoses with wine above 40 °C).
 */
export function sizeTrain(input: TrainSizingInput): TrainSizingResult {
  const ctx = buildContext(input);
  return sizeWithContext(input, ctx);
}

/**
 * Sizes a train whose shared figures (flow, viscosity, line losses) are already known: each
 * stage on its own ({@link sizeStage}), then the inlet pressures from the filler back
 * ({@link applyInletPressures}), then the train's cost ({@link trainCost}) and totals.
 */
function sizeWithContext(input: TrainSizingInput, ctx: TrainContext): TrainSizingResult {
  const { stages, batchL, wine } = input;
  const { flowLh, viscosityPaS } = ctx;
  const n = stages.length;
  const runHours = batchL / flowLh;
  const hl = batchL / 100;
  const warnings: SizingWarning[] = [];

  const outsideModel = temperatureRangeWarning(wine.tempC);
  if (outsideModel !== null) warnings.push(outsideModel);

  const out: StageSizing[] = new Array<StageSizing>(n);
  let sumClean = 0;
  let sumEnd = 0;
  let holdUpTotal = 0;
  let limitingIndex: number | null = null;
  let limitingCap = Infinity;
  for (let i = 0; i < n; i++) {
    const s = sizeStage(input, ctx, i, runHours, hl);
    out[i] = s;
    sumClean += s.cleanDpBar;
    sumEnd += s.cleanDpBar > s.terminalDpBar ? s.cleanDpBar : s.terminalDpBar;
    holdUpTotal += s.holdUpL;
    if (s.infeasible) {
      // No room to foul: the set reaches its terminal ΔP clean, so it holds no wine at all.
      limitingCap = 0;
      limitingIndex = i;
    } else if (s.capacityL !== null && s.capacityL < limitingCap) {
      limitingCap = s.capacityL;
      limitingIndex = i;
    }
  }

  const base = ctx.lineLossBar + ctx.staticHeadBar + ctx.fillerInletBar;
  applyInletPressures(stages, out, base);

  const cost = trainCost(out);
  if (cost.mixed) {
    warnings.push({
      code: 'mixed-currencies',
      message: 'Cartridge prices are in more than one currency, so the train cost is not totalled.',
    });
  }

  for (let i = 0; i < n; i++) {
    const sw = out[i].warnings;
    for (let k = 0; k < sw.length; k++) warnings.push(sw[k]);
  }

  return {
    flowLh,
    batchL,
    wineViscosityPaS: viscosityPaS,
    wineDensityKgM3: ctx.densityKgM3,
    stages: out,
    totals: {
      cleanDpBar: sumClean,
      endOfRunDpBar: sumEnd,
      lineLossBar: ctx.lineLossBar,
      staticHeadBar: ctx.staticHeadBar,
      fillerInletBar: ctx.fillerInletBar,
      pumpPressureCleanBar: sumClean + base,
      pumpPressureEndOfRunBar: sumEnd + base,
      runHours,
      holdUpL: holdUpTotal,
      costTotal: cost.costTotal,
      costPerHl: cost.costTotal === null ? null : cost.costTotal / hl,
      costIsLowerBound: cost.costTotal !== null && (cost.lowerBound || cost.unpricedStages.length > 0),
      currency: cost.mixed ? null : cost.currency,
      unpricedStages: cost.unpricedStages,
      limitingStageIndex: limitingIndex,
      limitingCapacityL: limitingIndex === null ? null : limitingCap,
    },
    warnings,
  };
}

/** The train-level warning for a wine outside the range the viscosity model is checked in, or null. */
function temperatureRangeWarning(tempC: number): SizingWarning | null {
  if (!(tempC < SIZING_VALID_TEMP_C.minC || tempC > SIZING_VALID_TEMP_C.maxC)) return null;
  return {
    code: 'temp-outside-valid-range',
    message: `Wine at ${fmt(tempC, 1)} °C is outside ${String(SIZING_VALID_TEMP_C.minC)}–${String(SIZING_VALID_TEMP_C.maxC)} °C, the range where the viscosity model is checked against measured wines; treat the pressure drops as rough.`,
  };
}

/**
 * One stage: its area and flux, clean ΔP (Darcy), capacity and interventions, cost and
 * warnings. Inlet pressures are filled in afterwards by {@link applyInletPressures}.
 */
function sizeStage(input: TrainSizingInput, ctx: TrainContext, i: number, runHours: number, hl: number): StageSizing {
  const stage = input.stages[i];
  const label = stageLabel(stage, i);
  const c = stage.cartridgeType;
  const h = stage.housing;
  const { flowLh, viscosityPaS } = ctx;
  validateCartridge(c, label);
  validateHousing(h, label);
  const housingCount = stage.housingCount ?? 1;
  requirePositiveInteger(`${label} housing count`, housingCount);

  const cartridgeCount = housingCount * h.rounds;
  const eq = elementEquivalents({ cartridges: cartridgeCount, lengthIn: h.lengthIn });
  const areaM2 = eq * c.areaM2Per10in;
  const fluxLhPer10in = flowLh / eq;
  const resistancePerM = cartridgeResistance(c);
  const dp = cleanDpBar({ flowLh, areaM2, resistancePerM, viscosityPaS });
  const cap = stageCapacity(c, input.wine, dp, areaM2, flowLh, input.batchL);
  const cost = stageCost(c, eq, cap.loads, cap.setsUsed, hl);

  return {
    index: i,
    name: label,
    kind: c.kind,
    ratingUm: c.ratingUm,
    elementEquivalents: eq,
    cartridgeCount,
    housingCount,
    areaM2,
    fluxLhPer10in,
    fluxLmh: flowLh / areaM2,
    designFluxLhPer10in: c.designFluxLhPer10in,
    resistancePerM,
    cleanDpBar: dp,
    terminalDpBar: c.terminalDpBar,
    cleanDpFractionOfTerminal: dp / c.terminalDpBar,
    inletPressureCleanBar: 0,
    inletPressureEndOfRunBar: 0,
    capacityL: cap.capacityL,
    capacityLPerM2: cap.infeasible ? 0 : cap.capacityLPerM2,
    capacitySource: cap.capacitySource,
    ...(cap.capacitySource === 'past-runs' ? { capacityPastRuns: c.pastRuns } : {}),
    hoursToTerminal: cap.hoursToTerminal,
    loadsNeeded: cap.loads,
    interventions: cap.interventions,
    regenerations: cap.regenerations,
    changes: cap.changes,
    interventionKind: cap.kind,
    setsUsed: cap.setsUsed,
    runHours,
    holdUpL: housingCount * h.holdUpL,
    costPerSet: cost.costPerSet,
    costTotal: cost.costTotal,
    costPerHl: cost.costPerHl,
    costIsLowerBound: c.pricePer10in !== undefined && cap.capacityL === null,
    costBasis: cost.costBasis,
    infeasible: cap.infeasible,
    currency: c.pricePer10in !== undefined ? (c.currency ?? null) : null,
    warnings: stageWarnings(input, i, label, fluxLhPer10in, dp, cap.infeasible),
  };
}

interface StageCapacity {
  /** Clean ΔP already at terminal ΔP: the stage holds no wine. */
  infeasible: boolean;
  capacityLPerM2: number | null;
  capacitySource: StageSizing['capacitySource'];
  capacityL: number | null;
  hoursToTerminal: number | null;
  loads: number | null;
  interventions: number | null;
  regenerations: number | null;
  changes: number | null;
  kind: InterventionKind | null;
  setsUsed: number;
}

/**
 * Litres one set holds to terminal ΔP (the stage's capacity per m², for a membrane the lot's
 * Vmax disc test, else the winery's past runs of similar wines, else the type's nominal figure), the loads the lot needs and how they are served: a regenerable set
 * serves 1 + maxRegenerationsPerLot loads, any other set one.
 */
function stageCapacity(c: SizingCartridgeType, wine: SizingWine, dp: number, areaM2: number, flowLh: number, batchL: number): StageCapacity {
  const infeasible = dp >= c.terminalDpBar;
  let capPerM2: number | null = c.capacityLPerM2 ?? null;
  let capacitySource: StageSizing['capacitySource'] = capPerM2 === null ? null : 'stage';
  if (capPerM2 === null && c.kind === 'membrane' && wine.vmaxLPerM2 !== undefined && !infeasible) {
    capPerM2 = capacityFromVmax({ vmaxLPerM2: wine.vmaxLPerM2, cleanDpBar: dp, terminalDpBar: c.terminalDpBar, safetyFactor: wine.vmaxSafetyFactor });
    capacitySource = 'vmax';
  }
  if (capPerM2 === null && c.pastRuns !== undefined && !infeasible) {
    capPerM2 = c.pastRuns.lPerM2;
    capacitySource = 'past-runs';
  }
  if (capPerM2 === null && c.nominalCapacityLPerM2 !== undefined && !infeasible) {
    capPerM2 = c.nominalCapacityLPerM2;
    capacitySource = 'nominal';
  }
  const unknown = { loads: null, interventions: null, regenerations: null, changes: null, kind: null, setsUsed: 1 };
  if (infeasible) return { infeasible, capacityLPerM2: capPerM2, capacitySource, capacityL: 0, hoursToTerminal: 0, ...unknown };
  if (capPerM2 === null) return { infeasible, capacityLPerM2: null, capacitySource, capacityL: null, hoursToTerminal: null, ...unknown };

  const capacityL = capPerM2 * areaM2;
  // Guard against 10000/10000.000000001 style rounding pushing ceil up by one.
  const loads = Math.max(1, Math.ceil(batchL / capacityL - 1e-9));
  const interventions = loads - 1;
  const perSet = c.regenerable === true ? 1 + (c.maxRegenerationsPerLot ?? Infinity) : 1;
  const setsUsed = perSet === Infinity ? 1 : Math.ceil(loads / perSet);
  const changes = setsUsed - 1;
  const regenerations = loads - setsUsed;
  const kind: InterventionKind =
    interventions === 0 ? 'none' : changes === 0 ? 'regeneration' : regenerations === 0 ? 'change' : 'regeneration-and-change';
  return { infeasible, capacityLPerM2: capPerM2, capacitySource, capacityL, hoursToTerminal: capacityL / flowLh, loads, interventions, regenerations, changes, kind, setsUsed };
}

/**
 * What the stage's cartridges cost the lot: single-use sets whole; a regenerable set's price
 * spread over the loads of its service life when known, else the whole set. Nulls without a price.
 */
function stageCost(
  c: SizingCartridgeType,
  eq: number,
  loads: number | null,
  setsUsed: number,
  hl: number,
): Pick<StageSizing, 'costPerSet' | 'costTotal' | 'costPerHl' | 'costBasis'> {
  if (c.pricePer10in === undefined) return { costPerSet: null, costTotal: null, costPerHl: null, costBasis: null };
  const costPerSet = eq * c.pricePer10in;
  let costBasis: StageSizing['costBasis'];
  let costTotal: number;
  if (c.regenerable === true && c.serviceLifeLoads !== undefined) {
    // A regenerable set serves serviceLifeLoads loads in its life; this lot uses `loads` of them.
    costBasis = 'service-life';
    costTotal = (costPerSet * (loads ?? 1)) / c.serviceLifeLoads;
  } else {
    costBasis = c.regenerable === true ? 'whole-set' : 'single-use';
    costTotal = costPerSet * setsUsed;
  }
  return { costPerSet, costTotal, costPerHl: costTotal / hl, costBasis };
}

/**
 * The stage's own warnings, in a fixed order: flux above design, clean ΔP above a third of
 * terminal, infeasible, housing used twice, membrane first in the train, wine and sanitation
 * temperatures against the ratings. Pressure warnings come later, from the inlet pressures.
 */
function stageWarnings(input: TrainSizingInput, i: number, label: string, fluxLhPer10in: number, dp: number, infeasible: boolean): SizingWarning[] {
  const { stages } = input;
  const stage = stages[i];
  const c = stage.cartridgeType;
  const h = stage.housing;
  const tempC = input.wine.tempC;
  const sw: SizingWarning[] = [];
  if (fluxLhPer10in > c.designFluxLhPer10in) {
    sw.push({
      code: 'flux-above-design',
      stageIndex: i,
      message: `${label}: ${fmt(fluxLhPer10in, 0)} L/h per 10-inch module is above the design ${fmt(c.designFluxLhPer10in, 0)} L/h; add element equivalents.`,
    });
  }
  if (dp > c.terminalDpBar * CLEAN_DP_MAX_FRACTION_OF_TERMINAL) {
    sw.push({
      code: 'clean-dp-above-third-of-terminal',
      stageIndex: i,
      message: `${label}: clean ΔP ${fmt(dp, 3)} bar is above a third of the terminal ${fmt(c.terminalDpBar, 2)} bar, leaving little room to foul (common practice).`,
    });
  }
  if (infeasible) {
    sw.push({
      code: 'stage-infeasible',
      stageIndex: i,
      message: `${label}: clean ΔP ${fmt(dp, 2)} bar already reaches the terminal ${fmt(c.terminalDpBar, 2)} bar with this wine at ${fmt(tempC, 1)} °C, so the stage cannot filter it; warm the wine, add housings or choose a more open cartridge.`,
    });
  }
  if (stage.housingId !== undefined) {
    for (let j = 0; j < i; j++) {
      if (stages[j].housingId === stage.housingId) {
        sw.push({
          code: 'housing-in-two-stages',
          stageIndex: i,
          message: `${label}: uses the same housing as ${stageLabel(stages[j], j)}; one housing can hold only one stage.`,
        });
        break;
      }
    }
  }
  // Any stage before a membrane protects it (a 0.65 µm membrane before a 0.45 µm one counts).
  if (c.kind === 'membrane' && i === 0) {
    sw.push({
      code: 'membrane-without-prefilter',
      stageIndex: i,
      message: `${label}: membrane stage with no prefilter before it; it will blind early.`,
    });
  }
  if (c.maxTempC !== undefined && tempC > c.maxTempC) {
    sw.push({
      code: 'temp-above-cartridge-max',
      stageIndex: i,
      message: `${label}: wine at ${fmt(tempC, 1)} °C is above the cartridge's ${fmt(c.maxTempC, 1)} °C maximum.`,
    });
  }
  if (input.sanitation !== undefined) {
    const sanC = input.sanitation.tempC ?? SANITATION_TEMP_C[input.sanitation.kind];
    const what = input.sanitation.kind === 'steam' ? 'Steam' : 'Hot water';
    if (c.maxTempC !== undefined && sanC > c.maxTempC) {
      sw.push({
        code: 'sanitation-above-cartridge-max',
        stageIndex: i,
        message: `${label}: ${what.toLowerCase()} sanitation at ${fmt(sanC, 0)} °C is above the cartridges' ${fmt(c.maxTempC, 0)} °C rating; sanitise another way or choose cartridges rated for it.`,
      });
    }
    if (h.maxTempC !== undefined && sanC > h.maxTempC) {
      sw.push({
        code: 'sanitation-above-housing-max',
        stageIndex: i,
        message: `${label}: ${what.toLowerCase()} sanitation at ${fmt(sanC, 0)} °C is above the housing's ${fmt(h.maxTempC, 0)} °C rating.`,
      });
    }
  }
  if (h.maxTempC !== undefined && tempC > h.maxTempC) {
    sw.push({
      code: 'temp-above-housing-max',
      stageIndex: i,
      message: `${label}: wine at ${fmt(tempC, 1)} °C is above the housing's ${fmt(h.maxTempC, 1)} °C maximum.`,
    });
  }
  return sw;
}

/**
 * Inlet pressures, from the filler back to the tank: each stage's inlet carries `base` (line
 * losses, static head, filler inlet) plus its own ΔP and every later stage's, clean and at the
 * end of the run; warns where that breaks the housing's rating or the cartridge's forward ΔP.
 */
function applyInletPressures(stages: SizingStage[], out: StageSizing[], base: number): void {
  let downClean = base;
  let downEnd = base;
  for (let i = out.length - 1; i >= 0; i--) {
    const s = out[i];
    const c = stages[i].cartridgeType;
    const h = stages[i].housing;
    downClean += s.cleanDpBar;
    downEnd += s.cleanDpBar > s.terminalDpBar ? s.cleanDpBar : s.terminalDpBar;
    s.inletPressureCleanBar = downClean;
    s.inletPressureEndOfRunBar = downEnd;
    if (downEnd > h.maxPressureBar) {
      s.warnings.push({
        code: 'inlet-pressure-above-housing-rating',
        stageIndex: i,
        message: `${s.name}: inlet pressure reaches ${fmt(downEnd, 2)} bar at the end of the run, above the housing's ${fmt(h.maxPressureBar, 2)} bar rating.`,
      });
    }
    // The forward-ΔP rating limits the ΔP across the cartridge itself, not the line pressure.
    const ownEndDp = s.cleanDpBar > s.terminalDpBar ? s.cleanDpBar : s.terminalDpBar;
    if (ownEndDp > c.maxDpForwardBar) {
      s.warnings.push({
        code: 'stage-dp-above-cartridge-max-dp',
        stageIndex: i,
        message: `${s.name}: ΔP across the cartridges reaches ${fmt(ownEndDp, 2)} bar at the end of the run, above their ${fmt(c.maxDpForwardBar, 2)} bar maximum forward ΔP; lower the terminal ΔP.`,
      });
    }
  }
}

/** The train's cost: the priced stages summed when they share one currency, with what is missing. */
function trainCost(out: StageSizing[]): { costTotal: number | null; currency: string | null; mixed: boolean; lowerBound: boolean; unpricedStages: number[] } {
  let currency: string | null = null;
  let mixed = false;
  let costSum = 0;
  let priced = 0;
  let lowerBound = false;
  const unpricedStages: number[] = [];
  for (let i = 0; i < out.length; i++) {
    const s = out[i];
    if (s.costTotal === null) {
      unpricedStages.push(i);
      continue;
    }
    if (s.costIsLowerBound) lowerBound = true;
    priced++;
    costSum += s.costTotal;
    if (s.currency !== null) {
      if (currency === null) currency = s.currency;
      else if (currency !== s.currency) mixed = true;
    }
  }
  return { costTotal: priced === 0 || mixed ? null : costSum, currency, mixed, lowerBound, unpricedStages };
}

// ---------------------------------------------------------------------------------------
// suggestTrain
// ---------------------------------------------------------------------------------------

/** Options of {@link suggestTrain}. */
export interface SuggestTrainOptions {
  /** Housings to choose from, for every stage that has no catalogue of its own. */
  housingOptions?: SizingHousing[];
  /** Per-stage catalogues (index = stage index); an empty or missing entry falls back to {@link housingOptions}. */
  housingCatalog?: (SizingHousing[] | undefined)[];
  /** Most identical housings in parallel per stage (default {@link DEFAULT_MAX_HOUSINGS_PER_STAGE}). */
  maxHousingsPerStage?: number;
}

/** Result of {@link suggestTrain}: the chosen train and its sizing, or why none fits. */
export type SuggestTrainResult =
  | { ok: true; input: TrainSizingInput; result: TrainSizingResult }
  | { ok: false; reason: string; stageIndex?: number };

interface Candidate {
  housing: SizingHousing;
  count: number;
  eq: number;
  holdUpL: number;
  order: number;
}

/**
 * Finds, for every stage, the smallest housing set that meets every limit: flux per module
 * at or below design, clean ΔP at or below a third of terminal ΔP (common practice, no
 * source), end-of-run inlet pressure within the housing's rating and the cartridge's
 * maximum forward ΔP, and wine temperature within the housing's and cartridge's maxima.
 * "Smallest" means fewest element equivalents, then fewest housings, then least hold-up,
 * then the catalogue's order.
 *
 * The end-of-run inlet pressure of a stage is line losses + static head + filler inlet +
 * the terminal ΔPs of it and every later stage; with clean ΔP held below terminal ΔP it does
 * not depend on the housings chosen, so the stages can be chosen one by one and the result
 * is the exact minimum over the candidates. Same model as {@link sizeTrain}.
 *
 * Limits a housing cannot cure (cartridge maximum temperature or forward ΔP) make the
 * search fail with a reason. Advisory warnings (membrane without prefilter, temperature
 * outside the model's checked range) stay in the returned sizing.
 *
 * @returns `{ ok: true, input, result }` with the chosen housings, or `{ ok: false, reason, stageIndex }`
 */
export function suggestTrain(input: TrainSizingInput, options: SuggestTrainOptions): SuggestTrainResult {
  const ctx = buildContext(input);
  const maxHousings = options.maxHousingsPerStage ?? DEFAULT_MAX_HOUSINGS_PER_STAGE;
  requirePositiveInteger('maximum housings per stage', maxHousings);
  const { stages } = input;
  const n = stages.length;
  const { flowLh, viscosityPaS } = ctx;
  const tempC = input.wine.tempC;

  // End-of-run inlet pressure per stage (independent of the housings once clean ≤ terminal/3).
  const inletEnd = new Array<number>(n);
  let acc = ctx.lineLossBar + ctx.staticHeadBar + ctx.fillerInletBar;
  for (let i = n - 1; i >= 0; i--) {
    const c = stages[i].cartridgeType;
    validateCartridge(c, stageLabel(stages[i], i));
    acc += c.terminalDpBar;
    inletEnd[i] = acc;
  }

  const chosen: SizingStage[] = new Array<SizingStage>(n);
  const taken = new Set<string>();
  for (let i = 0; i < n; i++) {
    const stage = stages[i];
    const label = stageLabel(stage, i);
    const c = stage.cartridgeType;
    if (c.maxTempC !== undefined && tempC > c.maxTempC) {
      return { ok: false, stageIndex: i, reason: `${label}: wine at ${fmt(tempC, 1)} °C is above the cartridge's ${fmt(c.maxTempC, 1)} °C maximum; no housing changes that.` };
    }
    if (c.terminalDpBar > c.maxDpForwardBar) {
      return {
        ok: false,
        stageIndex: i,
        reason: `${label}: the terminal ΔP (${fmt(c.terminalDpBar, 2)} bar) is above the cartridge's ${fmt(c.maxDpForwardBar, 2)} bar maximum forward ΔP; lower the terminal ΔP.`,
      };
    }
    const own = options.housingCatalog?.[i];
    const catalog = own !== undefined && own.length > 0 ? own : (options.housingOptions ?? []);
    if (catalog.length === 0) return { ok: false, stageIndex: i, reason: `${label}: no housings to choose from.` };

    const candidates: Candidate[] = [];
    for (let k = 0; k < catalog.length; k++) {
      const h = catalog[k];
      validateHousing(h, `${label} option ${String(k + 1)}`);
      for (let count = 1; count <= maxHousings; count++) {
        candidates.push({ housing: h, count, eq: elementEquivalents({ cartridges: count * h.rounds, lengthIn: h.lengthIn }), holdUpL: count * h.holdUpL, order: k });
      }
    }
    candidates.sort((a, b) => a.eq - b.eq || a.count - b.count || a.holdUpL - b.holdUpL || a.order - b.order);

    const resistancePerM = cartridgeResistance(c);
    const dpLimit = c.terminalDpBar * CLEAN_DP_MAX_FRACTION_OF_TERMINAL;
    let pick: Candidate | null = null;
    let why = '';
    for (const cand of candidates) {
      const h = cand.housing;
      if (h.id !== undefined && taken.has(h.id)) {
        why = 'every suitable housing already serves an earlier stage';
        continue;
      }
      if (h.maxTempC !== undefined && tempC > h.maxTempC) {
        why = 'too hot for the housings';
        continue;
      }
      if (inletEnd[i] > h.maxPressureBar) {
        why = 'inlet pressure above the housings’ ratings';
        continue;
      }
      if (flowLh / cand.eq > c.designFluxLhPer10in) {
        why = 'flux above design';
        continue;
      }
      const dp = cleanDpBar({ flowLh, areaM2: cand.eq * c.areaM2Per10in, resistancePerM, viscosityPaS });
      if (dp > dpLimit) {
        why = 'clean ΔP above a third of terminal';
        continue;
      }
      pick = cand;
      break;
    }
    if (pick === null) {
      return {
        ok: false,
        stageIndex: i,
        reason: `${label}: no housing set of up to ${String(maxHousings)} housings meets every limit (largest set tried: ${why}).`,
      };
    }
    if (pick.housing.id !== undefined) taken.add(pick.housing.id);
    chosen[i] = { ...stage, housing: pick.housing, housingCount: pick.count, ...(pick.housing.id !== undefined ? { housingId: pick.housing.id } : {}) };
  }

  const chosenInput: TrainSizingInput = { ...input, stages: chosen };
  return { ok: true, input: chosenInput, result: sizeWithContext(chosenInput, ctx) };
}
