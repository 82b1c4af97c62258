import type { ColumnDef } from '@tanstack/react-table';
import { Filter, Pencil, Plus, Trash2 } from 'lucide-react';
import { useMemo, useState } from 'react';
import type { CartridgeKind, CartridgeTypeSortKey } from '@shared/schemas/equipment';
import type { CartridgeTypeDto } from '@shared/types/equipment';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { Quantity } from '@/components/ui/quantity';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { ShowArchivedToggle } from '@/components/records/archive-offer';
import { errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useDeleteCartridgeType } from '../api/delete-cartridge-type';
import { useCartridgeTypes } from '../api/get-cartridge-types';
import { CartridgeTypeDetailsDialog } from './cartridge-type-details-dialog';
import { CartridgeTypeFormDialog } from './cartridge-type-form-dialog';
import { ConfirmDeleteDialog } from './confirm-delete-dialog';
import { SearchBox, useListState } from './list-toolbar';
import { Measured } from './measured';


export function CartridgeTypesSection() {
  const mayEdit = useCan('equipment:edit');
  const mayDelete = useCan('records:delete');
  const units = useUnits();
  const list = useListState<CartridgeTypeSortKey>('name');
  const [kind, setKind] = useState<CartridgeKind | ''>('');
  const types = useCartridgeTypes({ ...list.params, kind: kind || undefined });
  const remove = useDeleteCartridgeType();
  const [editing, setEditing] = useState<CartridgeTypeDto | 'new' | null>(null);
  const [viewing, setViewing] = useState<string | null>(null);
  const [deleting, setDeleting] = useState<CartridgeTypeDto | null>(null);

  const columns = useMemo<ColumnDef<CartridgeTypeDto>[]>(
    () => [
      {
        id: 'name',
        accessorFn: (r) => r.name,
        header: 'Name',
        cell: ({ row }) => (
          <div className="flex min-w-40 flex-col items-start gap-0.5">
            <button
              type="button"
              className="min-h-8 text-left font-semibold text-primary-700 underline-offset-2 hover:underline"
              onClick={() => setViewing(row.original.id)}
            >
              {row.original.name}
            </button>
            {row.original.warnings.length ? (
              <StatusBadge tone="watch" size="sm">
                no integrity limit
              </StatusBadge>
            ) : null}
          </div>
        ),
      },
      {
        id: 'kind',
        accessorFn: (r) => r.kind,
        header: 'Kind',
        cell: ({ row }) => (row.original.kind === 'membrane' ? 'Membrane' : 'Prefilter'),
      },
      { id: 'media', accessorFn: (r) => r.media, header: 'Media', cell: ({ row }) => row.original.media },
      { id: 'ratingUm', accessorFn: (r) => r.ratingUm, header: 'Rating', meta: { numeric: true }, cell: ({ row }) => <Quantity value={row.original.ratingUm} unit="µm" /> },
      { id: 'areaM2Per10in', accessorFn: (r) => r.areaM2Per10in, header: 'Area /10″', meta: { numeric: true }, cell: ({ row }) => <Measured formatted={units.format('area', row.original.areaM2Per10in)} /> },
      {
        id: 'water',
        header: 'Water flow /10″',
        enableSorting: false,
        meta: { numeric: true },
        cell: ({ row }) => (
          <span>
            <Measured formatted={units.format('flow', row.original.waterFlowLhPer10in)} />
            <span className="text-ink-500"> at </span>
            <Measured formatted={units.format('dp', row.original.waterDpBar)} />
          </span>
        ),
      },
      {
        id: 'terminal',
        header: 'Terminal / max ΔP',
        enableSorting: false,
        meta: { numeric: true },
        cell: ({ row }) => (
          <span>
            <Measured formatted={units.format('dp', row.original.terminalDpBar, 2)} />
            <span className="text-ink-500"> / </span>
            <Measured formatted={units.format('dp', row.original.maxDpForwardBar, 2)} />
          </span>
        ),
      },
      { id: 'maxTempC', accessorFn: (r) => r.maxTempC, header: 'Max temp.', meta: { numeric: true }, cell: ({ row }) => <Measured formatted={units.format('temperature', row.original.maxTempC, 0)} /> },
      {
        id: 'pricePer10in',
        accessorFn: (r) => r.pricePer10in,
        header: 'Price /10″',
        meta: { numeric: true },
        cell: ({ row }) => (row.original.pricePer10in === null ? <span className="text-ink-400">—</span> : <Quantity value={row.original.pricePer10in} unit={row.original.currency} digits={2} />),
      },
      { id: 'cartridgeCount', accessorFn: (r) => r.counts.total, header: 'Cartridges', meta: { numeric: true }, cell: ({ row }) => row.original.counts.total },
      ...(mayEdit
        ? [
            {
              id: 'actions',
              enableSorting: false,
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row }: { row: { original: CartridgeTypeDto } }) => (
                <div className="flex justify-end gap-1">
                  <Button variant="ghost" size="sm" className="min-w-8 px-1.5" aria-label={`Edit ${row.original.name}`} title="Edit" onClick={() => setEditing(row.original)}>
                    <Pencil aria-hidden="true" />
                  </Button>
                  {mayDelete ? (
<Button variant="ghost" size="sm" className="min-w-8 px-1.5" aria-label={`Delete ${row.original.name}`} title="Delete" onClick={() => setDeleting(row.original)}>
                    <Trash2 aria-hidden="true" />
                  </Button>
) : null}
                </div>
              ),
            } satisfies ColumnDef<CartridgeTypeDto>,
          ]
        : []),
    ],
    [mayEdit, units, mayDelete],
  );

  const addButton = mayEdit ? (
    <Button icon={<Plus />} onClick={() => setEditing('new')}>
      Add cartridge type
    </Button>
  ) : null;
  const data = types.data;
  const firstRun = data && data.total === 0 && !list.params.q && !kind;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-2 sm:flex-row sm:items-center sm:justify-between">
        <div className="flex flex-col gap-2 sm:flex-row">
          <SearchBox id="type-search" label="Search name or media" value={list.text} onChange={list.setText} />
        <ShowArchivedToggle id="type-search-archived" checked={list.showArchived} onChange={list.setShowArchived} />
          <Select
            aria-label="Kind"
            wrapperClassName="sm:w-44"
            value={kind}
            onChange={(e) => {
              setKind(e.target.value as CartridgeKind | '');
              list.setPage(1);
            }}
            options={[
              { value: '', label: 'All kinds' },
              { value: 'prefilter', label: 'Prefilters' },
              { value: 'membrane', label: 'Membranes' },
            ]}
          />
        </div>
        {firstRun ? null : addButton}
      </div>
      {types.isPending ? (
        <LoadingState variant="skeleton" />
      ) : types.isError ? (
        <ErrorState message={errorMessage(types.error)} onRetry={() => types.refetch()} />
      ) : firstRun ? (
        <EmptyState icon={<Filter />} title="No cartridge types yet" action={addButton}>
          After the housings, add each cartridge type you buy — prefilters and membranes — with the maker&apos;s area, clean-water flow,
          ΔP limits and rated cycles per 10-inch module. Cartridges and plans are built on this catalogue.
          {mayEdit ? null : ' An owner or cellar master can add them.'}
        </EmptyState>
      ) : (
        <DataTable
          caption="Cartridge types"
          columns={columns}
          data={data!.items}
          getRowId={(t) => t.id}
          sorting={list.sorting}
          onSortingChange={list.onSortingChange}
          empty="No cartridge type matches."
          pagination={{ page: list.params.page, pageSize: list.params.pageSize, total: data!.total, onPageChange: list.setPage }}
        />
      )}
      <CartridgeTypeDetailsDialog
        typeId={viewing}
        onClose={() => setViewing(null)}
        onEdit={(t) => {
          setViewing(null);
          setEditing(t);
        }}
      />
      <CartridgeTypeFormDialog open={editing !== null} type={editing === 'new' ? null : editing} onClose={() => setEditing(null)} />
      <ConfirmDeleteDialog
        open={deleting !== null}
        name={deleting?.name ?? ''}
        what="cartridge type"
        pending={remove.isPending}
        onClose={() => setDeleting(null)}
        onConfirm={() => remove.mutateAsync(deleting!.id)}
        archive={deleting ? { kind: 'cartridge-types', id: deleting.id } : undefined}
      />
    </div>
  );
}
