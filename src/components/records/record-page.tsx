// The frame of a page that shows one record (a lot, a plan): the link back to its list, and
// what stands in for the record when it cannot be read (not found, or an error to retry).
import { ArrowLeft } from 'lucide-react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState } from '@/components/ui/states';
import { ApiError, errorMessage } from '@/lib/api-client';
import { cn } from '@/utils/cn';

/** "← Cellar": back to the list the record belongs to (or the page this one came from). `className`: its height and extras. */
export function BackLink({ to, children, className = 'min-h-9 underline-offset-2' }: { to: string; children: ReactNode; className?: string }) {
  return (
    <Link to={to} className={cn('inline-flex items-center gap-1 text-primary-700 hover:underline', className)}>
      <ArrowLeft aria-hidden="true" className="size-4" />
      {children}
    </Link>
  );
}

/** The record could not be read: "not found" for a 404 (deleted or another winery's), else the error with a retry. */
export function RecordLoadFailed({ back, notFoundTitle, error, onRetry }: { back: ReactNode; notFoundTitle: string; error: unknown; onRetry: () => void }) {
  return (
    <div className="flex flex-col gap-4">
      <div className="text-sm">{back}</div>
      {error instanceof ApiError && error.status === 404 ? (
        <EmptyState title={notFoundTitle}>It may have been deleted, or it belongs to another winery.</EmptyState>
      ) : (
        <ErrorState message={errorMessage(error)} onRetry={onRetry} />
      )}
    </div>
  );
}
