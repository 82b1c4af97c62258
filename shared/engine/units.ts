/**
 * Unit conversion (through mathjs) and display helpers for a user's unit system.
 *
 * The engine stores quantities in trade-metric units (bar, L, L/h, °C, m², L/m²/h, m —
 * see {@link METRIC_STORAGE_UNITS}); users see metric or US customary units.
 * Conversion factors are those of NIST SP 811 (2008), Appendix B, and NIST Handbook 44,
 * Appendix C (exact definitions of the inch, pound-force and US gallon).
 */
import { create, createUnitDependencies, unitDependencies } from 'mathjs';
import { requireFinite } from './errors';

/**
 * A private mathjs instance with only the unit machinery (keeps the bundle small and
 * leaves any other mathjs instance untouched).
 */
const math = create({ unitDependencies, createUnitDependencies });

// psi: mathjs derives it with a rounding error of ~6e-11; define it exactly as
// 4.4482216152605 N / (0.0254 m)² = 6894.757293168361 Pa (NIST SP 811 App. B.8).
math.createUnit('psi', { definition: '6894.757293168361 Pa' }, { override: true });
// US gallons per minute (NIST Handbook 44 App. C: 1 gal = 231 in³ = 3.785411784 L).
math.createUnit('gpm', { definition: '1 gal/min' });
// Flux: litres per square metre per hour, and US gallons per square foot per day.
math.createUnit('LMH', { definition: '1 L/(m^2 h)' });
math.createUnit('gfd', { definition: '1 gal/(ft^2 day)' });
// Viscosity: centipoise (= 1 mPa·s) and centistokes (= 1 mm²/s), NIST SP 811 App. B.8.
math.createUnit('cP', { definition: '0.001 Pa s' });
math.createUnit('cSt', { definition: '1e-6 m^2/s' });

/**
 * Converts a value between two units, through mathjs (unit names as mathjs writes them:
 * bar, mbar, kPa, Pa, psi, atm, L, mL, hL, m^3, gal, L/h, L/min, m^3/h, gal/min, gpm,
 * degC, degF, K, m^2, ft^2, LMH, gfd, mm, m, in, ft, cP, cSt …). Temperatures in degC/degF
 * are absolute readings (20 degC → 68 degF), not differences.
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
  let out: number;
  try {
    out = math.unit(value, from).toNumber(to);
  } catch (e) {
    const msg = e instanceof Error ? e.message : String(e);
    if (/not found/i.test(msg)) throw new RangeError(`Unknown unit in "${from}" or "${to}".`);
    throw new RangeError(`Cannot convert ${from} to ${to}: they measure different things.`);
  }
  if (!Number.isFinite(out)) throw new RangeError(`Conversion of ${String(value)} ${from} to ${to} is out of range.`);
  return out;
}

/**
 * Whether mathjs (with the units added here) knows a unit expression, e.g. "gal/min".
 * @param unit unit expression
 */
export function isKnownUnit(unit: string): boolean {
  try {
    math.unit(1, unit);
    return true;
  } catch {
    return false;
  }
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
 * (mathjs unit names): bar (gauge pressure and ΔP), L, L/h, °C, m², L/m²/h, m, L/m².
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
  /** mathjs unit name. */
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
