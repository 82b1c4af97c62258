import { CloudOff } from 'lucide-react';
import { useOnline } from '@/lib/offline/use-online';
import { formatDayMonthTime } from '@/lib/dates';

/** Offline: says that what the page shows was fetched earlier, and when. Nothing when online. */
export function FetchedAt({ at }: { at: number }) {
  const online = useOnline();
  if (online || !at) return null;
  const text = formatDayMonthTime(at);
  return (
    <p role="status" className="flex items-center gap-2 rounded border border-watch-200 bg-watch-50 px-3 py-2 text-sm text-ink-800" data-testid="fetched-at">
      <CloudOff aria-hidden="true" className="size-4 shrink-0 text-watch-700" />
      <span>
        Offline — showing what was last fetched, <span className="num font-semibold">{text}</span>.
      </span>
    </p>
  );
}
