import { lazy, Suspense, useEffect, useState, type ComponentType } from 'react';
import { cn } from '@/utils/cn';

/**
 * A chart component loaded after the page has painted: the charting library is most of a
 * chart page's JavaScript, so forms and figures never wait for it. While it loads, an empty box
 * of the chart's height keeps the page from jumping. When it cannot be loaded (the signal went
 * while the page was opening), the box says so and the rest of the page works on; the chart is
 * fetched again once the browser is back online. The one way Porewise pages show charts.
 */
export function lazyChart<P extends object>(load: () => Promise<ComponentType<P>>, heightClass: (props: P) => string) {
  let failed = false;
  function Unavailable(props: P) {
    return (
      <div className={cn('flex w-full items-center justify-center rounded-md border border-dashed border-ink-300 px-4 text-center text-sm text-ink-600', heightClass(props))}>
        The chart loads when the connection is back. Everything else on this page works without it.
      </div>
    );
  }
  const loadOnce = () =>
    lazy<ComponentType<P>>(() =>
      load().then(
        (component) => ({ default: component }),
        () => {
          failed = true;
          return { default: Unavailable };
        },
      ),
    );
  let Loaded = loadOnce();
  function LazyChart(props: P) {
    const [, setAttempt] = useState(0);
    useEffect(() => {
      // The first chart to hear it fetches again; every chart on the page re-renders with it.
      const again = () => {
        if (failed) {
          failed = false;
          Loaded = loadOnce();
        }
        setAttempt((n) => n + 1);
      };
      window.addEventListener('online', again);
      return () => window.removeEventListener('online', again);
    }, []);
    return (
      <Suspense fallback={<div className={cn('w-full', heightClass(props))} aria-hidden="true" />}>
        <Loaded {...props} />
      </Suspense>
    );
  }
  return LazyChart;
}
