/**
 * Unit conversion and display helpers for a user's unit system.
 *
 * The engine stores quantities in trade-metric units (bar, L, L/h, °C, m², L/m²/h, m —
 * see {@link METRIC_STORAGE_UNITS}); users see metric or US customary units.
 * Conversion factors are those of NIST SP 811 (2008), Appendix B, and NIST Handbook 44,
 * Appendix C (exact definitions of the inch, pound-force and US gallon).
 *
 * Conversion is a table of factors (no expression parser, so the client's first page does
 * not load one). Each unit is written as the product of base factors, and converted with
 * the same steps, in the same order, as mathjs 15 does (multiply by each factor raised to
 * its power; offsets for temperatures), so every result equals mathjs's to the last bit:
 * units.test.ts checks every pair against mathjs itself.
 */
import { requireFinite } from './errors';

type Dimension = 'pressure' | 'volume' | 'flow' | 'temperature' | 'area' | 'velocity' | 'length' | 'dynamic viscosity' | 'kinematic viscosity';
/** One factor of a unit: (unit value × prefix value) raised to `power`, as mathjs normalises it. */
type Factor = [unitValue: number, prefixValue: number, power: number];
type UnitDef = { dim: Dimension; factors: Factor[] };

// Base values as mathjs 15 defines them (m, in, ft, L, gallon, s, min, h, day, Pa, bar, atm, kgf).
const IN = 0.0254;
const FT = 0.3048;
const L = 0.001;
const GAL = 0.003785411784;
const MIN = 60;
const H = 3600;
const DAY = 86400;
const BAR = 100000;
const ATM = 101325;
/** psi, defined exactly as 4.4482216152605 N / (0.0254 m)² (NIST SP 811 App. B.8). */
const PSI = 6894.757293168361;
/** The value mathjs gives a unit created from a definition: the definition's normalised 1. */
const defined = (factors: Factor[]): number => factors.reduce((v, [u, p, n]) => v * (u * p) ** n, 1);
/** US gallons per minute (NIST Handbook 44 App. C: 1 gal = 231 in³ = 3.785411784 L). */
const GPM = defined([
  [GAL, 1, 1],
  [MIN, 1, -1],
]);
/** Flux: litres per square metre per hour. */
const LMH = defined([
  [L, 1, 1],
  [1, 1, -2],
  [H, 1, -1],
]);
/** Flux: US gallons per square foot per day. */
const GFD = defined([
  [GAL, 1, 1],
  [FT, 1, -2],
  [DAY, 1, -1],
]);
/** Centipoise (= 1 mPa·s) and centistokes (= 1 mm²/s), NIST SP 811 App. B.8. */
const CP = 0.001 * defined([
  [1, 1, 1],
  [1, 1, 1],
]);
const CST = 1e-6 * defined([
  [1, 1, 2],
  [1, 1, -1],
]);

const one = (dim: Dimension, unitValue: number, prefixValue = 1, power = 1): UnitDef => ({ dim, factors: [[unitValue, prefixValue, power]] });

/** Every unit the converter knows, as written (mathjs spelling). */
const UNITS: Readonly<Record<string, UnitDef>> = {
  Pa: one('pressure', 1),
  kPa: one('pressure', 1, 1000),
  bar: one('pressure', BAR),
  mbar: one('pressure', BAR, 0.001),
  atm: one('pressure', ATM),
  psi: one('pressure', PSI),
  'kgf/cm^2': { dim: 'pressure', factors: [[9.80665, 1, 1], [1, 0.01, -2]] },
  L: one('volume', L),
  mL: one('volume', L, 0.001),
  hL: one('volume', L, 100),
  'm^3': one('volume', 1, 1, 3),
  gal: one('volume', GAL),
  'L/h': { dim: 'flow', factors: [[L, 1, 1], [H, 1, -1]] },
  'L/min': { dim: 'flow', factors: [[L, 1, 1], [MIN, 1, -1]] },
  'm^3/h': { dim: 'flow', factors: [[1, 1, 3], [H, 1, -1]] },
  'm^3/s': { dim: 'flow', factors: [[1, 1, 3], [1, 1, -1]] },
  'hL/h': { dim: 'flow', factors: [[L, 100, 1], [H, 1, -1]] },
  'gal/min': { dim: 'flow', factors: [[GAL, 1, 1], [MIN, 1, -1]] },
  gpm: one('flow', GPM),
  degC: one('temperature', 1),
  degF: one('temperature', 5 / 9),
  K: one('temperature', 1),
  'm^2': one('area', 1, 1, 2),
  'ft^2': one('area', FT, 1, 2),
  LMH: one('velocity', LMH),
  gfd: one('velocity', GFD),
  'L/(m^2 h)': { dim: 'velocity', factors: [[L, 1, 1], [1, 1, -2], [H, 1, -1]] },
  'gal/(ft^2 day)': { dim: 'velocity', factors: [[GAL, 1, 1], [FT, 1, -2], [DAY, 1, -1]] },
  'm/s': { dim: 'velocity', factors: [[1, 1, 1], [1, 1, -1]] },
  // Volume per filter area (capacity, Vmax): a length dimensionally.
  'L/m^2': { dim: 'length', factors: [[L, 1, 1], [1, 1, -2]] },
  'gal/ft^2': { dim: 'length', factors: [[GAL, 1, 1], [FT, 1, -2]] },
  mm: one('length', 1, 0.001),
  m: one('length', 1),
  in: one('length', IN),
  ft: one('length', FT),
  cP: one('dynamic viscosity', CP),
  'Pa s': { dim: 'dynamic viscosity', factors: [[1, 1, 1], [1, 1, 1]] },
  cSt: one('kinematic viscosity', CST),
  'mm^2/s': { dim: 'kinematic viscosity', factors: [[1, 0.001, 2], [1, 1, -1]] },
};

/**
 * What mathjs adds when converting between temperature scales with different zeros:
 * (from value × from offset) − (to value × to offset), in kelvin, computed by mathjs in exact
 * fractions (°F is 5/9 K, its zero 459.67 °F below absolute zero) and rounded once.
 */
const TEMPERATURE_SHIFT: Readonly<Record<string, number>> = {
  'degC>degF': 160 / 9,
  'degF>degC': -160 / 9,
  'degC>K': 273.15,
  'K>degC': -273.15,
  'degF>K': 229835 / 900,
  'K>degF': -229835 / 900,
};

const hasOwn = (o: object, k: string) => Object.prototype.hasOwnProperty.call(o, k);

/**
 * Converts a value between two units by the table of factors (unit names as mathjs writes
 * them: bar, mbar, kPa, Pa, psi, atm, kgf/cm^2, L, mL, hL, m^3, gal, L/h, L/min, m^3/h, m^3/s, hL/h, gal/min, gpm,
 * degC, degF, K, m^2, ft^2, LMH, gfd, L/(m^2 h), gal/(ft^2 day), m/s, mm, m, in, ft, cP,
 * Pa s, cSt, mm^2/s). Temperatures in degC/degF are absolute readings (20 degC → 68 degF),
 * not differences. Results equal mathjs 15's for the same units, bit for bit.
 *
 * Factors: NIST SP 811 (2008) App. B.8/B.9; NIST Handbook 44 App. C.
 *
 * @param value number to convert (finite)
 * @param from  unit of `value`, e.g. "psi"
 * @param to    unit wanted, e.g. "bar"
 * @returns the value in `to`
 * @throws RangeError for an unknown unit or units of different kinds
 */
export function convert(value: number, from: string, to: string): number {
  requireFinite('value to convert', value);
  const a = hasOwn(UNITS, from) ? UNITS[from] : undefined;
  const b = hasOwn(UNITS, to) ? UNITS[to] : undefined;
  if (!a || !b) throw new RangeError(`Unknown unit in "${from}" or "${to}".`);
  if (a.dim !== b.dim) throw new RangeError(`Cannot convert ${from} to ${to}: they measure different things.`);
  let si = value;
  for (const [u, p, n] of a.factors) si = si * (u * p) ** n;
  const shift = a.dim === 'temperature' ? TEMPERATURE_SHIFT[`${from}>${to}`] : undefined;
  if (shift !== undefined) si = si + shift;
  let out = si;
  for (const [u, p, n] of b.factors) out = out / (u * p) ** n;
  if (!Number.isFinite(out)) throw new RangeError(`Conversion of ${String(value)} ${from} to ${to} is out of range.`);
  return out;
}

/**
 * Whether the converter knows a unit, e.g. "gal/min" (see {@link convert} for the list).
 * @param unit unit expression
 */
export function isKnownUnit(unit: string): boolean {
  return hasOwn(UNITS, unit);
}

// ---------------------------------------------------------------------------
// User unit systems
// ---------------------------------------------------------------------------

/** A user's preferred unit system. */
export type UnitSystem = 'metric' | 'us';

/** Kinds of quantity shown to users. `dp` is a differential pressure; `pressure` is gauge. */
export type QuantityKind = 'pressure' | 'dp' | 'volume' | 'flow' | 'temperature' | 'area' | 'flux' | 'length' | 'loading';

/** All quantity kinds, in a stable order. */
export const QUANTITY_KINDS: readonly QuantityKind[] = [
  'pressure',
  'dp',
  'volume',
  'flow',
  'temperature',
  'area',
  'flux',
  'length',
  'loading',
];

/**
 * The unit in which the engine and the database store each kind of quantity
 * (unit names as {@link convert} writes them): bar (gauge pressure and ΔP), L, L/h, °C, m², L/m²/h, m, L/m².
 */
export const METRIC_STORAGE_UNITS: Readonly<Record<QuantityKind, string>> = {
  pressure: 'bar',
  dp: 'bar',
  volume: 'L',
  flow: 'L/h',
  temperature: 'degC',
  area: 'm^2',
  flux: 'LMH',
  length: 'm',
  loading: 'L/m^2',
};

/** How one kind of quantity is shown in one unit system. */
export interface DisplayUnit {
  /** Unit name for {@link convert}. */
  unit: string;
  /** Symbol shown to the user. */
  symbol: string;
  /** Default number of decimals when formatting. */
  digits: number;
}

/** Display units per system and kind (metric: trade metric; us: US customary). */
export const DISPLAY_UNITS: Readonly<Record<UnitSystem, Readonly<Record<QuantityKind, DisplayUnit>>>> = {
  metric: {
    pressure: { unit: 'bar', symbol: 'bar', digits: 2 },
    dp: { unit: 'bar', symbol: 'bar', digits: 3 },
    volume: { unit: 'L', symbol: 'L', digits: 0 },
    flow: { unit: 'L/h', symbol: 'L/h', digits: 0 },
    temperature: { unit: 'degC', symbol: '°C', digits: 1 },
    area: { unit: 'm^2', symbol: 'm²', digits: 2 },
    flux: { unit: 'LMH', symbol: 'L/m²/h', digits: 0 },
    length: { unit: 'm', symbol: 'm', digits: 2 },
    // Litres per m² of filter: a stage's capacity and a disc test's Vmax.
    loading: { unit: 'L/m^2', symbol: 'L/m²', digits: 0 },
  },
  us: {
    pressure: { unit: 'psi', symbol: 'psi', digits: 1 },
    dp: { unit: 'psi', symbol: 'psi', digits: 2 },
    volume: { unit: 'gal', symbol: 'gal', digits: 0 },
    flow: { unit: 'gal/min', symbol: 'gal/min', digits: 1 },
    temperature: { unit: 'degF', symbol: '°F', digits: 1 },
    area: { unit: 'ft^2', symbol: 'ft²', digits: 1 },
    flux: { unit: 'gfd', symbol: 'gal/ft²/day', digits: 1 },
    length: { unit: 'ft', symbol: 'ft', digits: 2 },
    loading: { unit: 'gal/ft^2', symbol: 'gal/ft²', digits: 1 },
  },
};

/** Hectolitre display unit for large metric volumes. */
const HECTOLITRE: DisplayUnit = { unit: 'hL', symbol: 'hL', digits: 1 };

/** Options of {@link toUserUnits} and {@link formatQuantity}. */
export interface DisplayOptions {
  /** Decimals to show (0–10); default per kind from {@link DISPLAY_UNITS}. */
  digits?: number;
  /** Metric only: show volumes of 10 000 L and more in hL. Default false. */
  hectolitres?: boolean;
}

function checkKind(kind: QuantityKind, system: UnitSystem): void {
  if (!QUANTITY_KINDS.includes(kind)) throw new RangeError(`Unknown quantity kind "${String(kind)}".`);
  if (system !== 'metric' && system !== 'us') throw new RangeError(`Unknown unit system "${String(system)}".`);
}

function displayUnitFor(kind: QuantityKind, valueInMetric: number, system: UnitSystem, opts?: DisplayOptions): DisplayUnit {
  if (system === 'metric' && kind === 'volume' && opts?.hectolitres && Math.abs(valueInMetric) >= 10_000) {
    return HECTOLITRE;
  }
  return DISPLAY_UNITS[system][kind];
}

/**
 * Converts a stored (metric) value to the user's unit system.
 *
 * @param kind          quantity kind
 * @param valueInMetric value in {@link METRIC_STORAGE_UNITS}[kind]
 * @param system        user's unit system
 * @param opts          display options (hectolitres for big metric volumes)
 * @returns { value, unit } with `unit` the display symbol (e.g. "psi", "°F")
 */
export function toUserUnits(
  kind: QuantityKind,
  valueInMetric: number,
  system: UnitSystem,
  opts?: DisplayOptions,
): { value: number; unit: string } {
  checkKind(kind, system);
  requireFinite(`${kind} value`, valueInMetric);
  const d = displayUnitFor(kind, valueInMetric, system, opts);
  return { value: convert(valueInMetric, METRIC_STORAGE_UNITS[kind], d.unit), unit: d.symbol };
}

/**
 * Converts a value typed by the user (in the default display unit of their system for
 * that kind, {@link DISPLAY_UNITS}) back to the metric storage unit — for form input.
 *
 * @param kind              quantity kind
 * @param valueInUserUnits  value in DISPLAY_UNITS[system][kind]
 * @param system            user's unit system
 * @returns value in {@link METRIC_STORAGE_UNITS}[kind]
 */
export function toMetric(kind: QuantityKind, valueInUserUnits: number, system: UnitSystem): number {
  checkKind(kind, system);
  requireFinite(`${kind} value`, valueInUserUnits);
  return convert(valueInUserUnits, DISPLAY_UNITS[system][kind].unit, METRIC_STORAGE_UNITS[kind]);
}

const formatters = new Map<number, Intl.NumberFormat>();
function formatter(digits: number): Intl.NumberFormat {
  let f = formatters.get(digits);
  if (!f) {
    f = new Intl.NumberFormat('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits, useGrouping: true });
    formatters.set(digits, f);
  }
  return f;
}

/**
 * Formats a number with en-US grouping and a fixed number of decimals
 * (negative zero shows as "0").
 * @param value  finite number
 * @param digits decimals, 0–10
 */
export function formatNumber(value: number, digits: number): string {
  requireFinite('value', value);
  if (!Number.isInteger(digits) || digits < 0 || digits > 10) {
    throw new RangeError(`Digits must be a whole number from 0 to 10 (got ${String(digits)}).`);
  }
  const s = formatter(digits).format(value);
  return /^-[0.,]*$/.test(s) ? s.slice(1) : s;
}

/**
 * Formats a stored (metric) value for display in the user's unit system, e.g.
 * formatQuantity('pressure', 1.42, 'metric') → "1.42 bar",
 * formatQuantity('flow', 6000, 'us') → "26.4 gal/min". Uses Intl.NumberFormat('en-US')
 * grouping ("12,500 L").
 *
 * @param kind          quantity kind
 * @param valueInMetric value in {@link METRIC_STORAGE_UNITS}[kind]
 * @param system        user's unit system
 * @param opts          digits (decimals) and hectolitres (metric volumes ≥ 10 000 L in hL)
 */
export function formatQuantity(
  kind: QuantityKind,
  valueInMetric: number,
  system: UnitSystem,
  opts?: DisplayOptions,
): string {
  checkKind(kind, system);
  const d = displayUnitFor(kind, valueInMetric, system, opts);
  const { value, unit } = toUserUnits(kind, valueInMetric, system, opts);
  return `${formatNumber(value, opts?.digits ?? d.digits)} ${unit}`;
}

/** Longest duration stated in words, hours (60 days); anything longer is absurd for a run and refused. */
export const MAX_DURATION_HOURS = 24 * 60;

/**
 * A duration in plain words that can never be read as a clock time: "under a minute",
 * "about 21 min", "about 2 h 10 min" (to 5 min above an hour), "about 3 days" (above 48 h).
 * Refuses a negative, non-finite or absurd (above {@link MAX_DURATION_HOURS}) value with a
 * RangeError, so no such figure reaches a screen (common practice, no source).
 * @param hours duration, hours (decimal)
 */
export function formatDurationWords(hours: number): string {
  requireFinite('duration (h)', hours);
  if (hours < 0 || hours > MAX_DURATION_HOURS) {
    throw new RangeError(`A duration must be from 0 to ${String(MAX_DURATION_HOURS)} h (got ${String(hours)}).`);
  }
  const minutes = hours * 60;
  if (minutes < 1) return 'under a minute';
  if (minutes < 59.5) return `about ${String(Math.round(minutes))} min`;
  if (hours <= 48) {
    const rounded = Math.round(minutes / 5) * 5;
    const h = Math.floor(rounded / 60);
    const m = rounded % 60;
    return m === 0 ? `about ${String(h)} h` : `about ${String(h)} h ${String(m)} min`;
  }
  return `about ${String(Math.round(hours / 24))} days`;
}

/** Litres in the volume a cost is given per: a hectolitre (metric), 100 US gallons (US customary). */
export const COST_VOLUME_BASIS: Readonly<Record<UnitSystem, { litres: number; per: string }>> = {
  metric: { litres: 100, per: 'hL' },
  // 100 gal × 3.785411784 L (NIST Handbook 44 App. C).
  us: { litres: 378.5411784, per: '100 gal' },
};

/** A cost per hL shown in the person's units: per hL (metric) or per 100 US gal. */
export function costPerVolumeBasis(costPerHl: number, system: UnitSystem): { value: number; per: string } {
  requireFinite('cost per hL', costPerHl);
  const basis = COST_VOLUME_BASIS[system];
  return { value: (costPerHl * basis.litres) / 100, per: basis.per };
}
