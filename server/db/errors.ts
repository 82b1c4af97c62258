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

const UNAVAILABLE_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'EPIPE', 'ETIMEDOUT', 'ENOTFOUND', 'EHOSTUNREACH', 'ENETUNREACH', 'EAI_AGAIN',
  '57P01', // admin_shutdown
  '57P02', // crash_shutdown
  '57P03', // cannot_connect_now (starting up or shutting down)
  '53300', // too_many_connections
]);
const UNAVAILABLE_MESSAGES = /Connection terminated|connection error|timeout exceeded when trying to connect|the database system is (starting up|shutting down)|Client was closed|not queryable/i;

/** True when an error (or its cause chain) says the database cannot be reached right now. */
export function isDatabaseUnavailable(error: unknown): boolean {
  let e: unknown = error;
  for (let depth = 0; e && typeof e === 'object' && depth < 5; depth += 1) {
    const { code, message } = e as { code?: unknown; message?: unknown };
    if (typeof code === 'string' && (UNAVAILABLE_CODES.has(code) || code.startsWith('08'))) return true;
    if (typeof message === 'string' && UNAVAILABLE_MESSAGES.test(message)) return true;
    const errors = (e as { errors?: unknown }).errors; // AggregateError from a dual-stack connect
    if (Array.isArray(errors) && errors.some((x) => isDatabaseUnavailable(x))) return true;
    e = (e as { cause?: unknown }).cause;
  }
  return false;
}

/** PostgreSQL's SQLSTATE for a lock not obtained within `lock_timeout` (or NOWAIT). */
const LOCK_NOT_AVAILABLE = '55P03';

/** True when `error` (or one of its causes) is PostgreSQL's "lock not available". */
export function isLockNotAvailable(error: unknown): boolean {
  for (let e: any = error, depth = 0; e && depth < 4; e = e.cause, depth++) {
    if (e.code === LOCK_NOT_AVAILABLE) return true;
  }
  return false;
}
