/** True when a database error (or its cause, as drizzle wraps them) is a unique violation of `constraint`. */
export function isUniqueViolation(error: unknown, constraint: string): boolean {
  for (let e: any = error, depth = 0; e && depth < 4; e = e.cause, depth++) {
    if (e.code === '23505' && (e.constraint === constraint || String(e.message ?? '').includes(constraint))) return true;
  }
  return false;
}
