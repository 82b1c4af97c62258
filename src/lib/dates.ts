// One way to show a date in the client: date-fns with the person's locale. Every screen shows
// dates through these helpers (ESLint keeps `toLocaleDateString`, date `toLocaleString` and
// date-fns' own `format` out of the rest of src/).
//
// English (British and American) is in the first load: date-fns' `format` carries en-US
// already and en-GB adds about 1 KB. French, German, Italian, Spanish and Portuguese load on
// demand, so Today's first load does not grow; until one arrives, dates read in British English.
import { format, formatDistanceToNowStrict, parseISO, type Locale } from 'date-fns';
import { enGB } from 'date-fns/locale/en-GB';
import { enUS } from 'date-fns/locale/en-US';
import { useSyncExternalStore } from 'react';

/** The locales Porewise shows dates in; any other language falls back to British English. */
export const DATE_LOCALES = ['en-GB', 'en-US', 'fr', 'de', 'it', 'es', 'pt'] as const;
export type DateLocaleTag = (typeof DATE_LOCALES)[number];

/** English-speaking regions that write the month first, as the United States does. */
const MONTH_FIRST_ENGLISH = new Set(['US', 'PH', 'FM', 'MH', 'PW', 'AS', 'GU', 'MP', 'PR', 'UM', 'VI']);

/**
 * The supported locale for a BCP 47 language tag: "en-US" → en-US, "en-AU" → en-GB,
 * "fr-CA" → fr, "pt-BR" → pt, "ja" → en-GB (not supported).
 */
export function dateLocaleFor(tag: string | undefined | null): DateLocaleTag {
  const [lang = '', region = ''] = (tag ?? '').split(/[-_]/);
  const l = lang.toLowerCase();
  if (l === 'en') return MONTH_FIRST_ENGLISH.has(region.toUpperCase()) ? 'en-US' : 'en-GB';
  if (l === 'fr' || l === 'de' || l === 'it' || l === 'es' || l === 'pt') return l;
  return 'en-GB';
}

const loaders: Record<Exclude<DateLocaleTag, 'en-GB' | 'en-US'>, () => Promise<Locale>> = {
  fr: () => import('date-fns/locale/fr').then((m) => m.fr),
  de: () => import('date-fns/locale/de').then((m) => m.de),
  it: () => import('date-fns/locale/it').then((m) => m.it),
  es: () => import('date-fns/locale/es').then((m) => m.es),
  pt: () => import('date-fns/locale/pt').then((m) => m.pt),
};

/** English is known at once (no flash on the first paint); other languages start in British English. */
function initial(): { tag: DateLocaleTag; locale: Locale } {
  const tag = dateLocaleFor(globalThis.navigator?.language);
  return tag === 'en-US' ? { tag, locale: enUS } : { tag: 'en-GB', locale: enGB };
}

let current = initial();
const listeners = new Set<() => void>();

/** The locale dates are shown in now. */
export const dateLocale = (): Locale => current.locale;
export const dateLocaleTag = (): DateLocaleTag => current.tag;

/**
 * Sets the locale dates are shown in (default: the browser's language), loading it if needed;
 * screens that use {@link useDateLocale} show the new format once it has arrived.
 */
export async function setDateLocale(tag: string | undefined | null = globalThis.navigator?.language): Promise<DateLocaleTag> {
  const want = dateLocaleFor(tag);
  if (want === current.tag) return want;
  let locale: Locale;
  if (want === 'en-GB') locale = enGB;
  else if (want === 'en-US') locale = enUS;
  else {
    try {
      locale = await loaders[want]();
    } catch {
      // Offline before the locale was ever fetched: stay in British English.
      return current.tag;
    }
  }
  current = { tag: want, locale };
  listeners.forEach((l) => l());
  return want;
}

/** The current date locale's tag, re-rendering when it changes (use once near the root). */
export function useDateLocale(): DateLocaleTag {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    () => current.tag,
    () => current.tag,
  );
}

type DateInput = Date | string | number;

/** A Date from an ISO string, a Date or epoch ms; a plain "yyyy-MM-dd" day is read at local midnight. */
export function toDate(d: DateInput): Date {
  if (d instanceof Date) return d;
  if (typeof d === 'number') return new Date(d);
  return /^\d{4}-\d{2}-\d{2}$/.test(d) ? parseISO(d) : new Date(d);
}

const valid = (d: Date) => !Number.isNaN(d.getTime());
const fmt = (d: DateInput, pattern: string) => {
  const date = toDate(d);
  return valid(date) ? format(date, pattern, { locale: current.locale }) : '—';
};

/** The locale's medium date pattern without the year ("d MMM" in en-GB, "MMM d" in en-US). */
function dayMonthPattern(): string {
  const medium = current.locale.formatLong?.date({ width: 'medium' }) ?? 'd MMM y';
  const stripped = medium
    .replace(/[\s,.]*y+[.]?/g, '')
    .replace(/^[\s,]+|[\s,]+$/g, '')
    .trim();
  return stripped || 'd MMM';
}

/** A date: "12 Jun 2025" (en-GB), "Jun 12, 2025" (en-US), "12 juin 2025" (fr). */
export const formatDate = (d: DateInput) => fmt(d, 'PP');

/** A date and time: "12 Jun 2025, 14:05" (en-GB), "Jun 12, 2025, 2:05 PM" (en-US). */
export const formatDateTime = (d: DateInput) => fmt(d, 'PPp');

/**
 * A moment on the UTC clock, for records that must read the same in every time zone (they
 * match the printed record): "12 Jun 2025, 12:05 UTC" (en-GB), "Jun 12, 2025, 12:05 PM UTC" (en-US).
 */
export const formatDateTimeUtc = (d: DateInput | null) => {
  if (d === null) return '—';
  const t = toDate(d);
  if (!valid(t)) return '—';
  const wall = new Date(t.getUTCFullYear(), t.getUTCMonth(), t.getUTCDate(), t.getUTCHours(), t.getUTCMinutes(), t.getUTCSeconds());
  return `${fmt(wall, 'PPp')} UTC`;
};

/** A date and time to the second, for the change log: "12 Jun 2025, 14:05:33". */
export const formatDateTimeSeconds = (d: DateInput) => fmt(d, 'PPpp');

/** A day with its weekday, short: "Thu, 12 Jun 2025" (en-GB), "Thu, Jun 12, 2025" (en-US). */
export const formatDay = (d: DateInput) => fmt(d, 'EEE, PP');

/** A day in full: "Thursday, 12 June 2025" (en-GB), "Thursday, June 12th, 2025" (en-US). */
export const formatDayLong = (d: DateInput) => fmt(d, 'PPPP');

/** A day and month without the year, for chart ticks and recent events: "12 Jun" / "Jun 12". */
export const formatDayMonth = (d: DateInput) => fmt(d, dayMonthPattern());

/** A recent moment: day, month and time: "12 Jun, 14:05" (en-GB), "Jun 12, 2:05 PM" (en-US). */
export const formatDayMonthTime = (d: DateInput) => `${formatDayMonth(d)}, ${fmt(d, 'p')}`;

/** A time of day: "14:05" (en-GB), "2:05 PM" (en-US). */
export const formatTime = (d: DateInput) => fmt(d, 'p');

/** How long ago, in words: "3 days ago" / "il y a 3 jours". */
export const formatAgo = (d: DateInput) => {
  const date = toDate(d);
  return valid(date) ? formatDistanceToNowStrict(date, { addSuffix: true, locale: current.locale }) : '—';
};

/** A local calendar day as an input's value, "yyyy-MM-dd" (not for display). */
export const toDayInput = (d: DateInput = new Date()) => format(toDate(d), 'yyyy-MM-dd');

/** A local date and time as a datetime-local input's value, "yyyy-MM-ddTHH:mm" (not for display). */
export const toDateTimeInput = (d: DateInput = new Date()) => format(toDate(d), "yyyy-MM-dd'T'HH:mm");
