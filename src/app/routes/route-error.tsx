import { isRouteErrorResponse, Link, useRouteError } from 'react-router-dom';
import { ErrorState, OfflineState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { useOnline } from '@/lib/offline/use-online';

/** A page's code that could not be fetched (offline, or replaced by a newer version). */
function isChunkError(error: unknown) {
  const message = error instanceof Error ? error.message : String(error);
  return /dynamically imported module|Importing a module script failed|Failed to fetch|error loading dynamically|ChunkLoadError|Load failed/i.test(message);
}

/**
 * Every route's error boundary: never the router's raw error page. Offline → the offline
 * message with a retry; a page's code missing → reload; anything else → the error in plain words.
 */
export function RouteError() {
  const error = useRouteError();
  const online = useOnline();
  if (isRouteErrorResponse(error) && error.status === 404) {
    return (
      <ErrorState
        className="m-4"
        title="Page not found"
        message={
          <Link to={paths.home} className="font-semibold text-primary-700 underline">
            Go to Porewise
          </Link>
        }
      />
    );
  }
  if (!online || (isChunkError(error) && !navigator.onLine)) return <OfflineState className="m-4" />;
  if (isChunkError(error)) {
    return (
      <ErrorState
        className="m-4"
        title="This page could not be opened"
        message="Porewise may have been updated, or the connection dropped. Reload to get the current version."
        onRetry={() => window.location.reload()}
        retryLabel="Reload"
      />
    );
  }
  console.error(error);
  return (
    <ErrorState
      className="m-4"
      title="Porewise ran into a problem on this page"
      message={`${error instanceof Error ? error.message : 'Something went wrong.'} What you saved is safe; entries waiting to send stay on this device.`}
      onRetry={() => window.location.reload()}
      retryLabel="Reload"
    />
  );
}
