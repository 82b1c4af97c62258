import { ArrowRight } from 'lucide-react';
import { useNavigate } from 'react-router-dom';
import type { NotificationDto } from '@shared/types/alerts';
import { alertKindLabels } from '@shared/engine';
import { Button } from '@/components/ui/button';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import { cn } from '@/utils/cn';
import { useMarkNotificationRead } from '../api/mark-read';
import { formatDayMonthTime } from '@/lib/dates';

const severityTone: Record<NotificationDto['severity'], StatusTone> = { critical: 'stop', warning: 'watch', info: 'info' };
const severityWord: Record<NotificationDto['severity'], string> = { critical: 'Urgent', warning: 'Warning', info: 'Note' };

/** One alert: severity, what happened, the next step in plain words, and the way to the record. */
export function NotificationItem({ item, compact = false }: { item: NotificationDto; compact?: boolean }) {
  const navigate = useNavigate();
  const markRead = useMarkNotificationRead();
  const unread = item.readAt === null;
  const open = () => {
    if (unread) markRead.mutate(item.id);
    navigate(item.link);
  };
  return (
    <li className={cn('flex flex-col gap-2 py-3 sm:flex-row sm:items-start sm:justify-between', unread && 'border-l-4 border-l-primary-600 pl-3')} data-testid="notification">
      <div className="min-w-0 flex-1">
        <div className="flex flex-wrap items-center gap-2">
          <StatusBadge tone={item.clearedAt ? 'ok' : severityTone[item.severity]} size="sm">
            {item.clearedAt ? 'Cleared' : severityWord[item.severity]}
          </StatusBadge>
          <span className="text-xs text-ink-600">{alertKindLabels[item.kind]}</span>
          <time className="text-xs text-ink-500" dateTime={item.openedAt}>
            {formatDayMonthTime(item.openedAt)}
          </time>
          {unread ? <span className="text-xs font-semibold text-primary-800">Unread</span> : null}
        </div>
        <p className={cn('mt-1 text-ink-950', unread ? 'font-semibold' : 'font-normal')}>{item.title}</p>
        {compact ? null : <p className="text-sm text-ink-700">{item.message}</p>}
        <p className="mt-1 text-sm text-ink-800">
          <span className="font-semibold">Next step: </span>
          {item.nextStep}
        </p>
        {item.clearedAt ? <p className="text-xs text-ink-600">The condition cleared on {formatDayMonthTime(item.clearedAt)}.</p> : null}
      </div>
      <div className="flex shrink-0 flex-wrap gap-2">
        <Button size="sm" variant="secondary" onClick={open} icon={<ArrowRight aria-hidden="true" className="size-4" />}>
          Open record
        </Button>
        {unread && !compact ? (
          <Button size="sm" variant="ghost" loading={markRead.isPending} onClick={() => markRead.mutate(item.id)}>
            Mark read
          </Button>
        ) : null}
      </div>
    </li>
  );
}
