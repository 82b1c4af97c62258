// The signed-in person's unit system, with helpers to show stored (metric) values and to read
// typed values back. Quantities are stored in SI/trade-metric and converted only for display.
import { DISPLAY_UNITS, formatQuantity, toMetric, toUserUnits, type QuantityKind, type UnitSystem } from '@shared/engine';
import { useMe } from './session';

export type { QuantityKind, UnitSystem };

export function useUnitSystem(): UnitSystem {
  return useMe().data?.user.units ?? 'metric';
}

/** Formatting and parsing bound to the person's unit system. */
export function useUnits() {
  const system = useUnitSystem();
  return {
    system,
    /** The unit symbol shown for a kind, e.g. "bar" or "psi". */
    symbol: (kind: QuantityKind) => DISPLAY_UNITS[system][kind].symbol,
    /** "1.42 bar" from a stored metric value; "—" when absent. */
    format: (kind: QuantityKind, metricValue: number | null | undefined, digits?: number) =>
      metricValue === null || metricValue === undefined || !Number.isFinite(metricValue) ? '—' : formatQuantity(kind, metricValue, system, { digits }),
    /** The number to put in a form field for a stored metric value. */
    toInput: (kind: QuantityKind, metricValue: number | null | undefined, digits = 4) => {
      if (metricValue === null || metricValue === undefined) return '';
      const v = toUserUnits(kind, metricValue, system).value;
      return String(Number(v.toFixed(digits)));
    },
    /** The stored metric value for what the person typed in their units. */
    fromInput: (kind: QuantityKind, typed: number) => toMetric(kind, typed, system),
  };
}
