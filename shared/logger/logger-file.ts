/**
 * Reading a pressure logger's export, row by row: numbers with a decimal point or comma,
 * date-times in common formats and a time zone, units converted with the engine's `convert`,
 * litres from a volume column, a totaliser or a flow integrated over time, and a per-row list
 * of what is wrong (blank, unparseable, time going backwards, litres going down).
 *
 * Pure and isomorphic: the server reads whole files with it (papaparse feeds it rows), the
 * client the first rows for the column mapping. No clock: times come from the file.
 */
import { convert } from '../engine';
import type { LoggerMapping } from '../schemas/logger';
import type { ReadingValuesDto } from '../types/runs';

/** One row as read, in stored units. `at` is milliseconds since 1970 (UTC). */
export type LoggerRow = Omit<ReadingValuesDto, 'at'> & { row: number; at: number };
export type LoggerRowError = { row: number; column: string | null; message: string };

/** A problem with the whole file or the mapping (not one row): field → message. */
export class LoggerFileError extends Error {
  constructor(
    message: string,
    readonly fields: Record<string, string> = {},
  ) {
    super(message);
  }
}

// ---------------------------------------------------------------------------
// Numbers
// ---------------------------------------------------------------------------

const POINT_PLAIN = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const POINT_GROUPED = /^[+-]?\d{1,3}(?:,\d{3})+(?:\.\d+)?$/;
const COMMA_PLAIN = /^[+-]?(?:\d+,?\d*|,\d+)(?:[eE][+-]?\d+)?$/;
const COMMA_GROUPED = /^[+-]?\d{1,3}(?:\.\d{3})+(?:,\d+)?$/;
const SPACES = /[\s\u00a0\u202f']/g;

/**
 * A number as a logger or a spreadsheet writes it: "1234.5", "1,234.5" (decimal point) or
 * "1234,5", "1.234,5", "1 234,5" (decimal comma). Null for a blank cell, NaN for anything else
 * that is not a number (so "1.5" with a decimal comma is refused rather than read as 15).
 */
export function parseLoggerNumber(text: string, decimal: '.' | ','): number | null {
  let s = text.trim();
  if (s === '') return null;
  if (s.includes(' ') || s.includes('\u00a0') || s.includes('\u202f') || s.includes("'")) s = s.replace(SPACES, '');
  if (decimal === '.') {
    if (POINT_PLAIN.test(s)) return Number(s);
    if (POINT_GROUPED.test(s)) return Number(s.replace(/,/g, ''));
    return NaN;
  }
  if (COMMA_PLAIN.test(s)) return Number(s.replace(',', '.'));
  if (COMMA_GROUPED.test(s)) return Number(s.replace(/\./g, '').replace(',', '.'));
  return NaN;
}

// ---------------------------------------------------------------------------
// Date-times and time zones
// ---------------------------------------------------------------------------

const offsetFormatters = new Map<string, Intl.DateTimeFormat>();
const offsetCache = new Map<string, number>();
const QUARTER_HOUR = 15 * 60 * 1000;

/** The zone's offset from UTC at an instant, ms (cached per quarter hour: zones change on quarter hours). */
function zoneOffsetMs(zone: string, instant: number): number {
  const key = `${zone}|${String(Math.floor(instant / QUARTER_HOUR))}`;
  const hit = offsetCache.get(key);
  if (hit !== undefined) return hit;
  let f = offsetFormatters.get(zone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone: zone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: 'numeric', minute: 'numeric', second: 'numeric' });
    offsetFormatters.set(zone, f);
  }
  const at = Math.floor(instant / 1000) * 1000;
  const p: Record<string, number> = {};
  for (const part of f.formatToParts(at)) if (part.type !== 'literal') p[part.type] = Number(part.value);
  const wall = Date.UTC(p.year, p.month - 1, p.day, p.hour === 24 ? 0 : p.hour, p.minute, p.second);
  const offset = wall - at;
  if (offsetCache.size > 50_000) offsetCache.clear();
  offsetCache.set(key, offset);
  return offset;
}

/**
 * The instant of a wall-clock time in an IANA zone. In the hour repeated when clocks go back
 * the first (summer-time) instant is taken; a time skipped when clocks go forward is read
 * with the offset before the change.
 */
export function wallTimeToInstant(wall: { y: number; mo: number; d: number; h: number; mi: number; s: number; ms: number }, zone: string): number {
  const guess = Date.UTC(wall.y, wall.mo - 1, wall.d, wall.h, wall.mi, wall.s, wall.ms);
  if (zone === 'UTC' || zone === 'Etc/UTC') return guess;
  // Zones change offset at most once in a day: try the offsets half a day either side.
  const early = zoneOffsetMs(zone, guess - 14 * 3600_000);
  const late = zoneOffsetMs(zone, guess + 14 * 3600_000);
  const a = guess - early;
  if (early === late) return a;
  const b = guess - late;
  const aFits = zoneOffsetMs(zone, a) === early;
  const bFits = zoneOffsetMs(zone, b) === late;
  if (aFits && bFits) return Math.min(a, b);
  if (bFits) return b;
  return a;
}

type Parts = { y: number; mo: number; d: number; h: number; mi: number; s: number; ms: number; offsetMin: number | null };

function validParts(p: Parts): boolean {
  if (p.y < 1900 || p.y > 2200 || p.mo < 1 || p.mo > 12 || p.d < 1 || p.h > 23 || p.mi > 59 || p.s > 60) return false;
  const days = new Date(Date.UTC(p.y, p.mo, 0)).getUTCDate();
  return p.d <= days;
}

function fraction(s: string | undefined): number {
  return s ? Math.round(Number(`0.${s}`) * 1000) : 0;
}

function offsetMinutes(s: string | undefined): number | null {
  if (!s) return null;
  if (s === 'Z' || s === 'z') return 0;
  const m = /^([+-])(\d{2}):?(\d{2})$/.exec(s);
  if (!m) return null;
  return (m[1] === '-' ? -1 : 1) * (Number(m[2]) * 60 + Number(m[3]));
}

function hour12(h: number, ampm: string | undefined): number {
  if (!ampm) return h;
  const pm = ampm.toLowerCase().startsWith('p');
  if (h < 1 || h > 12) return 99;
  return pm ? (h % 12) + 12 : h % 12;
}

const TIME_TAIL = String.raw`(?:[ T,]+(\d{1,2}):(\d{2})(?::(\d{2})(?:[.,](\d{1,6}))?)?\s*([AaPp]\.?[Mm]\.?)?)?\s*(Z|[+-]\d{2}:?\d{2})?`;
const ISO = new RegExp(String.raw`^(\d{4})[-/](\d{1,2})[-/](\d{1,2})${TIME_TAIL}$`);
const DMY = new RegExp(String.raw`^(\d{1,2})([./-])(\d{1,2})\2(\d{4}|\d{2})${TIME_TAIL}$`);
const EPOCH = /^\d{9,13}(?:\.\d+)?$/;

function year(s: string): number {
  const n = Number(s);
  return s.length === 2 ? 2000 + n : n;
}

function tail(m: RegExpExecArray, from: number): Pick<Parts, 'h' | 'mi' | 's' | 'ms' | 'offsetMin'> {
  return {
    h: hour12(Number(m[from] ?? 0), m[from + 4]),
    mi: Number(m[from + 1] ?? 0),
    s: Number(m[from + 2] ?? 0),
    ms: fraction(m[from + 3]),
    offsetMin: offsetMinutes(m[from + 5]),
  };
}

/** The order of day and month in the file's slash or dash dates, from a sample of its values. */
export function detectDayFirst(samples: readonly string[]): boolean {
  let dayFirst = 0;
  let monthFirst = 0;
  let ampm = false;
  for (const raw of samples) {
    const m = DMY.exec(raw.trim());
    if (!m) continue;
    if (m[9]) ampm = true;
    if (m[2] === '.') dayFirst += 1;
    if (Number(m[1]) > 12) dayFirst += 1;
    if (Number(m[3]) > 12) monthFirst += 1;
  }
  if (dayFirst === monthFirst) return !ampm;
  return dayFirst > monthFirst;
}

const TOKEN = /YYYY|YY|MM|M|DD|D|HH|H|hh|h|mm|ss|SSS|A/g;

/** A parser for an explicit pattern such as "DD.MM.YYYY HH:mm:ss" (tokens as in {@link LOGGER_TIME_FORMAT_PATTERN}). */
function patternParser(format: string): (s: string) => Parts | null {
  const fields: string[] = [];
  let re = '^';
  let last = 0;
  for (const m of format.matchAll(TOKEN)) {
    re += format
      .slice(last, m.index)
      .replace(/[.*+?^${}()|[\]\\/]/g, '\\$&')
      .replace(/\s+/g, '\\s+');
    const t = m[0];
    fields.push(t);
    re += t === 'YYYY' ? '(\\d{4})' : t === 'SSS' ? '(\\d{1,6})' : t === 'A' ? '([AaPp]\\.?[Mm]\\.?)' : t.length === 2 ? '(\\d{2})' : '(\\d{1,2})';
    last = m.index + t.length;
  }
  re += format.slice(last).replace(/[.*+?^${}()|[\]\\/]/g, '\\$&').replace(/\s+/g, '\\s+');
  re += '\\s*(Z|[+-]\\d{2}:?\\d{2})?$';
  const rx = new RegExp(re);
  return (s) => {
    const m = rx.exec(s);
    if (!m) return null;
    const p: Parts = { y: 1970, mo: 1, d: 1, h: 0, mi: 0, s: 0, ms: 0, offsetMin: offsetMinutes(m[fields.length + 1]) };
    let ampm: string | undefined;
    let h12: number | null = null;
    fields.forEach((t, i) => {
      const v = m[i + 1];
      if (t === 'YYYY' || t === 'YY') p.y = year(v);
      else if (t === 'MM' || t === 'M') p.mo = Number(v);
      else if (t === 'DD' || t === 'D') p.d = Number(v);
      else if (t === 'HH' || t === 'H') p.h = Number(v);
      else if (t === 'hh' || t === 'h') h12 = Number(v);
      else if (t === 'mm') p.mi = Number(v);
      else if (t === 'ss') p.s = Number(v);
      else if (t === 'SSS') p.ms = fraction(v);
      else if (t === 'A') ampm = v;
    });
    if (h12 !== null) p.h = hour12(h12, ampm ?? 'am');
    return p;
  };
}

/** How the time column's format is described to a person in an error. */
export function formatLabel(format: string | undefined): string {
  if (!format || format === 'auto') return 'a date and time such as 2026-03-14 08:15:30 or 14.03.2026 08:15';
  if (format === 'epoch-s') return 'seconds since 1970';
  if (format === 'epoch-ms') return 'milliseconds since 1970';
  return format;
}

/**
 * A date-time reader for one file: the format (`auto`, `epoch-s`, `epoch-ms` or a pattern)
 * and the zone the logger's clock was set to (UTC when none); an offset written in the value
 * itself ("Z", "+01:00") wins. Returns ms since 1970, or null when the text is not a time.
 */
export function createTimeParser(opts: { format?: string; timeZone?: string; dayFirst?: boolean }): (text: string) => number | null {
  const zone = opts.timeZone ?? 'UTC';
  const format = opts.format ?? 'auto';
  const instant = (p: Parts | null): number | null => {
    if (!p || !validParts(p)) return null;
    if (p.offsetMin !== null) return Date.UTC(p.y, p.mo - 1, p.d, p.h, p.mi, p.s, p.ms) - p.offsetMin * 60_000;
    return wallTimeToInstant(p, zone);
  };
  const epoch = (s: string, unitMs: number) => {
    if (!/^\d+(?:\.\d+)?$/.test(s)) return null;
    const ms = Number(s) * unitMs;
    return ms >= Date.UTC(1900, 0, 1) && ms <= Date.UTC(2200, 0, 1) ? Math.round(ms) : null;
  };
  if (format === 'epoch-s') return (t) => epoch(t.trim(), 1000);
  if (format === 'epoch-ms') return (t) => epoch(t.trim(), 1);
  if (format !== 'auto') {
    const parse = patternParser(format);
    return (t) => instant(parse(t.trim()));
  }
  const dayFirst = opts.dayFirst ?? true;
  return (text) => {
    const s = text.trim();
    let m = ISO.exec(s);
    if (m) return instant({ y: Number(m[1]), mo: Number(m[2]), d: Number(m[3]), ...tail(m, 4) });
    m = DMY.exec(s);
    if (m) {
      const a = Number(m[1]);
      const b = Number(m[3]);
      const first = m[2] === '.' || dayFirst;
      return instant({ y: year(m[4]), mo: first ? b : a, d: first ? a : b, ...tail(m, 5) });
    }
    if (EPOCH.test(s)) return epoch(s, s.replace(/\..*/, '').length >= 12 ? 1 : 1000);
    return null;
  };
}

// ---------------------------------------------------------------------------
// Rows
// ---------------------------------------------------------------------------

/** Limits of a stored reading (as the readings contract has them). */
const LIMITS = { barMin: -1, barMax: 100, volumeMax: 10_000_000, flowMax: 1_000_000, tempMin: -10, tempMax: 150 };
/** Rows before the header (a logger's preamble) that are skipped while looking for it. */
export const HEADER_SEARCH_ROWS = 50;
/** Errors kept in full; more are counted. */
export const ERRORS_KEPT = 1000;

type Column = { index: number; name: string; unit: string };

function fmt(n: number): string {
  return Number.isInteger(n) ? n.toLocaleString('en-US') : n.toLocaleString('en-US', { maximumFractionDigits: 3 });
}

/**
 * Reads a logger file's rows with a mapping. Feed it every row (the cells, and the row's number
 * in the file counting from 1); it finds the header row (the first with every mapped column,
 * within the first {@link HEADER_SEARCH_ROWS} rows), then reads each data row into stored units or
 * errors. Throws {@link LoggerFileError} when the header is never found or the file is too long.
 */
export function createLoggerReader(mapping: LoggerMapping, opts: { dayFirst?: boolean; maxRows: number; keepRows?: boolean }) {
  const parseTime = createTimeParser({ format: mapping.time.format, timeZone: mapping.timeZone, dayFirst: opts.dayFirst });
  const num = (s: string | undefined) => parseLoggerNumber(s ?? '', mapping.decimal);
  const wanted: [keyof LoggerMapping, string][] = (['time', 'volume', 'flow', 'upstream', 'downstream', 'dp', 'temp'] as const)
    .filter((k) => mapping[k])
    .map((k) => [k, (mapping[k] as { column: string }).column]);
  let cols: Partial<Record<'time' | 'volume' | 'flow' | 'upstream' | 'downstream' | 'dp' | 'temp', Column>> | null = null;
  let headers: string[] = [];
  let seenBeforeHeader = 0;
  let firstCells: string[] | null = null;

  const rows: LoggerRow[] = [];
  const errors: LoggerRowError[] = [];
  let errorCount = 0;
  let rowCount = 0;
  let lastAt: number | null = null;
  let lastAtText = '';
  let lastVolume: number | null = null;
  let firstTotaliser: number | null = null;
  let integrated = 0;
  let lastFlowForIntegral: { at: number; flowLh: number } | null = null;

  function findHeader(cells: string[]) {
    const trimmed = cells.map((c) => c.replace(/^\uFEFF/, '').trim());
    const lower = trimmed.map((c) => c.toLowerCase());
    const found: typeof cols = {};
    for (const [key, name] of wanted) {
      let index = trimmed.indexOf(name.trim());
      if (index < 0) index = lower.indexOf(name.trim().toLowerCase());
      if (index < 0) return false;
      const unit = key === 'time' ? '' : (mapping[key] as { unit: string }).unit;
      found[key as keyof typeof found] = { index, name: trimmed[index], unit };
    }
    cols = found;
    headers = trimmed;
    return true;
  }

  function fail(row: number, column: string | null, message: string) {
    errorCount += 1;
    if (errors.length < ERRORS_KEPT) errors.push({ row, column, message });
  }

  /** A mapped number cell in stored units; undefined after an error (reported). */
  function value(cells: string[], row: number, col: Column | undefined, to: string, what: string, required: boolean): number | null | undefined {
    if (!col) return null;
    const raw = cells[col.index];
    const n = num(raw);
    if (n === null) {
      if (required) {
        fail(row, col.name, `Row ${String(row)}: ${what} (${col.name}) is blank.`);
        return undefined;
      }
      return null;
    }
    if (Number.isNaN(n)) {
      fail(row, col.name, `Row ${String(row)}: ${what} (${col.name}) “${(raw ?? '').trim().slice(0, 40)}” is not a number with a decimal ${mapping.decimal === ',' ? 'comma' : 'point'}.`);
      return undefined;
    }
    try {
      return convert(n, col.unit, to);
    } catch {
      fail(row, col.name, `Row ${String(row)}: ${what} (${col.name}) is out of range.`);
      return undefined;
    }
  }

  function readRow(cells: string[], row: number) {
    const c = cols!;
    const before = errorCount;
    const timeCol = c.time!;
    const rawTime = (cells[timeCol.index] ?? '').trim();
    let at: number | null = null;
    if (rawTime === '') fail(row, timeCol.name, `Row ${String(row)}: the time (${timeCol.name}) is blank.`);
    else {
      at = parseTime(rawTime);
      if (at === null) fail(row, timeCol.name, `Row ${String(row)}: “${rawTime.slice(0, 40)}” is not ${formatLabel(mapping.time.format)}.`);
      else if (lastAt !== null && at < lastAt) {
        fail(row, timeCol.name, `Row ${String(row)}: the time goes backwards (${rawTime} after ${lastAtText}).`);
        at = null;
      }
    }
    const volumeRaw = value(cells, row, c.volume, 'L', 'litres', true);
    const flow = value(cells, row, c.flow, 'L/h', 'flow', !c.volume);
    const up = value(cells, row, c.upstream, 'bar', 'upstream pressure', !c.dp);
    const down = value(cells, row, c.downstream, 'bar', 'downstream pressure', !c.dp);
    const dpRaw = c.dp ? value(cells, row, c.dp, 'bar', 'ΔP', !(c.upstream && c.downstream)) : null;
    const temp = value(cells, row, c.temp, 'degC', 'temperature', false);
    if (errorCount > before || at === null) return;

    let upstreamBar: number;
    let downstreamBar: number;
    if (typeof up === 'number' && typeof down === 'number') {
      upstreamBar = up;
      downstreamBar = down;
    } else {
      // ΔP alone: stored as upstream = ΔP over downstream 0, so the stage's ΔP is the logger's.
      upstreamBar = dpRaw as number;
      downstreamBar = 0;
    }
    const dpBar = upstreamBar - downstreamBar;
    for (const [p, col, what] of [
      [upstreamBar, c.upstream ?? c.dp, 'upstream pressure'],
      [downstreamBar, c.downstream, 'downstream pressure'],
    ] as const) {
      if (col && (p < LIMITS.barMin || p > LIMITS.barMax)) fail(row, col.name, `Row ${String(row)}: the ${what} ${fmt(p)} bar is outside −1 to 100 bar.`);
    }
    if (dpBar < 0) fail(row, (c.downstream ?? c.dp)!.name, `Row ${String(row)}: downstream pressure is above upstream (ΔP ${fmt(dpBar)} bar); check the gauges.`);
    if (typeof flow === 'number' && (flow < 0 || flow > LIMITS.flowMax)) fail(row, c.flow!.name, `Row ${String(row)}: the flow ${fmt(flow)} L/h is outside 0 to 1,000,000 L/h.`);
    if (typeof temp === 'number' && (temp < LIMITS.tempMin || temp > LIMITS.tempMax)) fail(row, c.temp!.name, `Row ${String(row)}: the temperature ${fmt(temp)} °C is outside −10 to 150 °C.`);
    if (errorCount > before) return;

    let volumeL: number;
    if (c.volume && typeof volumeRaw === 'number') {
      if (mapping.volume!.kind === 'totaliser') {
        // A totaliser counts from wherever it stood: the file's first row is the start of this stretch.
        firstTotaliser ??= volumeRaw;
        volumeL = volumeRaw - firstTotaliser;
      } else volumeL = volumeRaw;
    } else {
      // Litres from the flow: trapezoids between consecutive rows, from 0 at the first row.
      const f = flow as number;
      if (lastFlowForIntegral) integrated += ((lastFlowForIntegral.flowLh + f) / 2) * ((at - lastFlowForIntegral.at) / 3_600_000);
      lastFlowForIntegral = { at, flowLh: f };
      volumeL = integrated;
    }
    const volumeCol = (c.volume ?? c.flow)!.name;
    if (volumeL < 0 || volumeL > LIMITS.volumeMax) {
      fail(row, volumeCol, `Row ${String(row)}: the litres ${fmt(volumeL)} L are outside 0 to 10,000,000 L.`);
      return;
    }
    if (lastVolume !== null && volumeL < lastVolume) {
      fail(row, volumeCol, `Row ${String(row)}: the litres go down (${fmt(volumeL)} L after ${fmt(lastVolume)} L).`);
      return;
    }
    lastAt = at;
    lastAtText = rawTime;
    lastVolume = volumeL;
    if (opts.keepRows !== false || rows.length < 50) {
      rows.push({ row, at, volumeL, upstreamBar, downstreamBar, dpBar, flowLh: typeof flow === 'number' && flow > 0 ? flow : null, tempC: typeof temp === 'number' ? temp : null });
    }
  }

  return {
    /** Feeds one row of cells; `row` is its number in the file (the first line is 1). */
    push(cells: string[], row: number) {
      if (!cols) {
        firstCells ??= cells;
        if (findHeader(cells)) return;
        seenBeforeHeader += 1;
        if (seenBeforeHeader >= HEADER_SEARCH_ROWS) throw missingColumns(wanted, firstCells);
        return;
      }
      if (cells.length === 0 || cells.every((x) => x.trim() === '')) return; // blank line
      rowCount += 1;
      if (rowCount > opts.maxRows) {
        throw new LoggerFileError(`The file has more than ${opts.maxRows.toLocaleString('en-US')} rows. Split it and import the parts one after the other.`, {
          file: `More than ${opts.maxRows.toLocaleString('en-US')} rows.`,
        });
      }
      readRow(cells, row);
    },
    /** Ends the file: the header must have been found and some row read. */
    finish() {
      if (!cols) throw missingColumns(wanted, firstCells ?? []);
      if (rowCount === 0) throw new LoggerFileError('The file has a header row but no rows of readings.', { file: 'No rows of readings under the header.' });
      return { rows, errors, errorCount, rowCount, headers };
    },
  };
}

function missingColumns(wanted: [keyof LoggerMapping, string][], cells: string[]): LoggerFileError {
  const present = cells.map((c) => c.replace(/^\uFEFF/, '').trim().toLowerCase());
  const fields: Record<string, string> = {};
  for (const [key, name] of wanted) {
    if (!present.includes(name.trim().toLowerCase())) fields[`mapping.${key}.column`] = `The file has no column “${name}”.`;
  }
  if (Object.keys(fields).length === 0) fields.file = 'The mapped columns are not all on one header row.';
  const list = cells.filter((c) => c.trim()).slice(0, 12).map((c) => `“${c.trim()}”`).join(', ');
  return new LoggerFileError(
    `The file’s columns do not match the mapping${list ? ` (its first row has ${list})` : ''}. Check the separator and the column names.`,
    fields,
  );
}

/** At most `max` points of a rising series, evenly spaced by index, always with the first and last. */
export function thinPoints<T>(points: readonly T[], max: number): T[] {
  if (points.length <= max) return [...points];
  const out: T[] = [];
  const step = (points.length - 1) / (max - 1);
  for (let i = 0; i < max; i++) out.push(points[Math.round(i * step)]);
  return out;
}

/** Guesses the separator and decimal mark from the first lines of a file (for the mapping form). */
export function guessFormat(sample: string): { delimiter: ',' | ';' | '\t'; decimal: '.' | ',' } {
  const lines = sample.split(/\r?\n/).filter((l) => l.trim()).slice(0, 20);
  const count = (ch: string) => lines.reduce((n, l) => n + l.split(ch).length - 1, 0);
  const tabs = count('\t');
  const semis = count(';');
  const commas = count(',');
  const delimiter = tabs >= semis && tabs >= commas && tabs > 0 ? '\t' : semis >= commas && semis > 0 ? ';' : ',';
  const body = lines.slice(1).join('\n');
  const decimal = delimiter !== ',' && /\d,\d/.test(body) ? ',' : '.';
  return { delimiter, decimal };
}
