import { lazyChart } from '@/components/ui/lazy-chart';

/** The stage's ΔP chart (`./stage-chart`), loaded after the page paints. */
export const StageChart = lazyChart(
  () => import('./stage-chart').then((m) => m.StageChart),
  (p) => (p.compact ? 'h-36' : 'h-56'),
);
