// Reading a delivery file: CSV with the columns serial, batch, type, length, received.
import Papa from 'papaparse';
import { IMPORT_COLUMNS, IMPORT_MAX_ROWS, importRowSchema } from '../../../shared/schemas/cartridges';
import type { ImportPreviewDto, ImportPreviewRowDto } from '../../../shared/types/cartridges';
import { badRequest } from '../../lib/errors';

const REQUIRED_COLUMNS = ['serial', 'type', 'length'] as const;

/** Header names people actually write, mapped to ours. */
const HEADER_ALIASES: Record<string, (typeof IMPORT_COLUMNS)[number]> = {
  serial: 'serial',
  'serial number': 'serial',
  serialnumber: 'serial',
  code: 'serial',
  batch: 'batch',
  lot: 'batch',
  type: 'type',
  'type name': 'type',
  'cartridge type': 'type',
  length: 'length',
  'length in': 'length',
  'length (in)': 'length',
  lengthin: 'length',
  received: 'received',
  'received at': 'received',
  'received on': 'received',
  receivedat: 'received',
  date: 'received',
};

function normaliseHeader(h: string) {
  const key = h.replace(/^\uFEFF/, '').trim().toLowerCase();
  return HEADER_ALIASES[key] ?? key;
}

export type ParsedRow = { line: number; values: Record<string, string>; problems: string[] };

/**
 * Parses the CSV text in header mode. Throws a 400 for a file that cannot be a delivery
 * (binary content, no rows, missing columns, more than {@link IMPORT_MAX_ROWS} rows).
 */
export function parseDeliveryCsv(text: string): ParsedRow[] {
  if (text.includes('\u0000')) throw badRequest('This file is not a CSV text file. Save the delivery list as CSV and try again.');
  const clean = text.replace(/^\uFEFF/, '');
  if (!clean.trim()) throw badRequest('The file is empty. It needs a header row (serial, batch, type, length, received) and one row per cartridge.');
  const parsed = Papa.parse<Record<string, string>>(clean, {
    header: true,
    // Blank lines are kept here and dropped below, so each row keeps its line number.
    skipEmptyLines: false,
    transformHeader: normaliseHeader,
    // Delimiter is guessed (comma, semicolon or tab); a European spreadsheet often writes semicolons.
  });
  const fields = parsed.meta.fields ?? [];
  // papaparse renames a repeated header "serial" to "serial_1"; a repeated column would lose its values.
  const repeated = IMPORT_COLUMNS.filter((c) => fields.some((f) => f.startsWith(`${c}_`) && /_\d+$/.test(f)));
  if (repeated.length) throw badRequest(`The header row names ${repeated.join(', ')} more than once. Keep one column of each.`);
  const missing = REQUIRED_COLUMNS.filter((c) => !fields.includes(c));
  if (missing.length) {
    throw badRequest(`The file has no ${missing.join(', ')} column${missing.length > 1 ? 's' : ''}. The header row must name: ${IMPORT_COLUMNS.join(', ')}.`);
  }
  const isBlank = (values: Record<string, unknown>) => Object.values(values).every((v) => v === undefined || v === null || (typeof v === 'string' && v.trim() === ''));
  const rowCount = parsed.data.filter((v) => !isBlank(v)).length;
  if (rowCount === 0) throw badRequest('The file has a header row but no cartridges.');
  if (rowCount > IMPORT_MAX_ROWS) {
    throw badRequest(`The file has ${rowCount.toLocaleString('en')} rows; one import takes at most ${IMPORT_MAX_ROWS.toLocaleString('en')}. Split the delivery into smaller files.`);
  }
  // Row i of the data is line i + 2 of the file (the header is line 1; quoted line breaks aside).
  const problems = new Map<number, string[]>();
  for (const e of parsed.errors) {
    if (e.row === undefined || e.code !== 'TooManyFields') continue;
    problems.set(e.row, [...(problems.get(e.row) ?? []), `The row has more values than the header has columns (${fields.length}). Check for an unquoted comma.`]);
  }
  return parsed.data.flatMap((values, i) => (isBlank(values) ? [] : [{ line: i + 2, values, problems: problems.get(i) ?? [] }]));
}

/**
 * Checks every row: the fields (zod), the type name against the winery's catalogue, serials
 * repeated in the file or already registered.
 */
export function checkDeliveryRows(
  rows: ParsedRow[],
  ctx: { typesByName: Map<string, { id: string; name: string }>; existingSerials: Set<string> },
): ImportPreviewDto {
  const repeated = new Map<string, number[]>();
  for (const r of rows) {
    const serial = (r.values.serial ?? '').trim();
    if (!serial) continue;
    repeated.set(serial, [...(repeated.get(serial) ?? []), r.line]);
  }

  const out: ImportPreviewRowDto[] = rows.map((r) => {
    const raw = {
      serial: r.values.serial ?? '',
      batch: r.values.batch ?? '',
      type: r.values.type ?? '',
      length: r.values.length ?? '',
      received: r.values.received ?? '',
    };
    const errors: string[] = [...r.problems];
    const parsed = importRowSchema.safeParse(raw);
    if (!parsed.success) {
      const seen = new Set<string>();
      for (const issue of parsed.error.issues) {
        const field = String(issue.path[0] ?? '');
        if (seen.has(field)) continue;
        seen.add(field);
        errors.push(`${field ? `${field[0].toUpperCase()}${field.slice(1)}: ` : ''}${issue.message}`);
      }
    }
    const serial = raw.serial.trim();
    const typeName = raw.type.trim();
    const type = typeName ? ctx.typesByName.get(typeName.toLowerCase()) : undefined;
    if (typeName && !type) errors.push(`Type: "${typeName}" is not in the cartridge-type catalogue. Add it under Equipment or correct the name.`);
    const lines = serial ? (repeated.get(serial) ?? []) : [];
    if (lines.length > 1) {
      const others = lines.filter((l) => l !== r.line);
      errors.push(`Serial: ${serial} is also on line${others.length > 1 ? 's' : ''} ${others.join(', ')}.`);
    }
    if (serial && ctx.existingSerials.has(serial)) errors.push(`Serial: ${serial} is already registered in this winery.`);
    return {
      line: r.line,
      serial,
      batch: raw.batch.trim(),
      type: type?.name ?? typeName,
      typeId: type?.id ?? null,
      lengthIn: parsed.success ? parsed.data.length : null,
      receivedAt: parsed.success ? (parsed.data.received ?? null) : null,
      errors,
    };
  });
  const errorCount = out.filter((r) => r.errors.length > 0).length;
  return { rows: out, valid: errorCount === 0, errorCount, fileErrors: [] };
}
