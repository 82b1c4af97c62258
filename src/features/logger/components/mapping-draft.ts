import Papa from 'papaparse';
import { guessFormat } from '@shared/logger/logger-file';
import type { LoggerMapping } from '@shared/schemas/logger';

/** The mapping form's state: every field a string, as the selects hold them. */
export type MappingDraft = {
  delimiter: ',' | ';' | '\t';
  decimal: '.' | ',';
  timeZone: string;
  timeColumn: string;
  timeFormat: string;
  litresFrom: 'volume' | 'totaliser' | 'flow';
  litresColumn: string;
  litresUnit: string;
  flowColumn: string;
  flowUnit: string;
  pressures: 'pair' | 'dp';
  upstreamColumn: string;
  upstreamUnit: string;
  downstreamColumn: string;
  downstreamUnit: string;
  dpColumn: string;
  dpUnit: string;
  tempColumn: string;
  tempUnit: string;
};

/** What the browser read of the file: its header row and the rows under it. */
export type FileSample = { headers: string[]; rows: string[][]; delimiter: ',' | ';' | '\t'; decimal: '.' | ',' };

/**
 * The first bytes of a file as text, decoded as the server decodes the whole file: UTF-8, else
 * Windows-1252 (older loggers), cut at the last line end so no character is split.
 */
export function decodeSample(bytes: Uint8Array): string {
  const end = bytes.lastIndexOf(0x0a);
  const part = end > 0 && bytes.length >= 64 * 1024 ? bytes.subarray(0, end + 1) : bytes;
  try {
    return new TextDecoder('utf-8', { fatal: true }).decode(part);
  } catch {
    return new TextDecoder('windows-1252').decode(part);
  }
}

/** Reads the first lines of a file for the mapping form: the separator, the decimal mark and the header row. */
export function sampleFile(text: string): FileSample {
  const head = text.replace(/^\uFEFF/, '').slice(0, 64 * 1024);
  const { delimiter, decimal } = guessFormat(head);
  const rows = Papa.parse<string[]>(head, { delimiter, preview: 40, skipEmptyLines: true }).data;
  const width = (r: string[]) => r.filter((c) => c.trim() !== '').length;
  const most = Math.max(0, ...rows.map(width));
  // The header is the first row as wide as the widest (a logger's preamble lines are narrower).
  const at = Math.max(0, rows.findIndex((r) => width(r) === most));
  const headers = (rows[at] ?? []).map((c) => c.trim()).filter((c) => c !== '');
  return { headers, rows: rows.slice(at + 1, at + 6), delimiter, decimal };
}

const find = (headers: string[], re: RegExp, not?: string[]) => headers.find((h) => re.test(h) && !not?.includes(h)) ?? '';

function unitIn(header: string, units: string[], fallback: string): string {
  const h = header.toLowerCase();
  if (units.includes('psi') && /psi/.test(h)) return 'psi';
  if (units.includes('kPa') && /kpa/.test(h)) return 'kPa';
  if (units.includes('degF') && /°f|degf|fahrenheit/.test(h)) return 'degF';
  if (units.includes('hL') && /\bhl\b/.test(h)) return 'hL';
  if (units.includes('gal') && /gal/.test(h)) return 'gal';
  if (units.includes('gal/min') && /gpm|gal/.test(h)) return 'gal/min';
  return fallback;
}

/** A first mapping from the header names (the person checks and corrects it). */
export function guessDraft(sample: FileSample): MappingDraft {
  const h = sample.headers;
  const time = find(h, /time|zeit|date|datum|heure|fecha|ora/i);
  const litres = find(h, /litre|liter|volume|total|zähler|counter|compteur|\bl\b|\bhl\b|gallons?\b/i, [time]);
  const flow = find(h, /flow|durchfluss|débit|rate|l\/h|gpm|gal\/min/i, [time, litres]);
  const dp = find(h, /Δp|delta|diff|\bdp\b/i, [time, litres, flow]);
  const up = find(h, /up|inlet|\bin\b|vor|ein|p1|entrée/i, [time, litres, flow, dp]);
  const down = find(h, /down|outlet|\bout\b|nach|aus|p2|sortie/i, [time, litres, flow, dp, up]);
  const temp = find(h, /temp|°c|°f/i, [time, litres, flow, dp, up, down]);
  const isTotaliser = /total|zähler|counter|compteur/i.test(litres);
  return {
    delimiter: sample.delimiter,
    decimal: sample.decimal,
    timeZone: Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC',
    timeColumn: time || h[0] || '',
    timeFormat: 'auto',
    litresFrom: litres ? (isTotaliser ? 'totaliser' : 'volume') : 'flow',
    litresColumn: litres || flow,
    litresUnit: litres ? unitIn(litres, ['L', 'hL', 'gal'], 'L') : unitIn(flow, ['L/h', 'gal/min'], 'L/h'),
    flowColumn: litres ? flow : '',
    flowUnit: unitIn(flow, ['L/h', 'gal/min'], 'L/h'),
    pressures: up && down ? 'pair' : 'dp',
    upstreamColumn: up,
    upstreamUnit: unitIn(up, ['bar', 'psi', 'kPa'], 'bar'),
    downstreamColumn: down,
    downstreamUnit: unitIn(down, ['bar', 'psi', 'kPa'], 'bar'),
    dpColumn: dp,
    dpUnit: unitIn(dp, ['bar', 'psi', 'kPa'], 'bar'),
    tempColumn: temp,
    tempUnit: unitIn(temp, ['degC', 'degF'], 'degC'),
  };
}

/** The mapping the server takes, from the form (the shared schema checks it). */
export function draftToMapping(d: MappingDraft): LoggerMapping {
  const m: Record<string, unknown> = {
    delimiter: d.delimiter,
    decimal: d.decimal,
    timeZone: d.timeZone || undefined,
    time: { column: d.timeColumn, format: d.timeFormat === 'auto' ? undefined : d.timeFormat },
  };
  if (d.litresFrom === 'flow') m.flow = { column: d.litresColumn, unit: d.litresUnit };
  else {
    m.volume = { column: d.litresColumn, unit: d.litresUnit, kind: d.litresFrom };
    if (d.flowColumn) m.flow = { column: d.flowColumn, unit: d.flowUnit };
  }
  if (d.pressures === 'pair') {
    m.upstream = { column: d.upstreamColumn, unit: d.upstreamUnit };
    m.downstream = { column: d.downstreamColumn, unit: d.downstreamUnit };
  } else m.dp = { column: d.dpColumn, unit: d.dpUnit };
  if (d.tempColumn) m.temp = { column: d.tempColumn, unit: d.tempUnit };
  return m as LoggerMapping;
}

/** A saved mapping put back into the form (to start a new profile from it). */
export function mappingToDraft(m: LoggerMapping, fallback: MappingDraft): MappingDraft {
  return {
    ...fallback,
    delimiter: m.delimiter ?? fallback.delimiter,
    decimal: m.decimal,
    timeZone: m.timeZone ?? 'UTC',
    timeColumn: m.time.column,
    timeFormat: m.time.format ?? 'auto',
    litresFrom: m.volume ? m.volume.kind : 'flow',
    litresColumn: m.volume?.column ?? m.flow?.column ?? '',
    litresUnit: m.volume?.unit ?? m.flow?.unit ?? 'L',
    flowColumn: m.volume ? (m.flow?.column ?? '') : '',
    flowUnit: m.flow?.unit ?? 'L/h',
    pressures: m.dp && !(m.upstream && m.downstream) ? 'dp' : 'pair',
    upstreamColumn: m.upstream?.column ?? '',
    upstreamUnit: m.upstream?.unit ?? 'bar',
    downstreamColumn: m.downstream?.column ?? '',
    downstreamUnit: m.downstream?.unit ?? 'bar',
    dpColumn: m.dp?.column ?? '',
    dpUnit: m.dp?.unit ?? 'bar',
    tempColumn: m.temp?.column ?? '',
    tempUnit: m.temp?.unit ?? 'degC',
  };
}

/** Field messages of the mapping schema under the form's own names. */
export const draftFieldOf: Record<string, keyof MappingDraft> = {
  delimiter: 'delimiter',
  decimal: 'decimal',
  timeZone: 'timeZone',
  'time.column': 'timeColumn',
  'time.format': 'timeFormat',
  volume: 'litresColumn',
  'volume.column': 'litresColumn',
  flow: 'litresColumn',
  'flow.column': 'flowColumn',
  upstream: 'upstreamColumn',
  'upstream.column': 'upstreamColumn',
  downstream: 'downstreamColumn',
  'downstream.column': 'downstreamColumn',
  dp: 'dpColumn',
  'dp.column': 'dpColumn',
  'temp.column': 'tempColumn',
};
