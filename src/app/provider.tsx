import { QueryClientProvider } from '@tanstack/react-query';
import { Component, useState, type ErrorInfo, type ReactNode } from 'react';
import { ErrorState } from '@/components/ui/states';
import { ToastProvider } from '@/components/ui/toast';
import { createQueryClient } from '@/lib/query-client';

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

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(createQueryClient);
  return (
    <ErrorBoundary>
      <QueryClientProvider client={queryClient}>
        <ToastProvider>{children}</ToastProvider>
      </QueryClientProvider>
    </ErrorBoundary>
  );
}
