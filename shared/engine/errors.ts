/**
 * Input checks shared by the engine. Each function throws a `RangeError` with a
 * plain-English message when the value is unusable, and returns nothing otherwise.
 * Messages name the quantity so a user-facing layer can show them as they are.
 */

/**
 * Throws a RangeError unless `value` is a finite number (not NaN, not ±Infinity).
 * @param name  plain name of the quantity, e.g. "flow" or "temperature"
 * @param value the number to check
 */
export function requireFinite(name: string, value: number): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`${capitalise(name)} must be a finite number (got ${String(value)}).`);
  }
}

/**
 * Throws a RangeError unless `value` is finite and strictly greater than zero.
 * @param name  plain name of the quantity
 * @param value the number to check
 */
export function requirePositive(name: string, value: number): void {
  requireFinite(name, value);
  if (value <= 0) {
    throw new RangeError(`${capitalise(name)} must be greater than zero (got ${String(value)}).`);
  }
}

/**
 * Throws a RangeError unless `value` is finite and zero or greater.
 * @param name  plain name of the quantity
 * @param value the number to check
 */
export function requireNonNegative(name: string, value: number): void {
  requireFinite(name, value);
  if (value < 0) {
    throw new RangeError(`${capitalise(name)} cannot be negative (got ${String(value)}).`);
  }
}

/**
 * Throws a RangeError unless `value` is finite and within [min, max] (inclusive).
 * @param name  plain name of the quantity, e.g. "temperature"
 * @param value the number to check
 * @param min   lowest valid value
 * @param max   highest valid value
 * @param unit  unit shown in the message, e.g. "°C" (optional)
 */
export function requireRange(name: string, value: number, min: number, max: number, unit = ''): void {
  requireFinite(name, value);
  if (value < min || value > max) {
    const u = unit ? ` ${unit}` : '';
    throw new RangeError(
      `${capitalise(name)} must be between ${String(min)}${u} and ${String(max)}${u} (got ${String(value)}${u}).`,
    );
  }
}

function capitalise(s: string): string {
  return s.length === 0 ? s : s[0].toUpperCase() + s.slice(1);
}
