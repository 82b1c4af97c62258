import type { ColumnDef, SortingState } from '@tanstack/react-table';
import { Search } from 'lucide-react';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { WINE_STYLES, type WineStyle } from '@shared/engine';
import { lotSortKeys, wineStyleLabels, type LotSortKey } from '@shared/schemas/cellar';
import type { LotListItemDto } from '@shared/types/cellar';
import { DataTable } from '@/components/ui/data-table';
import { ShowArchivedToggle } from '@/components/records/archive-offer';
import { Input } from '@/components/ui/input';
import { useSearchText } from '@/lib/use-search-text';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { useLots } from '../api/get-lots';
import { LotsPhoneList } from './lots-phone-list';
import { FixedQuantity, MetricQuantity } from './metric-quantity';
import { ReadinessBadge } from '@/components/status/readiness-badge';

const PAGE_SIZE = 25;

const columns: ColumnDef<LotListItemDto>[] = [
  {
    id: 'code',
    header: 'Code',
    accessorKey: 'code',
    cell: ({ row }) => (
      <Link to={paths.lot(row.original.id)} className="inline-flex min-h-9 items-center font-semibold whitespace-nowrap text-primary-700 underline-offset-2 hover:underline">
        {row.original.code}
      </Link>
    ),
  },
  { id: 'name', header: 'Name', accessorKey: 'name', meta: { className: 'min-w-44' } },
  { id: 'style', header: 'Style', accessorKey: 'style', cell: ({ row }) => wineStyleLabels[row.original.style] },
  { id: 'vintage', header: 'Vintage', accessorKey: 'vintage', meta: { numeric: true }, cell: ({ row }) => row.original.vintage ?? 'NV' },
  { id: 'volumeL', header: 'Volume', accessorKey: 'volumeL', meta: { numeric: true }, cell: ({ row }) => <MetricQuantity kind="volume" value={row.original.volumeL} /> },
  { id: 'tank', header: 'Tank', cell: ({ row }) => row.original.tank?.name ?? <span className="text-ink-500">—</span>, meta: { className: 'whitespace-nowrap' } },
  {
    id: 'turbidityNtu',
    header: 'Turbidity',
    meta: { numeric: true },
    cell: ({ row }) => <FixedQuantity value={row.original.latest?.turbidityNtu} unit="NTU" digits={1} />,
  },
  {
    id: 'cloggingIndex',
    header: 'Clogging index',
    enableSorting: false,
    meta: { numeric: true },
    cell: ({ row }) => <FixedQuantity value={row.original.latest?.cloggingIndex} unit="s" digits={0} />,
  },
  {
    id: 'readiness',
    header: 'Readiness',
    enableSorting: false,
    cell: ({ row }) => <ReadinessBadge verdict={row.original.readiness.verdict} size="sm" />,
  },
];

/** The winery's lots, searched, sorted and paged on the server. */
export function LotsTable() {
  const [style, setStyle] = useState<WineStyle | ''>('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'code', desc: false }]);
  const [page, setPage] = useState(1);
  const [showArchived, setShowArchived] = useState(false);

  // Search as the person types, once they pause.
  const { text: search, setText: setSearch, q } = useSearchText(() => setPage(1));

  const sort = (sorting[0]?.id ?? 'code') as LotSortKey;
  const filters = useMemo(
    () => ({
      q: q || undefined,
      style: style || undefined,
      sort: lotSortKeys.includes(sort) ? sort : 'code',
      order: sorting[0]?.desc ? ('desc' as const) : ('asc' as const),
      page,
      pageSize: PAGE_SIZE,
      archived: showArchived ? ('true' as const) : undefined,
    }),
    [q, style, sort, sorting, page, showArchived],
  );
  const lots = useLots(filters);

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-2 sm:flex-row sm:items-end">
        <label className="flex flex-1 flex-col gap-1.5 text-sm font-semibold text-ink-800" htmlFor="lot-search">
          Search lots
          <span className="relative">
            <Search aria-hidden="true" className="pointer-events-none absolute top-1/2 left-3 size-4 -translate-y-1/2 text-ink-500" />
            <Input id="lot-search" type="search" placeholder="Code, name or tank" className="pl-9 font-normal" value={search} onChange={(e) => setSearch(e.target.value)} />
          </span>
        </label>
        <label className="flex flex-col gap-1.5 text-sm font-semibold text-ink-800 sm:w-48" htmlFor="lot-style-filter">
          Style
          <Select
            id="lot-style-filter"
            className="font-normal"
            value={style}
            onChange={(e) => {
              setStyle(e.target.value as WineStyle | '');
              setPage(1);
            }}
            placeholder="All styles"
            options={WINE_STYLES.map((s) => ({ value: s, label: wineStyleLabels[s] }))}
          />
        </label>
        <ShowArchivedToggle
          id="lot-show-archived"
          checked={showArchived}
          onChange={(v) => {
            setShowArchived(v);
            setPage(1);
          }}
        />
      </div>
      {lots.isPending ? (
        <LoadingState variant="skeleton" label="Loading lots …" />
      ) : lots.isError ? (
        <ErrorState message={lots.error.message} onRetry={() => lots.refetch()} />
      ) : (
        <>
        <div className="sm:hidden">
          <LotsPhoneList
            lots={lots.data.items}
            page={page}
            pageSize={PAGE_SIZE}
            total={lots.data.total}
            onPageChange={setPage}
            empty={q || style ? 'No lot matches this search.' : 'No lots yet.'}
          />
        </div>
        <DataTable
          className="max-sm:hidden"
          caption="Wine lots"
          columns={columns}
          data={lots.data.items}
          getRowId={(l) => l.id}
          sorting={sorting}
          onSortingChange={(s) => {
            setSorting(s.length ? s : [{ id: 'code', desc: false }]);
            setPage(1);
          }}
          pagination={{ page, pageSize: PAGE_SIZE, total: lots.data.total, onPageChange: setPage }}
          empty={q || style ? 'No lot matches this search.' : 'No lots yet.'}
        />
        </>
      )}
    </div>
  );
}
