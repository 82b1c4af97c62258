import { describe, expect, it } from 'vitest';
import { bestOf } from './option-comparison';

// Which option is best on a row (common practice, no source): the lowest cost, time, flux or ΔP,
// the highest capacity or margin; nothing is marked when fewer than two are known or all agree.
describe('bestOf', () => {
  it('marks the lowest or the highest, ties included', () => {
    expect(bestOf([3, 1, 2], 'lower')).toEqual([false, true, false]);
    expect(bestOf([3, 1, 3], 'higher')).toEqual([true, false, true]);
  });
  it('marks nothing when the options agree, when fewer than two are known, or for a row that is not ranked', () => {
    expect(bestOf([2, 2, 2], 'lower')).toEqual([false, false, false]);
    expect(bestOf([2, null, null], 'lower')).toEqual([false, false, false]);
    expect(bestOf([1, 2], null)).toEqual([false, false]);
  });
  it('leaves an unknown figure out of the ranking', () => {
    expect(bestOf([null, 5, 4], 'higher')).toEqual([false, true, false]);
    expect(bestOf([Number.NaN, 5, 4], 'lower')).toEqual([false, false, true]);
  });
});
