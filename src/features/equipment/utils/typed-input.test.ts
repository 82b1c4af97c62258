import { describe, expect, it } from 'vitest';
import { toMetric } from '@shared/engine';
import { parseTyped, typedOptionalQuantity, typedQuantity } from './typed-input';

const usInput = (kind: Parameters<typeof toMetric>[0], typed: number) => toMetric(kind, typed, 'us');

describe('parseTyped', () => {
  it.each([
    ['', undefined],
    ['  ', undefined],
    ['12', 12],
    ['12.5', 12.5],
    ['12,5', 12.5],
    ['3,000', 3000],
    ['1,250.5', 1250.5],
    ['-3', -3],
    ['lots', Number.NaN],
    ['1.2.3', Number.NaN],
  ])('%j → %s', (text, expected) => {
    expect(parseTyped(text)).toEqual(expected);
  });
});

describe('typed quantities in the person’s units', () => {
  it('converts psi and °F to the stored bar and °C', () => {
    expect(typedQuantity(usInput, 'pressure', '14.5038')).toBeCloseTo(1, 4);
    expect(typedQuantity(usInput, 'temperature', '212')).toBeCloseTo(100, 9);
  });
  it('keeps empty and unreadable fields apart (required message vs number message)', () => {
    expect(typedQuantity(usInput, 'pressure', '')).toBeUndefined();
    expect(typedQuantity(usInput, 'pressure', 'abc')).toBeNaN();
    expect(typedOptionalQuantity(usInput, 'volume', '')).toBeNull();
  });
});
