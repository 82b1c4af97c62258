import { lazy, Suspense, type ComponentType } from 'react';
import { cn } from '@/utils/cn';

/**
 * A chart component loaded after the page has painted: the charting library is most of a
 * chart page's JavaScript, so forms and figures never wait for it. While it loads, an empty box
 * of the chart's height keeps the page from jumping. The one way Porewise pages show charts.
 */
export function lazyChart<P extends object>(load: () => Promise<ComponentType<P>>, heightClass: (props: P) => string) {
  const Loaded = lazy(() => load().then((component) => ({ default: component })));
  function LazyChart(props: P) {
    return (
      <Suspense fallback={<div className={cn('w-full', heightClass(props))} aria-hidden="true" />}>
        <Loaded {...props} />
      </Suspense>
    );
  }
  return LazyChart;
}
