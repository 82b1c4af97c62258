import { onlineManager } from '@tanstack/react-query';

/** How often Porewise asks whether it can be reached again, once a request found it could not. */
export const REACHABILITY_PROBE_MS = 5_000;

let probe: ReturnType<typeof setTimeout> | null = null;

/**
 * A request found no way to the server although the browser still says it is online (a cellar's
 * weak signal that keeps the radio up, or a browser that does not tell): the app counts itself
 * offline — pages show what was last fetched, queries wait — and asks `/api/health` every few
 * seconds until it answers (or the browser's own "online" event comes first).
 */
export function noteUnreachable(): void {
  if (!onlineManager.isOnline()) return;
  onlineManager.setOnline(false);
  scheduleProbe();
}

/** A request got an answer from the server: the app is online. */
export function noteReachable(): void {
  if (!onlineManager.isOnline()) onlineManager.setOnline(true);
}

function scheduleProbe() {
  if (probe) return;
  probe = setTimeout(() => {
    probe = null;
    if (onlineManager.isOnline()) return;
    fetch('/api/health', { cache: 'no-store', credentials: 'same-origin' })
      .then((res) => (res.ok ? noteReachable() : scheduleProbe()))
      .catch(() => scheduleProbe());
  }, REACHABILITY_PROBE_MS);
}
