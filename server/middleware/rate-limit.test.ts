import { describe, expect, it } from 'vitest';
import { ACCOUNT_DELAY_MAX_MS, ACCOUNT_SLOWDOWN_AFTER, accountDelayMs } from './rate-limit';

describe('per-account sign-in slowdown (never a lockout)', () => {
  it('no delay up to the threshold, then a doubling delay capped at the maximum (common practice, no source)', () => {
    expect(accountDelayMs(0)).toBe(0);
    expect(accountDelayMs(ACCOUNT_SLOWDOWN_AFTER)).toBe(0);
    const delays = Array.from({ length: 8 }, (_, i) => accountDelayMs(ACCOUNT_SLOWDOWN_AFTER + 1 + i));
    for (let i = 1; i < delays.length; i += 1) expect(delays[i]).toBeGreaterThanOrEqual(delays[i - 1]);
    expect(delays[1]).toBe(delays[0] * 2);
    expect(accountDelayMs(10_000)).toBe(ACCOUNT_DELAY_MAX_MS);
    expect(Number.isFinite(accountDelayMs(Number.MAX_SAFE_INTEGER))).toBe(true);
  });

  it('scales the threshold with the test servers’ rate-limit scale', () => {
    expect(accountDelayMs(ACCOUNT_SLOWDOWN_AFTER * 100, 100)).toBe(0);
  });
});
