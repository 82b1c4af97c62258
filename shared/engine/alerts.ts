/**
 * Alert rules: pure decisions on whether a condition holds, in plain words. The server
 * gathers the figures, calls these, and keeps one open alert per rule, record and threshold
 * until the condition clears. No clock: the caller passes "now" and dates.
 */

/** The kinds of alert Porewise raises. */
export const ALERT_KINDS = [
  'integrity-failed',
  'cartridge-end-of-life',
  'stock-short',
  'run-terminal-dp',
  'stage-flat-dp',
  'lot-not-ready',
  'care-over-temperature',
] as const;
export type AlertKind = (typeof ALERT_KINDS)[number];

export const alertKindLabels: Record<AlertKind, string> = {
  'integrity-failed': 'Integrity test failed',
  'cartridge-end-of-life': 'Cartridge near end of life',
  'stock-short': 'Plan short of cartridges',
  'run-terminal-dp': 'Run will reach terminal ΔP early',
  'stage-flat-dp': 'ΔP flat while litres rise',
  'lot-not-ready': 'Lot not ready before bottling',
  'care-over-temperature': 'Care cycle above temperature rating',
};

export type AlertSeverity = 'critical' | 'warning' | 'info';
export type AlertRecordType = 'cartridge' | 'plan' | 'run' | 'lot';

/** A condition that holds now. `threshold` tells apart alerts of one rule on one record. */
export type AlertFinding = {
  kind: AlertKind;
  severity: AlertSeverity;
  recordType: AlertRecordType;
  recordId: string;
  threshold: string;
  title: string;
  message: string;
  nextStep: string;
  /** Figures behind the alert (e.g. shortL, the litres a run falls short), kept with it. */
  details?: Record<string, number>;
};

const fmt = (v: number, digits = 0) => (Number.isFinite(v) ? v.toFixed(digits) : '—');

/** A rated budget used to this fraction or more raises the end-of-life alert (the issue's 90 %). */
export const END_OF_LIFE_FRACTION = 0.9;

/**
 * A membrane whose latest integrity test failed must not filter wine. Only the latest test
 * counts: a passing re-test after re-wetting clears it (the maker's note on false failures,
 * as in the engine's cartridge-life rule 'latest').
 */
export function integrityAlert(input: { cartridgeId: string; serial: string; latestPass: boolean | null }): AlertFinding | null {
  if (input.latestPass !== false) return null;
  return {
    kind: 'integrity-failed',
    severity: 'critical',
    recordType: 'cartridge',
    recordId: input.cartridgeId,
    threshold: 'latest-failed',
    title: `Integrity test failed on ${input.serial}`,
    message: `The latest integrity test of cartridge ${input.serial} failed.`,
    nextStep: 'Re-wet and re-test the membrane before filtering; do not bottle through it.',
  };
}

/** One rated budget's use, as the cartridge-life forecast reports it. */
export type BudgetFraction = { factor: string; fraction: number | null };

/** What the approved plans up to and including the next bottling day that uses a cartridge will ask of it. */
export type CartridgeDayNeed = {
  /** the next approved bottling day that uses the cartridge's housing, YYYY-MM-DD */
  plannedDate: string;
  /** litres through this one cartridge that day, L (its share of each lot), or null when unknown */
  litres: number | null;
  /** care cycles before and during that day (one sanitation per plan that uses the housing) */
  cycles: number;
};

/** One planned lot's use of a housing (a stage of its chosen train), for {@link cartridgeDayNeed}. */
export type PlannedHousingUse = {
  planId: string;
  /** YYYY-MM-DD */
  plannedDate: string;
  housingId: string;
  /** litres of the lot through the stage, L */
  volumeL: number;
  /** 10-inch equivalents of the whole stage set (all its housings and rounds), or null when unknown */
  setEquivalents: number | null;
};

/**
 * What a cartridge installed in a housing will be asked for by the approved plans up to and
 * including the next day that uses that housing (from `today` on): its share of each lot's
 * litres through the stage (flow divides over the set in parallel in proportion to the 10-inch
 * equivalents) and one sanitation cycle per plan that uses the housing that day (a filter set is
 * sanitised before each bottling run). Common practice, no source. Null when no plan uses the
 * housing from today on.
 */
export function cartridgeDayNeed(input: { housingId: string; cartridgeEquivalents: number; today: string; uses: PlannedHousingUse[] }): CartridgeDayNeed | null {
  const own = input.uses.filter((u) => u.housingId === input.housingId && daysBetween(input.today, u.plannedDate) >= 0);
  if (!own.length) return null;
  const next = own.map((u) => u.plannedDate).sort()[0];
  const that = own.filter((u) => u.plannedDate === next);
  let litres: number | null = 0;
  for (const u of that) {
    if (litres === null || u.setEquivalents === null || !(u.setEquivalents > 0) || !(input.cartridgeEquivalents > 0) || !Number.isFinite(u.volumeL)) {
      litres = null;
      continue;
    }
    litres += (Math.max(0, u.volumeL) * input.cartridgeEquivalents) / u.setEquivalents;
  }
  return { plannedDate: next, litres, cycles: new Set(that.map((u) => u.planId)).size };
}

/**
 * A cartridge near the end of its life: each rated budget used to END_OF_LIFE_FRACTION or more
 * (one alert per budget), and a life forecast that is spent before the next planned day needing
 * it: the forecast's end date falls before that day, or its remaining care cycles or litres are
 * fewer than the approved plans up to and including that day will ask (see {@link cartridgeDayNeed}).
 */
export function endOfLifeAlerts(input: {
  cartridgeId: string;
  serial: string;
  budgets: BudgetFraction[];
  /** the forecast end of life, ms since the Unix epoch, or null when unknown */
  estimatedEndMs?: number | null;
  /** the next approved bottling day that needs this cartridge, YYYY-MM-DD, or null */
  nextPlannedDate?: string | null;
  /** care cycles left before the first limit (the life forecast's remainingCycles), or null when unknown */
  remainingCycles?: number | null;
  /** litres left before the first limit (the life forecast's remainingLitres), or null when unknown */
  remainingLitres?: number | null;
  /** what the plans up to and including the next day that uses the cartridge will ask of it */
  need?: CartridgeDayNeed | null;
}): AlertFinding[] {
  const out: AlertFinding[] = [];
  for (const b of input.budgets) {
    if (b.fraction === null || !Number.isFinite(b.fraction) || b.fraction < END_OF_LIFE_FRACTION) continue;
    out.push({
      kind: 'cartridge-end-of-life',
      severity: b.fraction >= 1 ? 'critical' : 'warning',
      recordType: 'cartridge',
      recordId: input.cartridgeId,
      threshold: `budget:${b.factor}:${b.fraction >= 1 ? 100 : 90}`,
      title: `${input.serial}: ${fmt(Math.min(b.fraction, 9.99) * 100)} % of rated ${b.factor} used`,
      message: `Cartridge ${input.serial} has used ${fmt(b.fraction * 100)} % of its rated ${b.factor}.`,
      nextStep: b.fraction >= 1 ? 'Replace the cartridge before the next run; its rated budget is spent.' : 'Order a replacement now and plan to change it at the next convenient changeover.',
    });
  }
  const forecastAlert = (date: string, why: string, details?: Record<string, number>): AlertFinding => ({
    kind: 'cartridge-end-of-life',
    severity: 'warning',
    recordType: 'cartridge',
    recordId: input.cartridgeId,
    threshold: `forecast-before:${date}`,
    title: `${input.serial} may be spent before ${date}`,
    message: `The life forecast of cartridge ${input.serial} ends before the bottling day of ${date} that needs it: ${why}`,
    nextStep: 'Have a replacement on the shelf for that day, or change the cartridge beforehand.',
    ...(details ? { details } : {}),
  });
  const need = input.need;
  const finite = (v: number | null | undefined): v is number => v !== null && v !== undefined && Number.isFinite(v);
  if (need) {
    const { remainingCycles, remainingLitres } = input;
    if (finite(remainingCycles) && remainingCycles < need.cycles) {
      out.push(
        forecastAlert(need.plannedDate, `${fmt(remainingCycles)} care ${remainingCycles === 1 ? 'cycle' : 'cycles'} left, the day needs ${fmt(need.cycles)}.`, {
          remainingCycles,
          cyclesNeeded: need.cycles,
        }),
      );
      return out;
    }
    if (finite(remainingLitres) && finite(need.litres) && remainingLitres < need.litres) {
      out.push(
        forecastAlert(need.plannedDate, `about ${fmt(remainingLitres)} L left, the day puts about ${fmt(need.litres)} L through it.`, {
          remainingLitres,
          litresNeeded: need.litres,
        }),
      );
      return out;
    }
  }
  if (input.estimatedEndMs != null && input.nextPlannedDate && Number.isFinite(input.estimatedEndMs)) {
    const dayMs = dayNumber(input.nextPlannedDate) * 86_400_000;
    if (Number.isFinite(dayMs) && input.estimatedEndMs < dayMs) out.push(forecastAlert(input.nextPlannedDate, 'at the present pace of care it runs out first.'));
  }
  return out;
}

/**
 * Days since 1970-01-01 of a YYYY-MM-DD date in the proleptic Gregorian calendar (NaN when
 * malformed). Source: H. Hinnant, "chrono-Compatible Low-Level Date Algorithms", days_from_civil.
 */
export function dayNumber(isoDate: string): number {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(isoDate);
  if (!m) return NaN;
  let y = Number(m[1]);
  const mo = Number(m[2]);
  const d = Number(m[3]);
  y -= mo <= 2 ? 1 : 0;
  const era = Math.floor(y / 400);
  const yoe = y - era * 400;
  const doy = Math.floor((153 * (mo + (mo > 2 ? -3 : 9)) + 2) / 5) + d - 1;
  const doe = yoe * 365 + Math.floor(yoe / 4) - Math.floor(yoe / 100) + doy;
  return era * 146097 + doe - 719468;
}

/** Whole days from `fromDate` to `toDate` (both YYYY-MM-DD); negative when toDate is earlier. */
export function daysBetween(fromDate: string, toDate: string): number {
  return dayNumber(toDate) - dayNumber(fromDate);
}

/** A cartridge type the plan needs more of than the winery has usable. */
export type StockShortage = { typeName: string; lengthIn: number; short: number };

/**
 * A plan whose cartridges needed exceed usable stock. Critical when the day is within the
 * order lead time (an order placed today may arrive too late), else a warning.
 */
export function stockShortAlert(input: {
  planId: string;
  planName: string;
  plannedDate: string;
  today: string;
  leadTimeDays: number;
  shortages: StockShortage[];
}): AlertFinding | null {
  const short = input.shortages.filter((s) => s.short > 0);
  if (!short.length) return null;
  const days = daysBetween(input.today, input.plannedDate);
  const late = days <= input.leadTimeDays;
  const list = short.map((s) => `${s.short} × ${s.typeName} ${s.lengthIn}″`).join(', ');
  return {
    kind: 'stock-short',
    severity: late ? 'critical' : 'warning',
    recordType: 'plan',
    recordId: input.planId,
    threshold: 'short',
    title: `${input.planName} is short of cartridges`,
    message: `The bottling day ${input.plannedDate} needs ${list} more than usable stock.${late ? ` It is ${days} days away, within the ${input.leadTimeDays}-day order lead time.` : ''}`,
    nextStep: late ? 'Order the missing cartridges today, or change the train to types you have.' : `Order the missing cartridges within ${Math.max(0, days - input.leadTimeDays)} days.`,
  };
}

/** Days before a bottling day from which a lot that is not ready raises an alert. */
export const LOT_READY_DAYS_BEFORE = 2;

/** A lot in an approved plan that is not ready two days (or less) before its bottling day. */
export function lotNotReadyAlert(input: {
  lotId: string;
  lotCode: string;
  planName: string;
  plannedDate: string;
  today: string;
  ready: boolean;
  reason: string;
}): AlertFinding | null {
  if (input.ready) return null;
  const days = daysBetween(input.today, input.plannedDate);
  if (days < 0 || days > LOT_READY_DAYS_BEFORE) return null;
  return {
    kind: 'lot-not-ready',
    severity: days <= 1 ? 'critical' : 'warning',
    recordType: 'lot',
    recordId: input.lotId,
    threshold: `day:${input.plannedDate}`,
    title: `Lot ${input.lotCode} is not ready for ${input.plannedDate}`,
    message: `Lot ${input.lotCode} is planned for ${input.planName} on ${input.plannedDate} and is not ready: ${input.reason}`,
    nextStep: 'Take a fresh sample for the lab, treat the wine if needed, or move the lot to a later day.',
  };
}

/**
 * A run's forecast says a stage reaches terminal ΔP before the lot is bottled: the litres the
 * stage can still pass are fewer than the litres left in the lot.
 */
export function runTerminalAlert(input: {
  runId: string;
  stageIndex: number;
  stageName: string;
  lotCode: string;
  /** litres the stage can still pass before terminal ΔP (forecast) */
  litresToTerminal: number | null;
  /** litres of the lot still to filter */
  litresLeft: number;
}): AlertFinding | null {
  const { litresToTerminal, litresLeft } = input;
  if (litresToTerminal === null || !Number.isFinite(litresToTerminal) || !Number.isFinite(litresLeft)) return null;
  if (litresToTerminal >= litresLeft) return null;
  const shortL = litresLeft - Math.max(0, litresToTerminal);
  return {
    kind: 'run-terminal-dp',
    severity: 'critical',
    recordType: 'run',
    recordId: input.runId,
    threshold: `stage:${input.stageIndex}`,
    details: { shortL },
    title: `${input.stageName} will block ${fmt(shortL)} L before ${input.lotCode} is done`,
    message: `The forecast says ${input.stageName} reaches terminal ΔP about ${fmt(shortL)} L before the end of lot ${input.lotCode}.`,
    nextStep: 'Have a spare cartridge ready and plan a changeover; slow the flow if the ΔP climbs fast.',
  };
}

/** Minutes between two notices of a worsening run forecast on one stage. */
export const RUN_RENOTIFY_MINUTES = 30;

/**
 * Whether an open run forecast alert is sent again: only when the shortfall grew (worse by at
 * least 1 %) and RUN_RENOTIFY_MINUTES have passed since the last notice.
 */
export function shouldRenotifyRunAlert(prev: { shortL: number; notifiedAtMs: number }, next: { shortL: number; nowMs: number }): boolean {
  return next.shortL > prev.shortL * 1.01 && next.nowMs - prev.notifiedAtMs >= RUN_RENOTIFY_MINUTES * 60_000;
}

/** One stage reading for the flat-ΔP rule. */
export type StageReading = { volumeL: number; dpBar: number };

/** The last readings looked at by the flat-ΔP rule, and their limits (common practice, no source). */
export const FLAT_DP_MIN_READINGS = 4;
export const FLAT_DP_MAX_CHANGE_BAR = 0.02;
export const FLAT_DP_MIN_LITRES = 1000;

/**
 * A membrane stage whose ΔP stays flat while litres rise: a membrane always builds some ΔP as
 * it loads, so a flat line over many litres points to a bypass (an O-ring, a bad seat) or a
 * stuck gauge. Looks at the last FLAT_DP_MIN_READINGS readings or more.
 */
export function flatDpAlert(input: { runId: string; stageIndex: number; stageName: string; membrane: boolean; readings: StageReading[] }): AlertFinding | null {
  if (!input.membrane) return null;
  const r = [...input.readings].filter((x) => Number.isFinite(x.volumeL) && Number.isFinite(x.dpBar)).sort((a, b) => a.volumeL - b.volumeL);
  if (r.length < FLAT_DP_MIN_READINGS) return null;
  const last = r.slice(-FLAT_DP_MIN_READINGS);
  const litres = last[last.length - 1].volumeL - last[0].volumeL;
  const dps = last.map((x) => x.dpBar);
  const change = Math.max(...dps) - Math.min(...dps);
  if (litres < FLAT_DP_MIN_LITRES || change > FLAT_DP_MAX_CHANGE_BAR) return null;
  return {
    kind: 'stage-flat-dp',
    severity: 'critical',
    recordType: 'run',
    recordId: input.runId,
    threshold: `stage:${input.stageIndex}`,
    title: `${input.stageName}: ΔP flat over ${fmt(litres)} L`,
    message: `ΔP on ${input.stageName} moved ${fmt(change, 3)} bar over ${fmt(litres)} L. A membrane should load; this may be a bypass or a gauge fault.`,
    nextStep: 'Stop and check the gauges and the cartridge seating (O-rings); run an integrity test before going on.',
  };
}

/** A care cycle hotter than the cartridge's or the housing's rating. */
export function careOverTemperatureAlert(input: {
  cartridgeId: string;
  serial: string;
  cycleId: string;
  tempC: number | null;
  cartridgeMaxC: number | null;
  housingMaxC: number | null;
}): AlertFinding | null {
  if (input.tempC === null || !Number.isFinite(input.tempC)) return null;
  const limits = [input.cartridgeMaxC, input.housingMaxC].filter((v): v is number => v !== null && Number.isFinite(v));
  if (!limits.length) return null;
  const limit = Math.min(...limits);
  if (input.tempC <= limit) return null;
  return {
    kind: 'care-over-temperature',
    severity: 'warning',
    recordType: 'cartridge',
    recordId: input.cartridgeId,
    threshold: `cycle:${input.cycleId}`,
    title: `${input.serial} cleaned at ${fmt(input.tempC)} °C, above its ${fmt(limit)} °C rating`,
    message: `A care cycle of ${input.serial} reached ${fmt(input.tempC)} °C; the rating is ${fmt(limit)} °C.`,
    nextStep: 'Run an integrity test before the next use and check the housing seals; follow the maker’s ratings.',
  };
}

/** How a person receives one kind of alert. */
export const ALERT_CHANNELS = ['app', 'email', 'digest', 'off'] as const;
export type AlertChannel = (typeof ALERT_CHANNELS)[number];

/** Alerts a technician gets by default: the ones that stop a run. */
const RUN_ALARMS: readonly AlertKind[] = ['integrity-failed', 'run-terminal-dp', 'stage-flat-dp'];

/**
 * The default channel of one kind of alert for a role: technicians get run alarms, cellar
 * masters and owners everything by e-mail, winemakers lots and runs, auditors nothing.
 */
export function defaultAlertChannel(role: string, kind: AlertKind): AlertChannel {
  switch (role) {
    case 'owner':
    case 'cellar-master':
      return 'email';
    case 'technician':
      return RUN_ALARMS.includes(kind) ? 'email' : 'off';
    case 'winemaker':
      return kind === 'lot-not-ready' || RUN_ALARMS.includes(kind) ? 'app' : 'off';
    default:
      return 'off';
  }
}

/** Whether `nowMs` falls in hour `hour` (0–23) of the local day in the IANA time zone `timeZone`. */
export function isLocalHour(nowMs: number, timeZone: string, hour: number): boolean {
  const h = Number(new Intl.DateTimeFormat('en-GB', { timeZone, hour: '2-digit', hourCycle: 'h23' }).format(nowMs));
  return h === hour;
}

/** The local calendar date (YYYY-MM-DD) at `nowMs` in the IANA time zone. */
export function localDate(nowMs: number, timeZone: string): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(nowMs);
}

/** True for a time zone name this runtime knows (IANA). */
export function isTimeZone(name: string): boolean {
  try {
    new Intl.DateTimeFormat('en-GB', { timeZone: name });
    return true;
  } catch {
    return false;
  }
}
