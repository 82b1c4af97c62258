import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { AuditKind } from '@shared/schemas/audit';
import { Pager } from '@/components/ui/pager';
import { Card } from '@/components/ui/card';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/session';
import { useAuditEvents } from '../api/get-audit-events';
import { EventEntry } from './event-entry';
import { formatDateTime } from '@/lib/dates';

const HISTORY_PAGE_SIZE = 8;

/**
 * A record's own history of changes from the change log (with those of its parts: a lot's lab
 * results and files, a cartridge's care, a plan's runs), newest first.
 */
export function HistoryPanel({ kind, recordId }: { kind: AuditKind; recordId: string }) {
  const canRead = useCan('audit:read');
  const [page, setPage] = useState(1);
  const events = useAuditEvents({ kind, recordId, page, pageSize: HISTORY_PAGE_SIZE }, { enabled: canRead && Boolean(recordId) });
  if (!canRead || !recordId) return null;
  const total = events.data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / HISTORY_PAGE_SIZE));
  return (
    <Card
      title="Change history"
      description="Who changed this record and when; entries are never edited or deleted."
      actions={
        <Link to={`${paths.recordsChanges}?kind=${kind}&recordId=${encodeURIComponent(recordId)}`} className="text-sm font-semibold text-primary-700 underline-offset-2 hover:underline">
          Open in the change log
        </Link>
      }
    >
      {events.isPending ? (
        <LoadingState variant="skeleton" lines={2} label="Loading the history …" />
      ) : events.isError ? (
        <ErrorState message={events.error.message} onRetry={() => events.refetch()} />
      ) : events.data.items.length === 0 ? (
        <p className="text-ink-600">No changes recorded yet.</p>
      ) : (
        <>
          <ol className="flex flex-col divide-y divide-ink-100" aria-label="Changes to this record">
            {events.data.items.map((e) => (
              <EventEntry key={e.id} event={e} at={formatDateTime(e.at)} showRecord={e.recordKind !== kind} max={5} className="flex flex-col gap-1 py-2" />
            ))}
          </ol>
          <Pager label="History pages" className="mt-2" size="sm" page={page} pages={pages} onPageChange={setPage} previous="Newer" next="Older">
            <span className="text-sm text-ink-700">
              {page} of {pages}
            </span>
          </Pager>
        </>
      )}
    </Card>
  );
}
