import { stringify } from 'csv-stringify/sync';

/** First characters that make a spreadsheet read a cell as a formula (or a control sequence). */
const DANGEROUS_START = /^[=+\-@\t\r]/;

/**
 * Neutralises a cell against formula injection (OWASP "CSV Injection"): a text cell starting with
 * =, +, -, @, tab or CR gets a leading apostrophe, so a spreadsheet shows it as text. Numbers are
 * written as numbers (a negative number is data, not a formula) — only strings are touched.
 */
export function csvSafeCell(value: unknown): string | number | null {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number') return Number.isFinite(value) ? value : null;
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  const text = value instanceof Date ? value.toISOString() : String(value);
  return DANGEROUS_START.test(text) ? `'${text}` : text;
}

/** Rows to CSV text (RFC 4180 quoting by csv-stringify), every cell neutralised. */
export function csvSafeStringify(rows: unknown[][]): string {
  return stringify(
    rows.map((r) => r.map(csvSafeCell)),
    { record_delimiter: '\r\n' },
  );
}
