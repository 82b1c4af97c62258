import type { ReactNode } from 'react';
import { CloudOff, LoaderCircle, OctagonX, RotateCcw } from 'lucide-react';
import { useOnline } from '@/lib/offline/use-online';
import { cn } from '@/utils/cn';
import { Button } from './button';

export interface LoadingStateProps {
  /** Visible text; default "Loading …". */
  label?: string;
  /** spinner (default) or skeleton lines standing in for content. */
  variant?: 'spinner' | 'skeleton';
  /** Number of skeleton lines. Default 3. */
  lines?: number;
  className?: string;
}

/** What shows instead of a spinner when there is no connection and nothing was kept for this page. */
export function OfflineState({ className }: { className?: string }) {
  return (
    <div role="status" className={cn('flex gap-3 rounded border border-watch-200 bg-watch-50 px-4 py-3', className)}>
      <CloudOff aria-hidden="true" className="mt-0.5 size-5 shrink-0 text-watch-700" />
      <div className="min-w-0 flex-1">
        <p className="text-base font-semibold text-ink-900">You are offline — this page was not opened before</p>
        <p className="mt-0.5 text-sm text-ink-800">It loads by itself when the connection is back. Pages opened before show what they last fetched.</p>
        <Button variant="secondary" size="md" className="mt-3" icon={<RotateCcw />} onClick={() => window.location.reload()}>
          Try again
        </Button>
      </div>
    </div>
  );
}

export function LoadingState({ label = 'Loading …', variant = 'spinner', lines = 3, className }: LoadingStateProps) {
  const online = useOnline();
  if (!online) return <OfflineState className={className} />;
  if (variant === 'skeleton') {
    return (
      <div role="status" aria-live="polite" className={cn('flex flex-col gap-2.5 py-2', className)}>
        <span className="sr-only">{label}</span>
        {Array.from({ length: lines }, (_, i) => (
          <div
            key={i}
            aria-hidden="true"
            className="h-4 animate-pulse rounded-sm bg-ink-200"
            style={{ width: `${[92, 78, 64, 85, 70][i % 5]}%` }}
          />
        ))}
      </div>
    );
  }
  return (
    <div
      role="status"
      aria-live="polite"
      className={cn('flex items-center justify-center gap-2 py-8 text-base text-ink-600', className)}
    >
      <LoaderCircle aria-hidden="true" className="size-5 animate-spin text-primary-600" />
      <span>{label}</span>
    </div>
  );
}

export interface ErrorStateProps {
  title?: ReactNode;
  /** What went wrong and what to do next. */
  message: ReactNode;
  /** Shows a "Try again" button. */
  onRetry?: () => void;
  retryLabel?: string;
  className?: string;
}

export function ErrorState({
  title = 'This could not be loaded',
  message,
  onRetry,
  retryLabel = 'Try again',
  className,
}: ErrorStateProps) {
  return (
    <div role="alert" className={cn('flex gap-3 rounded border border-stop-200 bg-stop-50 px-4 py-3', className)}>
      <OctagonX aria-hidden="true" className="mt-0.5 size-5 shrink-0 text-stop-600" />
      <div className="min-w-0 flex-1">
        <p className="text-base font-semibold text-stop-800">{title}</p>
        <div className="mt-0.5 text-sm text-ink-800">{message}</div>
        {onRetry ? (
          <Button variant="secondary" size="md" className="mt-3" icon={<RotateCcw />} onClick={onRetry}>
            {retryLabel}
          </Button>
        ) : null}
      </div>
    </div>
  );
}
