import type { ColumnDef } from '@tanstack/react-table';
import { Filter, Pencil, Trash2 } from 'lucide-react';
import { useMemo, useState } from 'react';
import type { CartridgeKind, CartridgeTypeSortKey } from '@shared/schemas/equipment';
import type { CartridgeTypeDto } from '@shared/types/equipment';
import { Button } from '@/components/ui/button';
import { Quantity } from '@/components/ui/quantity';
import { Select } from '@/components/ui/select';
import { StatusBadge } from '@/components/ui/status-badge';
import { ShowArchivedToggle } from '@/components/records/archive-offer';
import { useUnits } from '@/lib/units';
import { useDeleteCartridgeType } from '../api/delete-cartridge-type';
import { useCartridgeTypes } from '../api/get-cartridge-types';
import { CartridgeTypeDetailsDialog } from './cartridge-type-details-dialog';
import { CartridgeTypeFormDialog } from './cartridge-type-form-dialog';
import { actionsColumn, CatalogueSection, useCatalogueEditing } from './catalogue-section';
import { SearchBox, useListState } from './list-toolbar';
import { Measured } from './measured';


export function CartridgeTypesSection() {
  const units = useUnits();
  const list = useListState<CartridgeTypeSortKey>('name');
  const [kind, setKind] = useState<CartridgeKind | ''>('');
  const types = useCartridgeTypes({ ...list.params, kind: kind || undefined });
  const remove = useDeleteCartridgeType();
  const editing = useCatalogueEditing<CartridgeTypeDto>();
  const { mayEdit, mayDelete, setEditing, setDeleting } = editing;
  const [viewing, setViewing] = useState<string | null>(null);

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
      ...actionsColumn<CartridgeTypeDto>(mayEdit, (t) => (
        <div className="flex justify-end gap-1">
          <Button variant="ghost" size="sm" className="min-w-8 px-1.5" aria-label={`Edit ${t.name}`} title="Edit" onClick={() => setEditing(t)}>
            <Pencil aria-hidden="true" />
          </Button>
          {mayDelete ? (
            <Button variant="ghost" size="sm" className="min-w-8 px-1.5" aria-label={`Delete ${t.name}`} title="Delete" onClick={() => setDeleting(t)}>
              <Trash2 aria-hidden="true" />
            </Button>
          ) : null}
        </div>
      )),
    ],
    [mayEdit, units, mayDelete, setEditing, setDeleting],
  );

  return (
    <CatalogueSection
      editing={editing}
      list={list}
      query={types}
      filtered={Boolean(kind)}
      toolbar={
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
      }
      addLabel="Add cartridge type"
      emptyIcon={<Filter />}
      emptyTitle="No cartridge types yet"
      emptyText={
        <>
          After the housings, add each cartridge type you buy — prefilters and membranes — with the maker&apos;s area, clean-water flow,
          ΔP limits and rated cycles per 10-inch module. Cartridges and plans are built on this catalogue.
          {mayEdit ? null : ' An owner or cellar master can add them.'}
        </>
      }
      caption="Cartridge types"
      columns={columns}
      noMatch="No cartridge type matches."
      what="cartridge type"
      archiveKind="cartridge-types"
      remove={remove}
    >
      <CartridgeTypeDetailsDialog
        typeId={viewing}
        onClose={() => setViewing(null)}
        onEdit={(t) => {
          setViewing(null);
          setEditing(t);
        }}
      />
      <CartridgeTypeFormDialog open={editing.editing !== null} type={editing.editing === 'new' ? null : editing.editing} onClose={() => setEditing(null)} />
    </CatalogueSection>
  );
}
