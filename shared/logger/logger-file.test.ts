import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { loggerMappingSchema, type LoggerMapping } from '../schemas/logger';
import { createLoggerReader, createTimeParser, detectDayFirst, guessFormat, LoggerFileError, parseLoggerNumber, thinPoints, wallTimeToInstant } from './logger-file';

function read(text: string, mapping: LoggerMapping, maxRows = 1000) {
  const parsed = Papa.parse<string[]>(text, { delimiter: mapping.delimiter ?? '', skipEmptyLines: false });
  const samples = parsed.data.slice(1, 200).map((r) => r[0] ?? '');
  const reader = createLoggerReader(mapping, { dayFirst: detectDayFirst(samples), maxRows });
  parsed.data.forEach((cells, i) => reader.push(cells, i + 1));
  return reader.finish();
}

describe('numbers as loggers write them', () => {
  it.each([
    ['1234.5', '.', 1234.5],
    ['1,234.5', '.', 1234.5],
    ['-0.25', '.', -0.25],
    ['1e3', '.', 1000],
    ['1234,5', ',', 1234.5],
    ['1.234,5', ',', 1234.5],
    ['1 234,5', ',', 1234.5],
    ['0,987', ',', 0.987],
  ] as const)('%s with decimal %s → %d', (text, decimal, expected) => {
    expect(parseLoggerNumber(text, decimal)).toBe(expected);
  });

  it('a blank cell is null; anything else that is not a number is NaN, never a guess', () => {
    expect(parseLoggerNumber('  ', '.')).toBeNull();
    for (const [t, d] of [['1.5', ','], ['1,5', '.'], ['abc', '.'], ['0x10', '.'], ['Infinity', '.'], ['12 bar', '.']] as const) {
      expect(parseLoggerNumber(t, d)).toBeNaN();
    }
  });
});

describe('date-times with a time zone', () => {
  // EU summer time (Directive 2000/84/EC): from 01:00 UTC on the last Sunday of March to 01:00 UTC
  // on the last Sunday of October; Vienna is UTC+1 in winter and UTC+2 in summer.
  it('reads local wall time in an IANA zone, across the spring and autumn changes', () => {
    const vienna = (y: number, mo: number, d: number, h: number, mi = 0) => new Date(wallTimeToInstant({ y, mo, d, h, mi, s: 0, ms: 0 }, 'Europe/Vienna')).toISOString();
    expect(vienna(2026, 1, 15, 8)).toBe('2026-01-15T07:00:00.000Z');
    expect(vienna(2026, 7, 15, 8)).toBe('2026-07-15T06:00:00.000Z');
    expect(vienna(2026, 3, 29, 1, 30)).toBe('2026-03-29T00:30:00.000Z');
    expect(vienna(2026, 3, 29, 3, 30)).toBe('2026-03-29T01:30:00.000Z');
    // 02:30 on 25 October 2026 happens twice: the first (summer-time) one is taken.
    expect(vienna(2026, 10, 25, 2, 30)).toBe('2026-10-25T00:30:00.000Z');
    expect(vienna(2026, 10, 25, 3, 30)).toBe('2026-10-25T02:30:00.000Z');
    // US rule (Energy Policy Act of 2005): PDT (UTC−7) from the second Sunday of March.
    expect(new Date(wallTimeToInstant({ y: 2026, mo: 3, d: 9, h: 8, mi: 0, s: 0, ms: 0 }, 'America/Los_Angeles')).toISOString()).toBe('2026-03-09T15:00:00.000Z');
  });

  it('auto reads ISO 8601, day-first and month-first dates, and epoch seconds; an offset in the value wins', () => {
    const iso = (ms: number | null) => (ms === null ? null : new Date(ms).toISOString());
    const utc = createTimeParser({ timeZone: 'UTC' });
    expect(iso(utc('2026-03-14T08:15:30'))).toBe('2026-03-14T08:15:30.000Z');
    expect(iso(utc('2026-03-14 08:15:30.250+01:00'))).toBe('2026-03-14T07:15:30.250Z');
    expect(iso(utc('14.03.2026 08:15'))).toBe('2026-03-14T08:15:00.000Z');
    expect(iso(utc('1773476130'))).toBe('2026-03-14T08:15:30.000Z');
    const us = createTimeParser({ timeZone: 'UTC', dayFirst: false });
    expect(iso(us('03/14/2026 08:15:30 PM'))).toBe('2026-03-14T20:15:30.000Z');
    expect(iso(utc('31.02.2026 08:00'))).toBeNull();
    expect(iso(utc('yesterday'))).toBeNull();
    expect(detectDayFirst(['01/02/2026 10:00', '13/02/2026 10:00'])).toBe(true);
    expect(detectDayFirst(['02/13/2026 10:00 AM'])).toBe(false);
  });

  it('reads an explicit pattern', () => {
    const p = createTimeParser({ format: 'DD/MM/YY hh:mm A', timeZone: 'Europe/Vienna' });
    expect(new Date(p('14/03/26 08:15 PM')!).toISOString()).toBe('2026-03-14T19:15:00.000Z');
    expect(p('2026-03-14 20:15')).toBeNull();
  });
});

const european: LoggerMapping = loggerMappingSchema.parse({
  delimiter: ';',
  decimal: ',',
  timeZone: 'Europe/Vienna',
  time: { column: 'Zeit' },
  volume: { column: 'Zähler', unit: 'hL', kind: 'totaliser' },
  upstream: { column: 'P ein', unit: 'psi' },
  downstream: { column: 'P aus', unit: 'psi' },
  temp: { column: 'Temp', unit: 'degF' },
});

describe('a logger file read with a mapping', () => {
  it('a European file: semicolons, decimal commas, a totaliser in hL, psi and °F, after a preamble', () => {
    const file = ['Logger DL-7;Serie 0042', 'Zeit;Zähler;P ein;P aus;Temp', '14.03.2026 08:00:00;1.200,5;29,0;14,5;50,0', '14.03.2026 08:00:10;1.201,5;30,0;14,5;59,0', ''].join('\r\n');
    const r = read(file, european);
    expect(r.errorCount).toBe(0);
    expect(r.headers).toEqual(['Zeit', 'Zähler', 'P ein', 'P aus', 'Temp']);
    expect(r.rows).toHaveLength(2);
    const [a, b] = r.rows;
    expect(a.row).toBe(3);
    expect(new Date(a.at).toISOString()).toBe('2026-03-14T07:00:00.000Z');
    expect(a.volumeL).toBe(0);
    // 1 hL = 100 L; 1 psi = 0.0689475729 bar (NIST SP 811 App. B.8); °F → °C by (F − 32) × 5/9.
    expect(b.volumeL).toBeCloseTo(100, 9);
    expect(a.upstreamBar).toBeCloseTo(29 * 0.0689475729, 8);
    expect(a.dpBar).toBeCloseTo(14.5 * 0.0689475729, 8);
    expect(a.tempC).toBeCloseTo(10, 9);
    expect(b.tempC).toBeCloseTo(15, 9);
  });

  it('a flow integrated over time by trapezoids, and ΔP alone', () => {
    const mapping = loggerMappingSchema.parse({
      decimal: '.',
      time: { column: 'time', format: 'epoch-s' },
      flow: { column: 'flow', unit: 'gal/min' },
      dp: { column: 'dp', unit: 'kPa' },
    });
    // 10 gal/min for 60 s, then 20 gal/min: 10 gal, then (10 + 20)/2 × 1 min = 15 gal more.
    const r = read('time,flow,dp\n1773475200,10,50\n1773475260,10,60\n1773475320,20,70\n', mapping);
    expect(r.errorCount).toBe(0);
    expect(r.rows.map((x) => x.volumeL / 3.785411784)).toEqual([0, expect.closeTo(10, 9), expect.closeTo(25, 9)]);
    expect(r.rows[2].upstreamBar).toBeCloseTo(0.7, 12);
    expect(r.rows[2].downstreamBar).toBe(0);
    expect(r.rows[0].flowLh).toBeCloseTo(10 * 3.785411784 * 60, 9);
  });

  it('lists every bad row by its number: blank, unparseable, time going backwards, litres going down', () => {
    const mapping = loggerMappingSchema.parse({
      decimal: '.',
      time: { column: 'Time' },
      volume: { column: 'Litres', unit: 'L', kind: 'volume' },
      upstream: { column: 'In', unit: 'bar' },
      downstream: { column: 'Out', unit: 'bar' },
    });
    const file = [
      'Time,Litres,In,Out',
      '2026-03-14 08:00:00,0,1.2,0.5',
      '2026-03-14 08:01:00,,1.2,0.5',
      '2026-03-14 08:02:00,100,1.3,0.5',
      '2026-03-14 07:59:00,150,1.3,0.5',
      '2026-03-14 08:04:00,90,1.3,0.5',
      'soon,200,1.3,0.5',
      '2026-03-14 08:06:00,300,1.0,1.5',
      '2026-03-14 08:07:00,400,1.x,0.5',
      '2026-03-14 08:08:00,500,1.4,0.5',
    ].join('\n');
    const r = read(file, mapping);
    expect(r.errors.map((e) => [e.row, e.column])).toEqual([
      [3, 'Litres'],
      [5, 'Time'],
      [6, 'Litres'],
      [7, 'Time'],
      [8, 'Out'],
      [9, 'In'],
    ]);
    expect(r.errors[0].message).toMatch(/Row 3: litres \(Litres\) is blank/);
    expect(r.errors[1].message).toMatch(/time goes backwards/);
    expect(r.errors[2].message).toMatch(/litres go down \(90 L after 100 L\)/);
    expect(r.errors[5].message).toMatch(/“1.x” is not a number/);
    expect(r.rows.map((x) => x.row)).toEqual([2, 4, 10]);
    expect(r.rowCount).toBe(9);
  });

  it('names the mapped columns the file does not have, and refuses a file over the row limit', () => {
    const mapping = loggerMappingSchema.parse({ decimal: '.', time: { column: 'Time' }, volume: { column: 'Litres', unit: 'L', kind: 'volume' }, dp: { column: 'dP', unit: 'bar' } });
    try {
      read('Time;Litres;dP\n2026-03-14 08:00,1,1\n', mapping);
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(LoggerFileError);
      expect((e as LoggerFileError).message).toMatch(/Check the separator/);
    }
    const long = ['Time,Litres,dP', ...Array.from({ length: 11 }, (_x, i) => `2026-03-14 08:${String(i).padStart(2, '0')},${String(i)},1`)].join('\n');
    expect(() => read(long, mapping, 10)).toThrow(/more than 10 rows/);
  });

  it('the mapping needs litres or a flow, and pressures or ΔP, with a message per field', () => {
    const r = loggerMappingSchema.safeParse({ decimal: ',', time: { column: 'Zeit' }, upstream: { column: 'P', unit: 'bar' } });
    expect(r.success).toBe(false);
    const paths = r.error!.issues.map((i) => i.path.join('.'));
    expect(paths).toEqual(expect.arrayContaining(['volume', 'flow', 'downstream', 'dp']));
    expect(loggerMappingSchema.safeParse({ decimal: '.', time: { column: 't' }, flow: { column: 'f', unit: 'L/h' }, dp: { column: 'd', unit: 'bar' }, timeZone: 'Mars/Olympus' }).success).toBe(false);
  });

  it('guesses the separator and decimal mark; thins a chart to the wanted points', () => {
    expect(guessFormat('Zeit;Druck\n14.03.2026;1,5\n')).toEqual({ delimiter: ';', decimal: ',' });
    expect(guessFormat('time\tp\n2026-03-14\t1.5\n')).toEqual({ delimiter: '\t', decimal: '.' });
    expect(guessFormat('time,p\n2026-03-14,1.5\n')).toEqual({ delimiter: ',', decimal: '.' });
    const thin = thinPoints(Array.from({ length: 1001 }, (_x, i) => i), 11);
    expect(thin).toEqual([0, 100, 200, 300, 400, 500, 600, 700, 800, 900, 1000]);
  });
});
