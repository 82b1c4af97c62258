import { onlineManager } from '@tanstack/react-query';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { noteReachable, noteUnreachable, REACHABILITY_PROBE_MS } from './reachability';

afterEach(() => {
  vi.useRealTimers();
  vi.unstubAllGlobals();
  onlineManager.setOnline(true);
});

describe('reachability (a weak signal the browser still calls online)', () => {
  it('counts the app offline after a failed request and online again once /api/health answers', async () => {
    vi.useFakeTimers();
    const answers = [new TypeError('Failed to fetch'), new Response('{}', { status: 200 })];
    const fetch = vi.fn(async () => {
      const next = answers.shift();
      if (next instanceof Error) throw next;
      return next!;
    });
    vi.stubGlobal('fetch', fetch);
    onlineManager.setOnline(true);
    noteUnreachable();
    expect(onlineManager.isOnline()).toBe(false);
    await vi.advanceTimersByTimeAsync(REACHABILITY_PROBE_MS); // first probe: still no way through
    expect(onlineManager.isOnline()).toBe(false);
    await vi.advanceTimersByTimeAsync(REACHABILITY_PROBE_MS); // second probe answers
    expect(onlineManager.isOnline()).toBe(true);
    expect(fetch).toHaveBeenCalledTimes(2);
    expect(fetch.mock.calls[0]).toEqual(['/api/health', { cache: 'no-store', credentials: 'same-origin' }]);
  });

  it('an answer from the server counts as online at once', () => {
    onlineManager.setOnline(false);
    noteReachable();
    expect(onlineManager.isOnline()).toBe(true);
  });
});
