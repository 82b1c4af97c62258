// Database error helpers: the one place that knows PostgreSQL's error codes and how Drizzle wraps them.

/** PostgreSQL's SQLSTATE for a unique violation. */
const UNIQUE_VIOLATION = '23505';

/**
 * True when `error` (or one of its causes: Drizzle wraps the driver's error) is PostgreSQL's
 * unique violation. With `constraint`, only a violation of that constraint (or index) counts —
 * named by the driver's `constraint` field or, failing that, in the message; without it any
 * unique violation does.
 */
export function isUniqueViolation(error: unknown, constraint?: string): boolean {
  for (let e: any = error, depth = 0; e && depth < 4; e = e.cause, depth++) {
    if (e.code !== UNIQUE_VIOLATION) continue;
    if (!constraint || e.constraint === constraint || String(e.message ?? '').includes(constraint)) return true;
  }
  return false;
}
