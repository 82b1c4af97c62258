import { Navigate, Outlet, useLocation } from 'react-router-dom';
import { AppShell } from '@/components/layouts/app-shell';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths, withNext } from '@/config/paths';
import { NotificationBell } from '@/features/alerts/components/notification-bell';
import { useMe } from '@/lib/session';

/** Signed-in area: sends visitors to sign-in (and back afterwards), frames pages in the shell. */
export function AppLayout() {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <LoadingState className="mt-24" />;
  if (me.isError && !me.data) return <ErrorState className="m-8" message={me.error.message} onRetry={() => me.refetch()} />;
  if (!me.data) return <Navigate to={withNext(paths.signIn, location.pathname + location.search)} replace />;
  return (
    <AppShell me={me.data} headerExtra={<NotificationBell />}>
      <Outlet context={me.data} />
    </AppShell>
  );
}
