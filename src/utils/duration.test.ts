import { describe, expect, it } from 'vitest';
import { formatDuration } from './duration';

describe('formatDuration', () => {
  it('never reads like a clock', () => {
    expect(formatDuration({ hours: 0, minutes: 21 })).toBe('21 min');
    expect(formatDuration({ hours: 2, minutes: 5 })).toBe('2 h 05 min');
    expect(formatDuration({ hours: 3, minutes: 0 })).toBe('3 h');
    expect(formatDuration({ hours: 0, minutes: 0 })).toBe('under 1 min');
    expect(formatDuration({ hours: 1200, minutes: 7 })).toBe('1,200 h 07 min');
  });
  it('says nothing for impossible spans', () => {
    expect(formatDuration({ hours: Number.NaN, minutes: 0 })).toBe('—');
    expect(formatDuration({ hours: -1, minutes: 0 })).toBe('—');
    expect(formatDuration({ hours: Number.POSITIVE_INFINITY, minutes: 0 })).toBe('—');
  });
});
