import { Link } from 'react-router-dom';
import { Card } from '@/components/ui/card';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { useUnits } from '@/lib/units';
import { useCartridgeLots } from '../api/get-cartridge-lots';
import { formatDate } from '@/lib/dates';

/** The bottled lots this cartridge filtered, each opening its filtration record. */
export function FilteredLots({ id, serial }: { id: string; serial: string }) {
  const units = useUnits();
  const lots = useCartridgeLots(id, serial);
  return (
    <Card title="Lots it filtered" description="Bottled lots whose closed runs went through this cartridge.">
      {lots.isPending ? (
        <LoadingState />
      ) : lots.isError ? (
        <ErrorState title="The lots could not be loaded" message={errorMessage(lots.error)} onRetry={() => void lots.refetch()} />
      ) : lots.data.items.length === 0 ? (
        <p className="text-base text-ink-700">No bottled lot yet.</p>
      ) : (
        <ul className="flex flex-col gap-2">
          {lots.data.items.map((l) => (
            <li key={l.lotId}>
              <Link to={paths.record(l.lotId)} className="flex min-h-11 flex-wrap items-center justify-between gap-2 rounded-md border border-ink-200 p-3 hover:bg-ink-50">
                <span className="font-semibold text-ink-900 [overflow-wrap:anywhere]">
                  <span className="num">{l.code}</span> · {l.name}
                </span>
                <span className="num text-sm text-ink-700">
                  {units.format('volume', l.volumeFilteredL)} · bottled {formatDate(l.lastBottledAt)}
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
