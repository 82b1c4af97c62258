import { describe, expect, it } from 'vitest';
import {
  careOverTemperatureAlert,
  cartridgeDayNeed,
  dayNumber,
  daysBetween,
  defaultAlertChannel,
  endOfLifeAlerts,
  flatDpAlert,
  integrityAlert,
  isLocalHour,
  isTimeZone,
  localDate,
  lotNotReadyAlert,
  runTerminalAlert,
  shouldRenotifyRunAlert,
  stockShortAlert,
  type AlertKind,
} from './alerts';

describe('dates (no clock)', () => {
  // Check values: the Unix day count of well-known dates (1970-01-01 is day 0; 2000-03-01 is day
  // 11017 and 2024-02-29 day 19782, from H. Hinnant's days_from_civil worked examples and any
  // date calculator); "from memory" for 1969-12-31.
  it.each([
    ['1970-01-01', 0],
    ['1969-12-31', -1],
    ['2000-03-01', 11017],
    ['2024-02-29', 19782],
  ])('%s is day %i', (date, day) => {
    expect(dayNumber(date)).toBe(day);
  });
  it('counts days across a leap day and rejects malformed dates', () => {
    expect(daysBetween('2024-02-28', '2024-03-01')).toBe(2);
    expect(daysBetween('2025-02-28', '2025-03-01')).toBe(1);
    expect(dayNumber('2024-2-1')).toBeNaN();
  });
  // Time zone offsets: IANA tz database (America/Los_Angeles UTC−8 in January, Pacific/Auckland UTC+13 in January).
  it.each([
    [Date.UTC(2025, 0, 15, 15, 0), 'America/Los_Angeles', 7, true],
    [Date.UTC(2025, 0, 15, 7, 0), 'America/Los_Angeles', 7, false],
    [Date.UTC(2025, 0, 14, 18, 30), 'Pacific/Auckland', 7, true],
    [Date.UTC(2025, 0, 15, 7, 0), 'UTC', 7, true],
  ])('isLocalHour(%i, %s, %i) is %s', (ms, zone, hour, want) => {
    expect(isLocalHour(ms, zone, hour)).toBe(want);
  });
  it('gives the local date and knows time zone names', () => {
    expect(localDate(Date.UTC(2025, 0, 14, 18, 30), 'Pacific/Auckland')).toBe('2025-01-15');
    expect(isTimeZone('Europe/Paris')).toBe(true);
    expect(isTimeZone('Mars/Olympus')).toBe(false);
  });
});

// The rules' thresholds come from the product brief (issue 13: 90 % of a rated budget, two days
// before the bottling day, 30 minutes between run notices); the flat-ΔP limits are "common
// practice, no source".
describe('rules, table-driven', () => {
  const cases: { name: string; got: () => unknown; want: null | Partial<{ kind: AlertKind; severity: string; threshold: string }> }[] = [
    { name: 'integrity: latest failed', got: () => integrityAlert({ cartridgeId: 'c', serial: 'S1', latestPass: false }), want: { kind: 'integrity-failed', severity: 'critical', threshold: 'latest-failed' } },
    { name: 'integrity: latest passed (re-test cleared it)', got: () => integrityAlert({ cartridgeId: 'c', serial: 'S1', latestPass: true }), want: null },
    { name: 'integrity: never tested', got: () => integrityAlert({ cartridgeId: 'c', serial: 'S1', latestPass: null }), want: null },
    {
      name: 'stock: short, day within lead time',
      got: () => stockShortAlert({ planId: 'p', planName: 'June', plannedDate: '2025-06-12', today: '2025-06-05', leadTimeDays: 10, shortages: [{ typeName: 'PES', lengthIn: 30, short: 3 }] }),
      want: { kind: 'stock-short', severity: 'critical', threshold: 'short' },
    },
    {
      name: 'stock: short, day beyond lead time',
      got: () => stockShortAlert({ planId: 'p', planName: 'June', plannedDate: '2025-06-30', today: '2025-06-05', leadTimeDays: 10, shortages: [{ typeName: 'PES', lengthIn: 30, short: 3 }] }),
      want: { kind: 'stock-short', severity: 'warning' },
    },
    {
      name: 'stock: enough',
      got: () => stockShortAlert({ planId: 'p', planName: 'June', plannedDate: '2025-06-12', today: '2025-06-05', leadTimeDays: 10, shortages: [{ typeName: 'PES', lengthIn: 30, short: 0 }] }),
      want: null,
    },
    { name: 'lot: not ready 2 days before', got: () => lotNotReadyAlert({ lotId: 'l', lotCode: 'L1', planName: 'P', plannedDate: '2025-06-12', today: '2025-06-10', ready: false, reason: 'turbid' }), want: { kind: 'lot-not-ready', severity: 'warning', threshold: 'day:2025-06-12' } },
    { name: 'lot: not ready the day before', got: () => lotNotReadyAlert({ lotId: 'l', lotCode: 'L1', planName: 'P', plannedDate: '2025-06-12', today: '2025-06-11', ready: false, reason: 'turbid' }), want: { severity: 'critical' } },
    { name: 'lot: not ready 3 days before (too early)', got: () => lotNotReadyAlert({ lotId: 'l', lotCode: 'L1', planName: 'P', plannedDate: '2025-06-12', today: '2025-06-09', ready: false, reason: 'turbid' }), want: null },
    { name: 'lot: ready', got: () => lotNotReadyAlert({ lotId: 'l', lotCode: 'L1', planName: 'P', plannedDate: '2025-06-12', today: '2025-06-11', ready: true, reason: '' }), want: null },
    { name: 'lot: day passed', got: () => lotNotReadyAlert({ lotId: 'l', lotCode: 'L1', planName: 'P', plannedDate: '2025-06-12', today: '2025-06-13', ready: false, reason: '' }), want: null },
    // The example: the prefilter blocks 131 L before the lot is done.
    { name: 'run: terminal ΔP 131 L early', got: () => runTerminalAlert({ runId: 'r', stageIndex: 0, stageName: 'Prefilter', lotCode: 'L1', litresToTerminal: 869, litresLeft: 1000 }), want: { kind: 'run-terminal-dp', severity: 'critical', threshold: 'stage:0' } },
    { name: 'run: enough capacity', got: () => runTerminalAlert({ runId: 'r', stageIndex: 0, stageName: 'Prefilter', lotCode: 'L1', litresToTerminal: 1200, litresLeft: 1000 }), want: null },
    { name: 'run: forecast unknown', got: () => runTerminalAlert({ runId: 'r', stageIndex: 0, stageName: 'Prefilter', lotCode: 'L1', litresToTerminal: null, litresLeft: 1000 }), want: null },
    { name: 'run: non-finite forecast', got: () => runTerminalAlert({ runId: 'r', stageIndex: 0, stageName: 'Prefilter', lotCode: 'L1', litresToTerminal: Number.NaN, litresLeft: 1000 }), want: null },
    {
      name: 'flat ΔP on a membrane over 1,500 L',
      got: () => flatDpAlert({ runId: 'r', stageIndex: 1, stageName: 'Membrane', membrane: true, readings: [0, 500, 1000, 1500].map((v) => ({ volumeL: v, dpBar: 0.3 + v * 1e-6 })) }),
      want: { kind: 'stage-flat-dp', threshold: 'stage:1' },
    },
    { name: 'flat ΔP on a prefilter (not judged)', got: () => flatDpAlert({ runId: 'r', stageIndex: 0, stageName: 'Pre', membrane: false, readings: [0, 500, 1000, 1500].map((v) => ({ volumeL: v, dpBar: 0.3 })) }), want: null },
    { name: 'rising ΔP on a membrane', got: () => flatDpAlert({ runId: 'r', stageIndex: 1, stageName: 'M', membrane: true, readings: [0, 500, 1000, 1500].map((v) => ({ volumeL: v, dpBar: 0.3 + v * 1e-4 })) }), want: null },
    { name: 'flat ΔP over too few litres', got: () => flatDpAlert({ runId: 'r', stageIndex: 1, stageName: 'M', membrane: true, readings: [0, 100, 200, 300].map((v) => ({ volumeL: v, dpBar: 0.3 })) }), want: null },
    { name: 'flat ΔP with too few readings', got: () => flatDpAlert({ runId: 'r', stageIndex: 1, stageName: 'M', membrane: true, readings: [0, 2000, 4000].map((v) => ({ volumeL: v, dpBar: 0.3 })) }), want: null },
    { name: 'care: above the cartridge rating', got: () => careOverTemperatureAlert({ cartridgeId: 'c', serial: 'S', cycleId: 'e', tempC: 90, cartridgeMaxC: 85, housingMaxC: 135 }), want: { kind: 'care-over-temperature', threshold: 'cycle:e' } },
    { name: 'care: above the housing rating only', got: () => careOverTemperatureAlert({ cartridgeId: 'c', serial: 'S', cycleId: 'e', tempC: 90, cartridgeMaxC: 121, housingMaxC: 80 }), want: { kind: 'care-over-temperature' } },
    { name: 'care: within ratings', got: () => careOverTemperatureAlert({ cartridgeId: 'c', serial: 'S', cycleId: 'e', tempC: 85, cartridgeMaxC: 85, housingMaxC: 135 }), want: null },
    { name: 'care: no temperature logged', got: () => careOverTemperatureAlert({ cartridgeId: 'c', serial: 'S', cycleId: 'e', tempC: null, cartridgeMaxC: 85, housingMaxC: 135 }), want: null },
  ];
  it.each(cases)('$name', ({ got, want }) => {
    const result = got();
    if (want === null) expect(result).toBeNull();
    else {
      expect(result).toMatchObject(want);
      const r = result as { title: string; message: string; nextStep: string };
      for (const text of [r.title, r.message, r.nextStep]) {
        expect(text.length).toBeGreaterThan(5);
        expect(text).not.toMatch(/NaN|Infinity|undefined/);
      }
    }
  });

  it('the integrity alert says what to do in plain words', () => {
    expect(integrityAlert({ cartridgeId: 'c', serial: 'S1', latestPass: false })!.nextStep).toBe('Re-wet and re-test the membrane before filtering; do not bottle through it.');
  });

  it('the run alert states the shortfall in litres', () => {
    expect(runTerminalAlert({ runId: 'r', stageIndex: 0, stageName: 'Prefilter', lotCode: 'L1', litresToTerminal: 869, litresLeft: 1000 })!.title).toBe('Prefilter will block 131 L before L1 is done');
  });
});

describe('end of life', () => {
  it.each([
    [0.89, []],
    [0.9, ['budget:steam cycles:90']],
    [0.95, ['budget:steam cycles:90']],
    [1, ['budget:steam cycles:100']],
    [1.4, ['budget:steam cycles:100']],
    [null, []],
    [Number.NaN, []],
  ])('a budget %s used gives thresholds %j', (fraction, thresholds) => {
    expect(endOfLifeAlerts({ cartridgeId: 'c', serial: 'S', budgets: [{ factor: 'steam cycles', fraction }] }).map((a) => a.threshold)).toEqual(thresholds);
  });
  it('warns when the forecast ends before the next day that needs the cartridge', () => {
    const day = Date.UTC(2025, 5, 12);
    expect(endOfLifeAlerts({ cartridgeId: 'c', serial: 'S', budgets: [], estimatedEndMs: day - 1, nextPlannedDate: '2025-06-12' })).toMatchObject([{ threshold: 'forecast-before:2025-06-12' }]);
    expect(endOfLifeAlerts({ cartridgeId: 'c', serial: 'S', budgets: [], estimatedEndMs: day + 1, nextPlannedDate: '2025-06-12' })).toEqual([]);
    expect(endOfLifeAlerts({ cartridgeId: 'c', serial: 'S', budgets: [], estimatedEndMs: null, nextPlannedDate: '2025-06-12' })).toEqual([]);
  });

  // Common practice, no source: a set is sanitised once before each bottling run, and flow divides
  // over cartridges in parallel in proportion to their 10-inch equivalents. Check values by hand.
  it('a cartridge’s share of the next day that uses its housing: litres by 10-inch equivalents, one cycle per plan', () => {
    const uses = [
      { planId: 'p0', plannedDate: '2025-06-09', housingId: 'h1', volumeL: 99_000, setEquivalents: 9 }, // before today: ignored
      { planId: 'p1', plannedDate: '2025-06-12', housingId: 'h2', volumeL: 50_000, setEquivalents: 9 }, // another housing
      { planId: 'p2', plannedDate: '2025-06-14', housingId: 'h1', volumeL: 9_000, setEquivalents: 9 },
      { planId: 'p2', plannedDate: '2025-06-14', housingId: 'h1', volumeL: 4_500, setEquivalents: 9 }, // second lot, same plan
      { planId: 'p3', plannedDate: '2025-06-14', housingId: 'h1', volumeL: 3_000, setEquivalents: 6 }, // second plan that day
      { planId: 'p4', plannedDate: '2025-06-20', housingId: 'h1', volumeL: 20_000, setEquivalents: 9 }, // after the next day
    ];
    // 30-inch cartridge = 3 equivalents: 9000×3/9 + 4500×3/9 + 3000×3/6 = 3000 + 1500 + 1500 = 6000 L; two plans → two cycles.
    expect(cartridgeDayNeed({ housingId: 'h1', cartridgeEquivalents: 3, today: '2025-06-10', uses })).toEqual({ plannedDate: '2025-06-14', litres: 6000, cycles: 2 });
    expect(cartridgeDayNeed({ housingId: 'h9', cartridgeEquivalents: 3, today: '2025-06-10', uses })).toBeNull();
    // A set of unknown size: litres unknown, cycles still counted.
    expect(cartridgeDayNeed({ housingId: 'h1', cartridgeEquivalents: 3, today: '2025-06-10', uses: [{ ...uses[2], setEquivalents: null }] })).toEqual({ plannedDate: '2025-06-14', litres: null, cycles: 1 });
  });
  it('warns when the forecast’s cycles or litres left are fewer than the next day needs; once per cartridge and day', () => {
    const need = { plannedDate: '2025-06-14', litres: 6000, cycles: 2 };
    const base = { cartridgeId: 'c', serial: 'S', budgets: [] };
    expect(endOfLifeAlerts({ ...base, remainingCycles: 1, remainingLitres: 100_000, need })).toMatchObject([
      { threshold: 'forecast-before:2025-06-14', severity: 'warning', details: { remainingCycles: 1, cyclesNeeded: 2 } },
    ]);
    expect(endOfLifeAlerts({ ...base, remainingCycles: 5, remainingLitres: 5999, need })).toMatchObject([{ threshold: 'forecast-before:2025-06-14', details: { litresNeeded: 6000 } }]);
    // Both short, and the date too: still one alert for the cartridge and that day.
    expect(endOfLifeAlerts({ ...base, remainingCycles: 0, remainingLitres: 0, need, estimatedEndMs: 0, nextPlannedDate: '2025-06-14' })).toHaveLength(1);
    expect(endOfLifeAlerts({ ...base, remainingCycles: 2, remainingLitres: 6000, need })).toEqual([]);
    // The forecast does not know: no alert, never a guess.
    expect(endOfLifeAlerts({ ...base, remainingCycles: null, remainingLitres: null, need })).toEqual([]);
    expect(endOfLifeAlerts({ ...base, remainingCycles: null, remainingLitres: 10, need: { ...need, litres: null } })).toEqual([]);
  });
});

describe('run re-notices', () => {
  const t0 = 1_700_000_000_000;
  it.each([
    [{ shortL: 100, notifiedAtMs: t0 }, { shortL: 150, nowMs: t0 + 31 * 60_000 }, true],
    [{ shortL: 100, notifiedAtMs: t0 }, { shortL: 150, nowMs: t0 + 29 * 60_000 }, false],
    [{ shortL: 100, notifiedAtMs: t0 }, { shortL: 100.5, nowMs: t0 + 60 * 60_000 }, false],
    [{ shortL: 100, notifiedAtMs: t0 }, { shortL: 80, nowMs: t0 + 60 * 60_000 }, false],
  ])('%j then %j → %s', (prev, next, want) => {
    expect(shouldRenotifyRunAlert(prev, next)).toBe(want);
  });
});

describe('role defaults', () => {
  it.each([
    ['technician', 'integrity-failed', 'email'],
    ['technician', 'run-terminal-dp', 'email'],
    ['technician', 'stock-short', 'off'],
    ['cellar-master', 'stock-short', 'email'],
    ['owner', 'lot-not-ready', 'email'],
    ['winemaker', 'lot-not-ready', 'app'],
    ['auditor', 'integrity-failed', 'off'],
  ] as const)('%s / %s → %s', (role, kind, channel) => {
    expect(defaultAlertChannel(role, kind)).toBe(channel);
  });
});
