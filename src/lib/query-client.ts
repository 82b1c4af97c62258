import { onlineManager, QueryClient } from '@tanstack/react-query';
import { ApiError } from './api-client';

export function createQueryClient() {
  // Start from the browser's own word (a page opened offline knows at once), then follow its events.
  if (typeof navigator !== 'undefined' && typeof navigator.onLine === 'boolean') onlineManager.setOnline(navigator.onLine);
  return new QueryClient({
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        // Kept long enough to be saved to IndexedDB and shown offline later.
        gcTime: 7 * 24 * 60 * 60 * 1000,
        refetchOnWindowFocus: false,
        retry: (count, error) => !(error instanceof ApiError && error.status >= 400 && error.status < 500) && count < 2,
      },
      mutations: { retry: false },
    },
  });
}
