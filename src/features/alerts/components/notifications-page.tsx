import { BellOff } from 'lucide-react';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { cn } from '@/utils/cn';
import { useNotifications } from '../api/get-notifications';
import { useMarkAllNotificationsRead } from '../api/mark-all-read';
import { NotificationItem } from './notification-item';

/** Every alert that reached the signed-in person in this winery: filter, open, mark read. */
export function NotificationsPage() {
  const [unread, setUnread] = useState(false);
  const [page, setPage] = useState(1);
  const list = useNotifications({ unread, page });
  const markAll = useMarkAllNotificationsRead();
  const pages = list.data ? Math.max(1, Math.ceil(list.data.total / list.data.pageSize)) : 1;
  const filters = [
    { value: false, label: 'All' },
    { value: true, label: `Unread${list.data ? ` (${list.data.unread})` : ''}` },
  ];

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Notifications"
        description={
          <>
            Alerts for you in this winery. Choose which reach you, and how, in <Link to={`${paths.settings}#alert-preferences`} className="font-semibold text-primary-700 underline">Settings</Link>.
          </>
        }
      />
      <Card
        flush
        actions={
          <Button size="sm" variant="secondary" loading={markAll.isPending} disabled={!list.data?.unread} onClick={() => markAll.mutate()}>
            Mark all read
          </Button>
        }
        title={
          <span role="group" aria-label="Show" className="inline-flex rounded border border-ink-200 p-0.5 text-sm">
            {filters.map((f) => (
              <button
                key={f.label}
                type="button"
                aria-pressed={unread === f.value}
                onClick={() => {
                  setUnread(f.value);
                  setPage(1);
                }}
                className={cn('min-h-9 rounded-sm px-3 font-semibold', unread === f.value ? 'bg-primary-600 text-white' : 'text-ink-700 hover:bg-ink-50')}
              >
                {f.label}
              </button>
            ))}
          </span>
        }
      >
        {list.isPending ? (
          <LoadingState className="p-4" />
        ) : list.isError ? (
          <ErrorState className="m-4" message={errorMessage(list.error)} onRetry={() => list.refetch()} />
        ) : list.data.items.length === 0 ? (
          <EmptyState className="m-4" icon={<BellOff aria-hidden="true" className="size-6" />} title={unread ? 'Nothing unread' : 'No alerts yet'}>
            Alerts appear here when a test fails, a cartridge nears the end of its life, a plan is short of stock or a lot is not ready.
          </EmptyState>
        ) : (
          <ul className="divide-y divide-ink-100 px-4">
            {list.data.items.map((item) => (
              <NotificationItem key={item.id} item={item} />
            ))}
          </ul>
        )}
        {pages > 1 ? (
          <div className="flex items-center justify-between border-t border-ink-200 px-4 py-2 text-sm">
            <Button size="sm" variant="ghost" disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>
              Newer
            </Button>
            <span className="num text-ink-600">
              Page {page} of {pages}
            </span>
            <Button size="sm" variant="ghost" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
              Older
            </Button>
          </div>
        ) : null}
      </Card>
    </div>
  );
}
