import type { AuditFieldChange } from '../../db/schema';

/** Fields never shown in the change log: identity, bookkeeping and secrets. */
export const AUDIT_IGNORED_FIELDS: ReadonlySet<string> = new Set(['id', 'wineryId', 'createdAt', 'updatedAt', 'passwordHash', 'tokenHash', 'storageKey']);

/** A value as JSON would carry it (dates as ISO text, undefined as null), for storing and comparing. */
export function auditValue(value: unknown): unknown {
  if (value === undefined) return null;
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? null : value.toISOString();
  if (typeof value === 'number' && !Number.isFinite(value)) return null;
  if (Array.isArray(value)) return value.map(auditValue);
  if (value && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, auditValue(v)]));
  return value;
}

const same = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

/**
 * The one field diff of the change log: every field whose value differs between `before` and
 * `after`, as before → after. A created record has every field null → value; a deleted one
 * value → null. Returns null when nothing differs.
 */
export function fieldChanges(before: Record<string, unknown> | null, after: Record<string, unknown> | null): Record<string, AuditFieldChange> | null {
  const keys = new Set([...Object.keys(before ?? {}), ...Object.keys(after ?? {})]);
  const out: Record<string, AuditFieldChange> = {};
  for (const key of keys) {
    if (AUDIT_IGNORED_FIELDS.has(key)) continue;
    const b = auditValue(before?.[key]);
    const a = auditValue(after?.[key]);
    if (!same(b, a)) out[key] = { before: b, after: a };
  }
  return Object.keys(out).length ? out : null;
}
