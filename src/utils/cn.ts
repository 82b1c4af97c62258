export type ClassValue = string | number | null | undefined | false | ClassValue[] | Record<string, unknown>;

/** Joins class names, skipping falsy values; objects add keys whose value is truthy. */
export function cn(...values: ClassValue[]): string {
  const out: string[] = [];
  const walk = (value: ClassValue): void => {
    if (!value && value !== 0) return;
    if (typeof value === 'string' || typeof value === 'number') {
      out.push(String(value));
    } else if (Array.isArray(value)) {
      value.forEach(walk);
    } else if (typeof value === 'object') {
      for (const [key, on] of Object.entries(value)) if (on) out.push(key);
    }
  };
  values.forEach(walk);
  return out.join(' ');
}
