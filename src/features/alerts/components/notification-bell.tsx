import { Bell } from 'lucide-react';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { useUnreadNotifications } from '../api/get-notifications';

/** The bell in the shell: unread alerts of this winery, linking to the notifications page. */
export function NotificationBell() {
  const unread = useUnreadNotifications();
  const count = unread.data?.unread ?? 0;
  const label = count === 0 ? 'Notifications, none unread' : `Notifications, ${count} unread`;
  return (
    <Link
      to={paths.notifications}
      aria-label={label}
      title={label}
      data-testid="notification-bell"
      className="relative inline-flex size-11 items-center justify-center rounded text-ink-700 hover:bg-ink-50 hover:text-ink-900"
    >
      <Bell aria-hidden="true" className="size-5" />
      {count > 0 ? (
        <span data-testid="unread-count" className="num absolute top-1 right-0.5 min-w-5 rounded-full bg-stop-600 px-1 text-center text-xs leading-5 font-semibold text-white">
          {count > 99 ? '99+' : count}
        </span>
      ) : null}
    </Link>
  );
}
