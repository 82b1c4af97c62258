import { CloudOff, OctagonX, RefreshCw, Wifi } from 'lucide-react';
import { useEffect, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { paths } from '@/config/paths';
import { flushOutbox, useOutbox } from '@/lib/offline/outbox-runtime';
import { useOnline } from '@/lib/offline/use-online';

const BACK_ONLINE_MS = 4000;

/** The shell's line about the connection: offline, back online, entries waiting or refused. */
export function OfflineBar() {
  const online = useOnline();
  const entries = useOutbox();
  const waiting = entries.filter((e) => e.status === 'waiting').length;
  const refused = entries.filter((e) => e.status === 'refused').length;
  const [backOnline, setBackOnline] = useState(false);
  const wasOffline = useRef(!online);
  useEffect(() => {
    if (!online) {
      wasOffline.current = true;
      setBackOnline(false);
      return;
    }
    if (!wasOffline.current) return;
    wasOffline.current = false;
    setBackOnline(true);
    const t = setTimeout(() => setBackOnline(false), BACK_ONLINE_MS);
    return () => clearTimeout(t);
  }, [online]);
  if (online && !backOnline && waiting === 0 && refused === 0) return null;
  const count = (n: number) => `${String(n)} ${n === 1 ? 'entry' : 'entries'}`;
  return (
    <div role="status" aria-live="polite" data-testid="offline-bar" className={online ? 'border-b border-ok-200 bg-ok-50' : 'border-b border-watch-200 bg-watch-100'}>
      <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-4 gap-y-1 px-4 py-2 text-sm text-ink-900">
        {online ? (
          backOnline ? (
            <span className="flex items-center gap-1.5 font-semibold">
              <Wifi aria-hidden="true" className="size-4 text-ok-700" /> Back online
            </span>
          ) : null
        ) : (
          <span className="flex items-center gap-1.5 font-semibold">
            <CloudOff aria-hidden="true" className="size-4 text-watch-700" /> Offline — what you save is kept on this device
          </span>
        )}
        {waiting > 0 ? (
          <Link to={paths.waiting} className="flex items-center gap-1.5 underline">
            <RefreshCw aria-hidden="true" className="size-4" /> {count(waiting)} waiting to send
          </Link>
        ) : null}
        {refused > 0 ? (
          <Link to={paths.waiting} className="flex items-center gap-1.5 font-semibold text-stop-700 underline">
            <OctagonX aria-hidden="true" className="size-4" /> {count(refused)} refused — check {refused === 1 ? 'it' : 'them'}
          </Link>
        ) : null}
        {online && waiting > 0 ? (
          <button type="button" className="min-h-11 underline sm:min-h-0" onClick={() => void flushOutbox()}>
            Send now
          </button>
        ) : null}
      </div>
    </div>
  );
}
