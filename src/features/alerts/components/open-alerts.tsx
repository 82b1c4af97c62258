import { Link } from 'react-router-dom';
import { Card } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { useNotifications } from '../api/get-notifications';
import { NotificationItem } from './notification-item';

/** Today's open alerts for the person (unread and not yet cleared), the most recent first. */
export function OpenAlerts({ max = 5 }: { max?: number }) {
  const list = useNotifications({ unread: true, page: 1 });
  const open = (list.data?.items ?? []).filter((i) => i.clearedAt === null);
  if (!open.length) return null;
  return (
    <Card
      title="Open alerts"
      description="Conditions that hold now and need someone to act."
      actions={
        <Link to={paths.notifications} className="inline-flex min-h-11 items-center text-sm font-semibold text-primary-700 underline">
          All notifications
        </Link>
      }
    >
      <ul className="divide-y divide-ink-100">
        {open.slice(0, max).map((item) => (
          <NotificationItem key={item.id} item={item} compact />
        ))}
      </ul>
    </Card>
  );
}
