// One way to read a typed number in every form: the person's decimal mark decides what "," and
// "." mean, and an entry that could be read two ways (such as "3,000") says what it was read as.
import { useSyncExternalStore } from 'react';

/** The character a person writes between whole and fractional parts. */
export type DecimalMark = '.' | ',';

const STORAGE_KEY = 'porewise.decimalMark';
const listeners = new Set<() => void>();

/** The decimal mark of a locale (from Intl), e.g. "," for "fr-FR" and "." for "en-GB". */
export function localeDecimalMark(locale?: string): DecimalMark {
  try {
    const part = new Intl.NumberFormat(locale).formatToParts(1.5).find((p) => p.type === 'decimal');
    return part?.value === ',' ? ',' : '.';
  } catch {
    return '.';
  }
}

function stored(): DecimalMark | null {
  try {
    const v = globalThis.localStorage?.getItem(STORAGE_KEY);
    return v === '.' || v === ',' ? v : null;
  } catch {
    return null;
  }
}

/** The person's decimal mark on this device: their choice in Settings, else their browser's locale. */
export function getDecimalMark(): DecimalMark {
  return stored() ?? localeDecimalMark(globalThis.navigator?.language);
}

/** Whether the mark was chosen in Settings (false: it follows the browser's language). */
export function decimalMarkChosen(): boolean {
  return stored() !== null;
}

/** Sets (or, with null, forgets) the person's decimal mark on this device. */
export function setDecimalMark(mark: DecimalMark | null): void {
  try {
    if (mark === null) globalThis.localStorage?.removeItem(STORAGE_KEY);
    else globalThis.localStorage?.setItem(STORAGE_KEY, mark);
  } catch {
    // Private windows may refuse storage; the locale's mark is used then.
  }
  for (const l of listeners) l();
}

/** The decimal mark, re-rendering when it changes. */
export function useDecimalMark(): DecimalMark {
  return useSyncExternalStore(
    (cb) => {
      listeners.add(cb);
      return () => listeners.delete(cb);
    },
    getDecimalMark,
    () => '.',
  );
}

/**
 * Typed text → number: empty → null; not a number → NaN (the request schema then says why).
 * With "." as the decimal mark, "," groups thousands ("3,000" = 3000, "12,500.5" = 12500.5);
 * with "," as the mark, "." or a space groups them ("3.000" = 3000, "3,5" = 3.5). A separator
 * that cannot be a thousands group ("3,5" with ".", "3.25" with ",") is read as the decimal
 * mark, since nobody groups digits that way. Spaces (also no-break spaces) are ignored.
 */
export function parseNumberText(text: string | null | undefined, mark: DecimalMark = getDecimalMark()): number | null {
  let s = (text ?? '').trim().replace(/[\s\u00a0\u202f']/g, '');
  if (s === '') return null;
  const group = mark === '.' ? ',' : '.';
  const grouped = new RegExp(`^[-+]?\\d{1,3}(\\${group}\\d{3})+(\\${mark}\\d*)?$`);
  if (grouped.test(s)) s = s.split(group).join('');
  else if (!s.includes(mark) && (s.match(new RegExp(`\\${group}`, 'g')) ?? []).length === 1) s = s.replace(group, mark);
  if (mark === ',') s = s.replace(',', '.');
  return /^[-+]?(\d+(\.\d*)?|\.\d+)$/.test(s) ? Number(s) : Number.NaN;
}

/**
 * When an entry could be read two ways — a single "," or "." followed by exactly three digits —
 * the words saying how it was read ("Read as 3000"), else null.
 */
export function ambiguousReading(text: string | null | undefined, mark: DecimalMark = getDecimalMark()): string | null {
  const s = (text ?? '').trim();
  if (!/^[-+]?\d{1,3}[.,]\d{3}$/.test(s)) return null;
  const n = parseNumberText(s, mark);
  if (n === null || !Number.isFinite(n)) return null;
  const shown = n.toLocaleString('en-US', { maximumFractionDigits: 6, useGrouping: false }).replace('.', mark);
  return `Read as ${shown}${mark === ',' ? ' (decimal comma)' : ''}.`;
}
