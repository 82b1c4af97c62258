import { PersistQueryClientProvider } from '@tanstack/react-query-persist-client';
import { Component, useEffect, useState, type ErrorInfo, type ReactNode } from 'react';
import { ErrorState } from '@/components/ui/states';
import { ToastProvider } from '@/components/ui/toast';
import { setDateLocale, useDateLocale } from '@/lib/dates';
import { startOutbox } from '@/lib/offline/outbox-runtime';
import { CACHE_MAX_AGE_MS, createCachePersister } from '@/lib/offline/query-persister';
import { createQueryClient } from '@/lib/query-client';
import { sessionKeys } from '@/lib/session';

class ErrorBoundary extends Component<{ children: ReactNode }, { error: Error | null }> {
  override state = { error: null as Error | null };
  static getDerivedStateFromError(error: Error) {
    return { error };
  }
  override componentDidCatch(error: Error, info: ErrorInfo) {
    console.error(error, info.componentStack);
  }
  override render() {
    if (this.state.error) {
      return (
        <ErrorState
          className="m-8"
          title="Porewise ran into a problem"
          message="Reload the page. What you saved is safe on the server."
          onRetry={() => window.location.reload()}
          retryLabel="Reload"
        />
      );
    }
    return this.props.children;
  }
}

/**
 * Only successful answers are kept, and "nobody signed in" never is: a page reloaded right
 * after signing in must not come back signed out from a kept answer.
 */
function keepQuery(query: { queryKey: readonly unknown[]; state: { status: string; data: unknown } }) {
  if (query.state.status !== 'success') return false;
  return !(query.queryKey[0] === sessionKeys.all[0] && query.queryKey[1] === 'me' && query.state.data === null);
}

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(createQueryClient);
  // The cache is kept in IndexedDB, so pages opened before show their last data offline.
  const [persister] = useState(createCachePersister);
  useEffect(() => startOutbox(queryClient), [queryClient]);
  // Dates in the person's language: English is there at once; another language loads, then the
  // screens are drawn again once (keyed below) so every date reads the same way.
  const dateTag = useDateLocale();
  useEffect(() => void setDateLocale(), []);
  return (
    <ErrorBoundary>
      <PersistQueryClientProvider
        client={queryClient}
        persistOptions={{ persister, maxAge: CACHE_MAX_AGE_MS, buster: 'porewise-1', dehydrateOptions: { shouldDehydrateQuery: keepQuery } }}
        // Kept data shows at once, then everything is asked again (when there is a connection):
        // opening or reloading the page always brings fresh figures and who is signed in.
        onSuccess={() => void queryClient.invalidateQueries()}
      >
        <ToastProvider key={dateTag}>{children}</ToastProvider>
      </PersistQueryClientProvider>
    </ErrorBoundary>
  );
}
