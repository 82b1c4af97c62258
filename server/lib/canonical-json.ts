import { createHash } from 'node:crypto';

/**
 * Canonical JSON: object keys sorted by code unit, no whitespace, arrays in order, `undefined`
 * members left out (as JSON.stringify does). Numbers use JavaScript's shortest round-trip form,
 * so the same value always gives the same text. Non-finite numbers are refused: a record never
 * holds one.
 */
export function canonicalJson(value: unknown): string {
  if (value === null) return 'null';
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new RangeError('A record cannot hold a non-finite number.');
    return JSON.stringify(value);
  }
  if (typeof value === 'string' || typeof value === 'boolean') return JSON.stringify(value);
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',')}]`;
  if (typeof value === 'object') {
    const obj = value as Record<string, unknown>;
    const keys = Object.keys(obj)
      .filter((k) => obj[k] !== undefined)
      .sort();
    return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(obj[k])}`).join(',')}}`;
  }
  throw new TypeError(`Cannot put a ${typeof value} in canonical JSON.`);
}

/** SHA-256 (lower-case hex) of the canonical JSON of `value`. */
export function sha256OfCanonical(value: unknown): string {
  return createHash('sha256').update(canonicalJson(value), 'utf8').digest('hex');
}
