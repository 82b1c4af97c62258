import { ChevronLeft, ChevronRight } from 'lucide-react';
import { Link } from 'react-router-dom';
import { wineStyleLabels } from '@shared/schemas/cellar';
import type { LotListItemDto } from '@shared/types/cellar';
import { Pager } from '@/components/ui/pager';
import { paths } from '@/config/paths';
import { FixedQuantity, MetricQuantity } from './metric-quantity';
import { ReadinessBadge } from '@/components/status/readiness-badge';

/** The lots table as one column of cards for phones: the verdict and the figures that matter, each a link to the lot. */
export function LotsPhoneList({
  lots,
  page,
  pageSize,
  total,
  onPageChange,
  empty,
}: {
  lots: LotListItemDto[];
  page: number;
  pageSize: number;
  total: number;
  onPageChange: (page: number) => void;
  empty: string;
}) {
  const pages = Math.max(1, Math.ceil(total / pageSize));
  if (lots.length === 0) return <p className="rounded border border-ink-200 bg-white px-3 py-6 text-center text-ink-600">{empty}</p>;
  return (
    <div className="flex flex-col gap-2">
      <ul className="flex flex-col gap-2" aria-label="Wine lots">
        {lots.map((l) => (
          <li key={l.id}>
            <Link to={paths.lot(l.id)} className="block rounded border border-ink-200 bg-white px-3 py-2.5 hover:border-ink-300 active:bg-ink-50">
              <span className="flex items-start justify-between gap-2">
                <span className="min-w-0">
                  <span className="block font-semibold text-primary-700">{l.code}</span>
                  <span className="block truncate text-ink-900">{l.name}</span>
                </span>
                <ReadinessBadge verdict={l.readiness.verdict} size="sm" />
              </span>
              <span className="mt-1 flex flex-wrap gap-x-3 gap-y-0.5 text-sm text-ink-700">
                <span>
                  {wineStyleLabels[l.style]} {l.vintage ?? 'NV'}
                </span>
                <MetricQuantity kind="volume" value={l.volumeL} />
                {l.tank ? <span>{l.tank.name}</span> : null}
              </span>
              {l.latest ? (
                <span className="mt-1 flex flex-wrap gap-x-3 text-sm text-ink-700">
                  <span>
                    Turbidity <FixedQuantity value={l.latest.turbidityNtu} unit="NTU" digits={1} />
                  </span>
                  <span>
                    CI <FixedQuantity value={l.latest.cloggingIndex} unit="s" digits={0} />
                  </span>
                </span>
              ) : (
                <span className="mt-1 block text-sm text-ink-500">No lab result yet</span>
              )}
            </Link>
          </li>
        ))}
      </ul>
      <Pager
        label="Pages of lots"
        page={page}
        pages={pages}
        onPageChange={onPageChange}
        previous={<ChevronLeft aria-hidden="true" />}
        previousLabel="Previous page"
        next={<ChevronRight aria-hidden="true" />}
        nextLabel="Next page"
        buttonClassName="min-h-11 min-w-11 px-2"
      >
        <span className="num text-sm text-ink-700">
          Page {page} of {pages}
        </span>
      </Pager>
    </div>
  );
}
