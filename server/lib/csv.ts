import { stringify, type Stringifier } from 'csv-stringify';
import { stringify as stringifySync } from 'csv-stringify/sync';

const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * Neutralises a text cell against formula injection: a spreadsheet treats a cell that starts
 * with =, +, -, @, tab or carriage return as a formula, so such a cell gets a leading apostrophe
 * (OWASP, "CSV Injection"). Finite numbers are written as numbers: "-2" is a value, never a
 * formula, and a temperature below zero must stay a number.
 */
export function neutraliseCell(value: unknown): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  const text = value instanceof Date ? value.toISOString() : typeof value === 'object' ? JSON.stringify(value) : String(value);
  return FORMULA_START.test(text) ? `'${text}` : text;
}

/**
 * The options every Porewise CSV is written with: each cell through {@link neutraliseCell},
 * CRLF line ends (RFC 4180). Use with csv-stringify; write arrays of raw values.
 */
export const csvOptions = {
  record_delimiter: 'windows',
  cast: {
    string: (v: string) => neutraliseCell(v),
    number: (v: number) => neutraliseCell(v),
    bigint: (v: bigint) => String(v),
    boolean: (v: boolean) => neutraliseCell(v),
    date: (v: Date) => v.toISOString(),
    object: (v: object) => neutraliseCell(v),
  },
} as const;

/** A csv-stringify stream with its header row written; every cell neutralised. */
export function csvStream(header: readonly string[]): Stringifier {
  const stream = stringify({ ...csvOptions });
  stream.write([...header]);
  return stream;
}

/** A whole CSV text at once (small files): header and rows, every cell neutralised. */
export function toCsv(header: readonly string[], rows: readonly (readonly unknown[])[]): Promise<string> {
  return new Promise((resolve, reject) => {
    const out: string[] = [];
    const stream = csvStream(header);
    stream.on('data', (d: Buffer | string) => out.push(String(d)));
    stream.on('error', reject);
    stream.on('end', () => resolve(out.join('')));
    for (const row of rows) stream.write([...row]);
    stream.end();
  });
}

/** Rows (header included) to CSV text at once, synchronously; every cell neutralised. */
export function csvSafeStringify(rows: readonly (readonly unknown[])[]): string {
  return stringifySync(
    rows.map((r) => [...r]),
    { ...csvOptions },
  );
}
