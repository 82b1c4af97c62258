/**
 * Thinning a long series of points for a chart, keeping its shape: the first and the last point,
 * every point the caller marks to keep (e.g. corrected or voided readings), and in each of equal
 * buckets of the rest the lowest and the highest point (min/max per bucket, a common practice for
 * drawing long time series; no source). Pure; answers the kept items in their original order.
 * A series already within `max` points comes back whole.
 */
export function thinSeries<T>(items: readonly T[], opts: { max: number; y: (item: T) => number; keep?: (item: T) => boolean }): T[] {
  const n = items.length;
  const max = Math.max(2, Math.floor(opts.max));
  if (n <= max) return [...items];
  const kept = new Set<number>([0, n - 1]);
  if (opts.keep) items.forEach((item, i) => (opts.keep?.(item) ? kept.add(i) : undefined));
  const rest: number[] = [];
  for (let i = 1; i < n - 1; i++) if (!kept.has(i)) rest.push(i);
  const budget = max - kept.size;
  if (budget >= 2 && rest.length > 0) {
    const buckets = Math.max(1, Math.floor(budget / 2));
    const size = rest.length / buckets;
    for (let b = 0; b < buckets; b++) {
      const from = Math.floor(b * size);
      const to = Math.min(rest.length, Math.floor((b + 1) * size));
      if (to <= from) continue;
      let lo = rest[from];
      let hi = rest[from];
      for (let k = from + 1; k < to; k++) {
        const i = rest[k];
        const y = opts.y(items[i]);
        if (y < opts.y(items[lo])) lo = i;
        if (y > opts.y(items[hi])) hi = i;
      }
      kept.add(lo);
      kept.add(hi);
    }
  }
  return [...kept].sort((a, b) => a - b).map((i) => items[i]);
}

/** Chart points a run page gets at most over all its stages (plus every corrected or voided reading). */
export const CHART_POINTS_MAX = 300;
/** A stage's share of the chart points: the run's budget split evenly, never below 50 per stage. */
export const chartPointsPerStage = (stageCount: number) => Math.max(50, Math.floor(CHART_POINTS_MAX / Math.max(1, stageCount)));
