import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, resolve } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import {
  dateLocaleFor,
  dateLocaleTag,
  formatDate,
  formatDateTime,
  formatDateTimeSeconds,
  formatDateTimeUtc,
  formatDay,
  formatDayLong,
  formatDayMonth,
  formatDayMonthTime,
  formatTime,
  setDateLocale,
  toDayInput,
} from './dates';

// Expected texts: the localized long-format tokens of date-fns (docs of `format`: P, PP, PPP,
// PPPP, p, pp), whose locale data follow the Unicode CLDR medium and full date patterns
// (en-GB "d MMM y", en-US "MMM d, y", fr "d MMM y"). Local time is used throughout, so the
// moments are built with the Date(y, m, d, h, min, s) constructor.
const at = new Date(2025, 5, 12, 14, 5, 33);

afterAll(async () => {
  await setDateLocale('en-GB');
});

describe('dateLocaleFor (BCP 47 tag → a supported date locale)', () => {
  it('keeps American English month-first and every other English day-first', () => {
    expect(dateLocaleFor('en-US')).toBe('en-US');
    expect(dateLocaleFor('en-GB')).toBe('en-GB');
    expect(dateLocaleFor('en-AU')).toBe('en-GB');
    expect(dateLocaleFor('en')).toBe('en-GB');
  });
  it('maps regional variants to their language and the rest to British English', () => {
    expect(dateLocaleFor('fr-CA')).toBe('fr');
    expect(dateLocaleFor('de-AT')).toBe('de');
    expect(dateLocaleFor('pt-BR')).toBe('pt');
    expect(dateLocaleFor('es')).toBe('es');
    expect(dateLocaleFor('it_IT')).toBe('it');
    expect(dateLocaleFor('ja-JP')).toBe('en-GB');
    expect(dateLocaleFor(undefined)).toBe('en-GB');
  });
});

describe('one date format in the person’s locale', () => {
  it('British English', async () => {
    await setDateLocale('en-GB');
    expect(formatDate(at)).toBe('12 Jun 2025');
    expect(formatDateTime(at)).toBe('12 Jun 2025, 14:05');
    expect(formatDateTimeSeconds(at)).toBe('12 Jun 2025, 14:05:33');
    expect(formatDay(at)).toBe('Thu, 12 Jun 2025');
    expect(formatDayLong(at)).toBe('Thursday, 12 June 2025');
    expect(formatDayMonth(at)).toBe('12 Jun');
    expect(formatDayMonthTime(at)).toBe('12 Jun, 14:05');
    expect(formatTime(at)).toBe('14:05');
  });
  it('American English', async () => {
    await setDateLocale('en-US');
    expect(dateLocaleTag()).toBe('en-US');
    expect(formatDate(at)).toBe('Jun 12, 2025');
    expect(formatDateTime(at)).toBe('Jun 12, 2025, 2:05 PM');
    expect(formatDayMonth(at)).toBe('Jun 12');
    expect(formatTime(at)).toBe('2:05 PM');
  });
  it('French, loaded on demand', async () => {
    expect(await setDateLocale('fr-FR')).toBe('fr');
    expect(formatDate(at)).toBe('12 juin 2025');
    expect(formatDayMonth(at)).toBe('12 juin');
    expect(formatTime(at)).toBe('14:05');
  });
  it('a record’s moment on the UTC clock, in the person’s format', async () => {
    await setDateLocale('en-GB');
    expect(formatDateTimeUtc('2025-06-12T12:05:00.000Z')).toBe('12 Jun 2025, 12:05 UTC');
    await setDateLocale('en-US');
    expect(formatDateTimeUtc('2025-06-12T23:30:00.000Z')).toBe('Jun 12, 2025, 11:30 PM UTC');
    expect(formatDateTimeUtc(null)).toBe('—');
  });
  it('reads a plain day at local midnight and says "—" for a date it cannot read', async () => {
    await setDateLocale('en-GB');
    expect(formatDate('2025-06-12')).toBe('12 Jun 2025');
    expect(formatDate('not a date')).toBe('—');
    expect(toDayInput(at)).toBe('2025-06-12');
  });
});

// One way (common practice, no source): no screen formats a date by itself. ESLint refuses
// these too; this test also catches them in files the lint run might skip.
describe('no date formatting outside src/lib/dates.ts', () => {
  const src = resolve(import.meta.dirname, '..');
  const files: string[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir)) {
      const p = join(dir, name);
      if (statSync(p).isDirectory()) walk(p);
      else if (/\.(ts|tsx)$/.test(name) && !/\.test\.tsx?$/.test(name)) files.push(p);
    }
  };
  walk(src);
  it.each([
    ['toLocaleDateString', /\.toLocaleDateString\(/],
    ['toLocaleTimeString', /\.toLocaleTimeString\(/],
    ['a date’s toLocaleString', /toLocaleString\([^)]*(weekday|month|hour|dateStyle|timeStyle)/],
    ['toISOString().slice', /toISOString\(\)\.slice/],
    ['an ISO string cut into a date', /\b(iso|\w+At)\.slice\(/],
    ['date-fns format imported directly', /import\s*\{[^}]*\bformat(Distance\w*)?\b[^}]*\}\s*from\s*'date-fns'/],
  ])('%s', (_what, pattern) => {
    const offenders = files.filter((f) => !f.endsWith(join('lib', 'dates.ts')) && pattern.test(readFileSync(f, 'utf8'))).map((f) => relative(src, f));
    expect(offenders).toEqual([]);
  });
});
