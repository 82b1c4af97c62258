import type { ColumnDef, SortingState } from '@tanstack/react-table';
import { Search } from 'lucide-react';
import { useEffect, useMemo, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { cartridgeSortKeys, cartridgeStatusValues, type CartridgeSortKey, type CartridgeStatus } from '@shared/schemas/cartridges';
import type { CartridgeDto } from '@shared/types/cartridges';
import { ShowArchivedToggle } from '@/components/records/archive-offer';
import { Card } from '@/components/ui/card';
import { DataTable } from '@/components/ui/data-table';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { Quantity } from '@/components/ui/quantity';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { useCartridges } from '../api/get-cartridges';
import type { CartridgeFilters } from '../api/keys';
import { CartridgeStatusBadge, statusWord } from '@/components/status/cartridge-status-badge';
import { Measure } from './measure';
import { formatDate } from '@/lib/dates';

const PAGE_SIZE = 25;

/** Filters live in the address, so the back button and a shared link keep them. */
function useFilters(): [CartridgeFilters, (next: Partial<CartridgeFilters>) => void] {
  const [params, setParams] = useSearchParams();
  const sort = params.get('sort');
  const status = params.get('status');
  const filters: CartridgeFilters = {
    q: params.get('q') ?? undefined,
    status: status && (cartridgeStatusValues as readonly string[]).includes(status) ? (status as CartridgeStatus) : undefined,
    typeId: params.get('typeId') ?? undefined,
    housingId: params.get('housingId') ?? undefined,
    batch: params.get('batch') ?? undefined,
    sort: sort && (cartridgeSortKeys as readonly string[]).includes(sort) ? (sort as CartridgeSortKey) : 'serial',
    order: params.get('order') === 'desc' ? 'desc' : 'asc',
    page: Math.max(1, Number(params.get('page')) || 1),
    pageSize: PAGE_SIZE,
    archived: params.get('archived') === 'true' ? 'true' : undefined,
  };
  const update = (next: Partial<CartridgeFilters>) => {
    const merged = { ...filters, ...next };
    // Any change but paging starts again at page 1.
    if (!('page' in next)) merged.page = 1;
    const out = new URLSearchParams();
    for (const [k, v] of Object.entries(merged)) {
      if (v === undefined || v === '' || k === 'pageSize') continue;
      if ((k === 'sort' && v === 'serial') || (k === 'order' && v === 'asc') || (k === 'page' && v === 1)) continue;
      out.set(k, String(v));
    }
    setParams(out, { replace: true });
  };
  return [filters, update];
}

export function CartridgeInventory({
  types,
  housings,
}: {
  types: { id: string; name: string }[];
  housings: { id: string; name: string }[];
}) {
  const [filters, setFilters] = useFilters();
  const list = useCartridges(filters);
  const [search, setSearch] = useState(filters.q ?? '');
  const [batch, setBatch] = useState(filters.batch ?? '');

  useEffect(() => {
    const t = setTimeout(() => {
      const next: Partial<CartridgeFilters> = {};
      if ((filters.q ?? '') !== search.trim()) next.q = search.trim() || undefined;
      if ((filters.batch ?? '') !== batch.trim()) next.batch = batch.trim() || undefined;
      if (Object.keys(next).length) setFilters(next);
    }, 300);
    return () => clearTimeout(t);
  }, [search, batch]);

  const columns = useMemo<ColumnDef<CartridgeDto>[]>(
    () => [
      {
        id: 'serial',
        accessorKey: 'serial',
        header: 'Serial',
        cell: ({ row }) => (
          <Link to={paths.cartridge(row.original.id)} className="inline-flex min-h-8 items-center font-semibold whitespace-nowrap text-primary-700 underline-offset-2 hover:underline">
            {row.original.serial}
          </Link>
        ),
      },
      { id: 'batch', accessorKey: 'batch', header: 'Batch', cell: ({ row }) => row.original.batch || <span className="text-ink-500">—</span> },
      {
        id: 'type',
        accessorKey: 'typeName',
        header: 'Type',
        cell: ({ row }) => (
          <span className="whitespace-nowrap">
            {row.original.typeName}
          </span>
        ),
      },
      { id: 'lengthIn', accessorKey: 'lengthIn', header: 'Length', meta: { numeric: true }, cell: ({ row }) => <Quantity value={row.original.lengthIn} unit="in" /> },
      { id: 'status', accessorKey: 'status', header: 'Status', cell: ({ row }) => <CartridgeStatusBadge status={row.original.status} /> },
      {
        id: 'housing',
        accessorKey: 'housingName',
        header: 'Housing · round',
        cell: ({ row }) =>
          row.original.housingName ? (
            <span className="whitespace-nowrap">
              {row.original.housingName} · <span className="num">{row.original.position ?? '—'}</span>
            </span>
          ) : (
            <span className="text-ink-500">—</span>
          ),
      },
      {
        id: 'receivedAt',
        accessorKey: 'receivedAt',
        header: 'Received',
        cell: ({ row }) => <span className="num whitespace-nowrap">{row.original.receivedAt ? formatDate(row.original.receivedAt) : '—'}</span>,
      },
      {
        id: 'litresFiltered',
        accessorKey: 'litresFiltered',
        header: 'Filtered',
        meta: { numeric: true },
        cell: ({ row }) => <Measure kind="volume" value={row.original.litresFiltered} />,
      },
    ],
    [],
  );

  const sorting: SortingState = [{ id: filters.sort ?? 'serial', desc: filters.order === 'desc' }];

  return (
    <Card title="Inventory" description="Every cartridge by serial. Open one to see its history and life forecast." flush>
      <div className="grid gap-3 border-b border-ink-200 px-4 py-3 sm:grid-cols-2 lg:grid-cols-5">
        <FormField label="Search serial or batch" htmlFor="cartridge-search" className="sm:col-span-2 lg:col-span-1">
          <div className="relative">
            <Search aria-hidden="true" className="pointer-events-none absolute top-1/2 left-3 size-4 -translate-y-1/2 text-ink-500" />
            <Input id="cartridge-search" type="search" value={search} onChange={(e) => setSearch(e.target.value)} className="pl-9" placeholder="e.g. QW-PES" />
          </div>
        </FormField>
        <FormField label="Status" htmlFor="cartridge-status">
          <Select
            id="cartridge-status"
            value={filters.status ?? ''}
            onChange={(e) => setFilters({ status: (e.target.value || undefined) as CartridgeStatus | undefined })}
            placeholder="Any status"
            options={cartridgeStatusValues.map((s) => ({ value: s, label: statusWord(s) }))}
          />
        </FormField>
        <FormField label="Type" htmlFor="cartridge-type">
          <Select id="cartridge-type" value={filters.typeId ?? ''} onChange={(e) => setFilters({ typeId: e.target.value || undefined })} placeholder="Any type" options={types.map((t) => ({ value: t.id, label: t.name }))} />
        </FormField>
        <FormField label="Housing" htmlFor="cartridge-housing">
          <Select id="cartridge-housing" value={filters.housingId ?? ''} onChange={(e) => setFilters({ housingId: e.target.value || undefined })} placeholder="Any housing" options={housings.map((h) => ({ value: h.id, label: h.name }))} />
        </FormField>
        <FormField label="Batch" htmlFor="cartridge-batch">
          <Input id="cartridge-batch" value={batch} onChange={(e) => setBatch(e.target.value)} placeholder="Exact batch, e.g. B24-117" />
        </FormField>
        <ShowArchivedToggle id="cartridge-show-archived" checked={filters.archived === 'true'} onChange={(v) => setFilters({ archived: v ? 'true' : undefined })} />
      </div>
      {list.isPending ? (
        <LoadingState variant="skeleton" lines={6} className="px-4" />
      ) : list.isError ? (
        <ErrorState className="m-4" message={list.error.message} onRetry={() => list.refetch()} />
      ) : (
        <DataTable
          className="rounded-none border-0"
          columns={columns}
          data={list.data.items}
          getRowId={(c) => c.id}
          caption="Cartridge inventory"
          sorting={sorting}
          onSortingChange={(next) => {
            const first = next[0];
            setFilters(first ? { sort: first.id as CartridgeSortKey, order: first.desc ? 'desc' : 'asc' } : { sort: 'serial', order: 'asc' });
          }}
          pagination={{ page: filters.page ?? 1, pageSize: PAGE_SIZE, total: list.data.total, onPageChange: (page) => setFilters({ page }) }}
          empty="No cartridge matches these filters."
        />
      )}
    </Card>
  );
}
