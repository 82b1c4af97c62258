import { Link } from 'react-router-dom';
import { cycleKindLabels, integrityTestLabels, type CycleKind, type IntegrityTestKind } from '@shared/schemas/care';
import type { CareEventDto } from '@shared/types/care';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { useUnits } from '@/lib/units';
import { FetchedAt } from '@/components/offline/fetched-at';
import { useCareRecent } from '../api/get-care-recent';
import { formatDayMonthTime } from '@/lib/dates';

const when = (iso: string) => formatDayMonthTime(iso);
const n = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? v : null);

function What({ e }: { e: CareEventDto }) {
  const units = useUnits();
  const d = e.details;
  if (e.kind === 'integrity') {
    const label = integrityTestLabels[d.test as IntegrityTestKind] ?? (typeof d.method === 'string' ? `${d.method.charAt(0).toUpperCase()}${d.method.slice(1)}` : 'Integrity test');
    return (
      <span className="inline-flex flex-wrap items-center gap-2">
        <span className="font-semibold">{label}</span>
        <StatusBadge tone={d.pass ? 'ok' : 'stop'} size="sm">
          {d.pass ? 'passed' : 'failed'}
        </StatusBadge>
      </span>
    );
  }
  const bits = [
    n(d.tempC) !== null ? units.format('temperature', n(d.tempC), 0) : null,
    n(d.durationMin) !== null ? `${n(d.durationMin)} min` : null,
    typeof d.agent === 'string' ? `${d.agent}${n(d.concentrationPct) !== null ? ` ${n(d.concentrationPct)} %` : ''}` : null,
  ].filter(Boolean);
  return (
    <span>
      <span className="font-semibold">{cycleKindLabels[d.kind as CycleKind] ?? 'Care cycle'}</span>
      {bits.length ? <span className="text-ink-700"> · {bits.join(' · ')}</span> : null}
    </span>
  );
}

/** The winery's latest cycles and tests, newest first. */
export function RecentCare() {
  const recent = useCareRecent();
  return (
    <Card title="Recent care" description="The latest 30 cycles and tests, newest first.">
      <FetchedAt at={recent.dataUpdatedAt} />
      {recent.isPending ? (
        <LoadingState label="Loading recent care …" />
      ) : recent.isError ? (
        <ErrorState message={errorMessage(recent.error)} onRetry={() => void recent.refetch()} />
      ) : recent.data.items.length === 0 ? (
        <EmptyState title="No care logged yet">Find a cartridge above and log its first sanitation cycle or integrity test.</EmptyState>
      ) : (
        <ul className="flex flex-col divide-y divide-ink-100" aria-label="Recent care">
          {recent.data.items.map((e) => (
            <li key={e.id} className="flex flex-col gap-0.5 py-2.5">
              <What e={e} />
              <span className="text-sm text-ink-600">
                <Link to={paths.cartridge(e.cartridgeId)} className="num inline-flex min-h-touch items-center font-medium text-primary-700 underline-offset-2 hover:underline sm:min-h-0">
                  {e.serial}
                </Link>{' '}
                · {e.typeName} · {e.actorName ?? 'former member'} · <time dateTime={e.at}>{when(e.at)}</time>
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
