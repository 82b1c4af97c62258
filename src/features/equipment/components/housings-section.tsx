import type { ColumnDef } from '@tanstack/react-table';
import { Cylinder, Plus } from 'lucide-react';
import { useMemo, useState } from 'react';
import type { HousingSortKey } from '@shared/schemas/equipment';
import type { HousingDto } from '@shared/types/equipment';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { Quantity } from '@/components/ui/quantity';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { ShowArchivedToggle } from '@/components/records/archive-offer';
import { errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useDeleteHousing } from '../api/delete-housing';
import { useHousings } from '../api/get-housings';
import { ConfirmDeleteDialog } from './confirm-delete-dialog';
import { HousingFormDialog } from './housing-form-dialog';
import { Measured } from './measured';
import { RowActions } from './row-actions';
import { SearchBox, useListState } from './list-toolbar';


export function HousingsSection() {
  const mayEdit = useCan('equipment:edit');
  const mayDelete = useCan('records:delete');
  const units = useUnits();
  const list = useListState<HousingSortKey>('name');
  const housings = useHousings(list.params);
  const remove = useDeleteHousing();
  const [editing, setEditing] = useState<HousingDto | 'new' | null>(null);
  const [deleting, setDeleting] = useState<HousingDto | null>(null);

  const columns = useMemo<ColumnDef<HousingDto>[]>(
    () => [
      {
        id: 'name',
        accessorFn: (r) => r.name,
        header: 'Name',
        cell: ({ row }) => (
          <div className="min-w-36">
            <div className="font-semibold text-ink-900">
              {row.original.name}
              {row.original.archivedAt ? <span className="ml-2 text-xs font-normal text-ink-600">(archived)</span> : null}
            </div>
            {row.original.notes ? <div className="max-w-64 truncate text-xs text-ink-600">{row.original.notes}</div> : null}
          </div>
        ),
      },
      {
        id: 'elementEquivalents',
        header: '10-inch eq.',
        enableSorting: false,
        meta: { numeric: true },
        cell: ({ row }) => <span className="font-semibold">{row.original.elementEquivalents}</span>,
      },
      {
        id: 'installedCount',
        accessorFn: (r) => r.installedCount,
        header: 'Installed',
        meta: { numeric: true },
        cell: ({ row }) => `${row.original.installedCount} of ${row.original.rounds}`,
      },
      { id: 'rounds', accessorFn: (r) => r.rounds, header: 'Rounds', meta: { numeric: true }, cell: ({ row }) => row.original.rounds },
      { id: 'lengthIn', accessorFn: (r) => r.lengthIn, header: 'Length', meta: { numeric: true }, cell: ({ row }) => <Quantity value={row.original.lengthIn} unit="in" /> },
      { id: 'maxPressureBar', accessorFn: (r) => r.maxPressureBar, header: 'Max pressure', meta: { numeric: true }, cell: ({ row }) => <Measured formatted={units.format('pressure', row.original.maxPressureBar)} /> },
      { id: 'maxTempC', accessorFn: (r) => r.maxTempC, header: 'Max temp.', meta: { numeric: true }, cell: ({ row }) => <Measured formatted={units.format('temperature', row.original.maxTempC, 0)} /> },
      { id: 'holdUpL', accessorFn: (r) => r.holdUpL, header: 'Hold-up', meta: { numeric: true }, cell: ({ row }) => <Measured formatted={units.format('volume', row.original.holdUpL, 1)} /> },
      ...(mayEdit
        ? [
            {
              id: 'actions',
              enableSorting: false,
              header: () => <span className="sr-only">Actions</span>,
              meta: { className: 'text-right whitespace-nowrap' },
              cell: ({ row }: { row: { original: HousingDto } }) => (
                <RowActions name={row.original.name} mayDelete={mayDelete} onEdit={() => setEditing(row.original)} onDelete={() => setDeleting(row.original)} />
              ),
            } satisfies ColumnDef<HousingDto>,
          ]
        : []),
    ],
    [mayEdit, units, mayDelete],
  );

  const addButton = mayEdit ? (
    <Button icon={<Plus />} onClick={() => setEditing('new')}>
      Add housing
    </Button>
  ) : null;

  const data = housings.data;
  const firstRun = data && data.total === 0 && !list.params.q;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-2 sm:flex-row sm:items-center sm:justify-between">
        <SearchBox id="housing-search" label="Search housings" value={list.text} onChange={list.setText} />
        <ShowArchivedToggle id="housing-search-archived" checked={list.showArchived} onChange={list.setShowArchived} />
        {firstRun ? null : addButton}
      </div>
      {housings.isPending ? (
        <LoadingState variant="skeleton" />
      ) : housings.isError ? (
        <ErrorState message={errorMessage(housings.error)} onRetry={() => housings.refetch()} />
      ) : firstRun ? (
        <EmptyState icon={<Cylinder />} title="No housings yet" action={addButton}>
          Start here: add each filter housing of your train with its rounds, cartridge length and pressure and temperature ratings.
          Then add the cartridge types you use.
          {mayEdit ? null : ' An owner or cellar master can add them.'}
        </EmptyState>
      ) : (
        <DataTable
          caption="Housings"
          columns={columns}
          data={data!.items}
          getRowId={(h) => h.id}
          sorting={list.sorting}
          onSortingChange={list.onSortingChange}
          empty="No housing matches this search."
          pagination={{ page: list.params.page, pageSize: list.params.pageSize, total: data!.total, onPageChange: list.setPage }}
        />
      )}
      <HousingFormDialog open={editing !== null} housing={editing === 'new' ? null : editing} onClose={() => setEditing(null)} />
      <ConfirmDeleteDialog
        open={deleting !== null}
        name={deleting?.name ?? ''}
        what="housing"
        pending={remove.isPending}
        onClose={() => setDeleting(null)}
        onConfirm={() => remove.mutateAsync(deleting!.id)}
        archive={deleting ? { kind: 'housings', id: deleting.id } : undefined}
      />
    </div>
  );
}
