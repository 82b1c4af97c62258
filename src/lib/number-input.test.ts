import { describe, expect, it } from 'vitest';
import { ambiguousReading, localeDecimalMark, parseNumberText } from './number-input';

// Decimal marks and digit grouping: ISO 80000-1 §7.3.1 allows a point or a comma as the decimal
// sign; English-speaking countries group with "," and much of Europe with "." or a space
// (common practice; Unicode CLDR locale data for en-US "1,234.5" and fr-FR "1 234,5").
describe('parseNumberText with a decimal point', () => {
  it.each<[string, number | null]>([
    ['3,000', 3000],
    ['12,500.5', 12500.5],
    ['3,5', 3.5],
    ['3.5', 3.5],
    ['0.45', 0.45],
    [' 1 234.5 ', 1234.5],
    ['', null],
    ['-2.5', -2.5],
  ])('%s → %s', (text, value) => expect(parseNumberText(text, '.')).toBe(value));
  it('refuses what is not a number', () => {
    expect(parseNumberText('3,0,0', '.')).toBeNaN();
    expect(parseNumberText('abc', '.')).toBeNaN();
    expect(parseNumberText('1.2.3', '.')).toBeNaN();
  });
});

describe('parseNumberText with a decimal comma', () => {
  it.each<[string, number | null]>([
    ['3,000', 3],
    ['3,5', 3.5],
    ['3.000', 3000],
    ['12.500,5', 12500.5],
    ['3.25', 3.25],
    ['1 234,5', 1234.5],
    ['1\u00a0234,5', 1234.5],
  ])('%s → %s', (text, value) => expect(parseNumberText(text, ',')).toBe(value));
});

describe('ambiguous entries say how they were read', () => {
  it('"3,000" and "3.000" could be either', () => {
    expect(ambiguousReading('3,000', '.')).toBe('Read as 3000.');
    expect(ambiguousReading('3,000', ',')).toBe('Read as 3 (decimal comma).');
    expect(ambiguousReading('3.000', ',')).toBe('Read as 3000 (decimal comma).');
  });
  it('plain entries are not flagged', () => {
    expect(ambiguousReading('3,5', '.')).toBeNull();
    expect(ambiguousReading('3000', '.')).toBeNull();
    expect(ambiguousReading('12,500.5', '.')).toBeNull();
  });
});

describe('localeDecimalMark (Unicode CLDR data through Intl)', () => {
  it('en-US uses a point, fr-FR and de-DE a comma', () => {
    expect(localeDecimalMark('en-US')).toBe('.');
    expect(localeDecimalMark('fr-FR')).toBe(',');
    expect(localeDecimalMark('de-DE')).toBe(',');
  });
});
