import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  DISPLAY_UNITS,
  METRIC_STORAGE_UNITS,
  QUANTITY_KINDS,
  costPerVolumeBasis,
  convert,
  formatDurationWords,
  formatNumber,
  MAX_DURATION_HOURS,
  formatQuantity,
  isKnownUnit,
  toMetric,
  toUserUnits,
  type UnitSystem,
} from './units';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('convert — exact and derived factors', () => {
  // Sources per row: NIST SP 811 (2008) App. B.8 (bar, mbar, kPa, atm, psi = 4.4482216152605 N / 0.0254² m²,
  // kgf/cm², cP); NIST Handbook 44 App. C (US gallon = 231 in³ = 3.785411784 L); SP 811 (litre, hL, ft, in, ft²);
  // derived rows are hand calculations from those exact factors (shown in the test name).
  it.each([
    [1, 'bar', 'Pa', 100000],
    [1, 'mbar', 'Pa', 100],
    [1, 'kPa', 'Pa', 1000],
    [1, 'atm', 'Pa', 101325],
    [1, 'psi', 'Pa', 6894.757293168],
    [1, 'psi', 'mbar', 68.94757293168],
    [1, 'bar', 'psi', 14.503773773],
    [1, 'kgf/cm^2', 'Pa', 98066.5],
    [1, 'L', 'm^3', 0.001],
    [1, 'hL', 'L', 100],
    [1, 'gal', 'L', 3.785411784],
    [1, 'hL', 'gal', 26.417205236], // 100/3.785411784
    [1, 'gal/min', 'L/h', 227.12470704], // 3.785411784 × 60
    [1, 'gpm', 'L/min', 3.785411784],
    [1, 'gal/min', 'm^3/h', 0.22712470704],
    [1, 'hL/h', 'gal/min', 0.440286754], // 100/227.12470704
    [1, 'L/h', 'm^3/s', 2.7777777778e-7], // 1e-3/3600
    [1, 'in', 'm', 0.0254],
    [1, 'ft', 'm', 0.3048],
    [1, 'ft^2', 'm^2', 0.09290304],
    [1, 'm^2', 'ft^2', 10.763910417], // 1/0.09290304
    [1, 'LMH', 'm/s', 2.7777777778e-7],
    [1, 'gfd', 'LMH', 1.697743056], // 3.785411784 / 0.09290304 / 24
    [1, 'gal/(ft^2 day)', 'L/(m^2 h)', 1.697743056],
    [1, 'cP', 'Pa s', 0.001],
    [1, 'cSt', 'mm^2/s', 1],
  ])('%f %s = %f %s', (v, from, to, expected) => {
    expect(rel(convert(v, from, to), expected)).toBeLessThan(1e-9);
  });

  // Source: NIST SP 811 (2008) §4.2.1.1: t/°C = (t/°F − 32)/1.8; T/K = t/°C + 273.15.
  it.each([
    [20, 'degC', 'degF', 68],
    [-40, 'degC', 'degF', -40],
    [32, 'degF', 'degC', 0],
    [212, 'degF', 'degC', 100],
    [20, 'degC', 'K', 293.15],
  ])('temperature %f %s = %f %s', (v, from, to, expected) => {
    expect(convert(v, from, to)).toBeCloseTo(expected, 10);
  });

  it('round-trips (property)', () => {
    const pairs: Array<[string, string]> = [
      ['bar', 'psi'],
      ['L', 'gal'],
      ['L/h', 'gal/min'],
      ['degC', 'degF'],
      ['m^2', 'ft^2'],
      ['LMH', 'gfd'],
    ];
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.constantFrom(...pairs), (v, [a, b]) => {
        expect(convert(convert(v, a, b), b, a)).toBeCloseTo(v, 6);
      }),
    );
  });

  it.each([
    [1, 'bar', 'L'],
    [1, 'furlongs-ish', 'm'],
    [NaN, 'bar', 'psi'],
    [Infinity, 'L', 'gal'],
  ])('rejects %f %s → %s with a RangeError', (v, from, to) => {
    expect(() => convert(v, from, to)).toThrow(RangeError);
  });

  it('knows the added units', () => {
    for (const u of ['gpm', 'LMH', 'gfd', 'cP', 'cSt', 'hL', 'L/h', 'gal/min', 'degC', 'degF', 'psi', 'bar', 'mbar', 'm^2', 'ft^2']) {
      expect(isKnownUnit(u)).toBe(true);
    }
    expect(isKnownUnit('not-a-unit')).toBe(false);
  });
});

describe('display helpers', () => {
  it('every storage and display unit is known to the converter and matches in kind', () => {
    for (const kind of QUANTITY_KINDS) {
      for (const system of ['metric', 'us'] as UnitSystem[]) {
        expect(Number.isFinite(convert(1, METRIC_STORAGE_UNITS[kind], DISPLAY_UNITS[system][kind].unit))).toBe(true);
      }
    }
  });

  // Source: hand calculation with NIST SP 811 / Handbook 44 factors (shown per row).
  it.each([
    ['pressure', 1.42, 'metric', '1.42 bar'],
    ['pressure', 2.5, 'us', '36.3 psi'], // 2.5 × 14.5038 = 36.26
    ['dp', 0.2142, 'metric', '0.214 bar'],
    ['dp', 1, 'us', '14.50 psi'],
    ['volume', 12500, 'metric', '12,500 L'],
    ['volume', 3785.411784, 'us', '1,000 gal'],
    ['flow', 6000, 'metric', '6,000 L/h'],
    ['flow', 6000, 'us', '26.4 gal/min'], // 6000/227.1247 = 26.417
    ['temperature', 20, 'metric', '20.0 °C'],
    ['temperature', 20, 'us', '68.0 °F'],
    ['area', 0.7, 'metric', '0.70 m²'],
    ['area', 0.7, 'us', '7.5 ft²'], // 0.7 × 10.7639 = 7.53
    ['flux', 1200, 'metric', '1,200 L/m²/h'],
    ['flux', 1697.743056, 'us', '1,000.0 gal/ft²/day'],
    ['length', 0.254, 'metric', '0.25 m'],
    ['length', 3.048, 'us', '10.00 ft'],
    ['loading', 2000, 'metric', '2,000 L/m²'],
    ['loading', 2000, 'us', '49.1 gal/ft²'], // 1 gal/ft² = 3.785411784 L / 0.09290304 m² = 40.7458 L/m²
  ] as const)('formatQuantity(%s, %f, %s) = %s', (kind, v, system, text) => {
    expect(formatQuantity(kind, v, system)).toBe(text);
  });

  it('honours digits and hectolitres', () => {
    expect(formatQuantity('pressure', 1.4242, 'metric', { digits: 3 })).toBe('1.424 bar');
    expect(formatQuantity('volume', 25000, 'metric', { hectolitres: true })).toBe('250.0 hL');
    expect(formatQuantity('volume', 2500, 'metric', { hectolitres: true })).toBe('2,500 L');
    expect(formatQuantity('volume', 25000, 'us', { hectolitres: true })).toBe('6,604 gal'); // 25000/3.785411784 = 6604.3
    expect(toUserUnits('volume', 25000, 'metric', { hectolitres: true })).toEqual({ value: 250, unit: 'hL' });
  });

  it('shows negative zero as zero', () => {
    expect(formatNumber(-0.0001, 2)).toBe('0.00');
    expect(formatNumber(-1234.5, 1)).toBe('-1,234.5');
  });

  it('toMetric inverts toUserUnits for every kind and system (property)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(...QUANTITY_KINDS),
        fc.constantFrom<UnitSystem>('metric', 'us'),
        fc.double({ min: -1e5, max: 1e5, noNaN: true }),
        (kind, system, v) => {
          const shown = toUserUnits(kind, v, system);
          expect(toMetric(kind, shown.value, system)).toBeCloseTo(v, 6);
        },
      ),
    );
  });

  // Source: NIST SP 811 (2008): 50 psi = 3.447378646584 bar; 100 °F = 37.777… °C; 10 gal/min = 2271.2470704 L/h.
  it.each([
    ['pressure', 50, 'us', 3.447378646584],
    ['temperature', 100, 'us', 37.77777777778],
    ['flow', 10, 'us', 2271.2470704],
    ['flow', 900, 'metric', 900],
  ] as const)('toMetric(%s, %f, %s) = %f', (kind, v, system, metric) => {
    expect(rel(toMetric(kind, v, system), metric)).toBeLessThan(1e-9);
  });

  it('rejects bad input', () => {
    expect(() => formatQuantity('pressure', NaN, 'metric')).toThrow(RangeError);
    expect(() => toMetric('pressure', 1, 'imperial' as UnitSystem)).toThrow(RangeError);
    expect(() => formatQuantity('speed' as never, 1, 'metric')).toThrow(RangeError);
    expect(() => formatQuantity('pressure', 1, 'metric', { digits: -1 })).toThrow(RangeError);
  });
});

describe('formatDurationWords (common practice, no source: durations never read like a clock)', () => {
  it.each([
    [0, 'under a minute'],
    [0.35, 'about 21 min'],
    [59 / 60, 'about 59 min'],
    [1, 'about 1 h'],
    [2 + 10 / 60, 'about 2 h 10 min'],
    [2 + 12 / 60, 'about 2 h 10 min'],
    [47.99, 'about 48 h'],
    [72, 'about 3 days'],
  ])('%s h → %s', (h, text) => {
    expect(formatDurationWords(h)).toBe(text);
  });

  it.each([Number.NaN, Infinity, -1, 1e6])('refuses %s', (h) => {
    expect(() => formatDurationWords(h)).toThrow(RangeError);
  });

  it('property: never a clock-like "h:mm" and never a non-finite word', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: MAX_DURATION_HOURS, noNaN: true }), (h) => {
        const s = formatDurationWords(h);
        expect(s).not.toMatch(/\d:\d/);
        expect(s).not.toMatch(/NaN|Infinity|e\+/);
      }),
    );
  });
});

describe('cost per volume in the person\'s units', () => {
  it('per hL in metric; per 100 US gal (378.5411784 L, NIST Handbook 44) in US customary', () => {
    expect(costPerVolumeBasis(1.2, 'metric')).toEqual({ value: 1.2, per: 'hL' });
    const us = costPerVolumeBasis(1.2, 'us');
    expect(us.per).toBe('100 gal');
    expect(us.value).toBeCloseTo(1.2 * 3.785411784, 12);
  });
});
