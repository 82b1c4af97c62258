import type { ColumnDef } from '@tanstack/react-table';
import { Factory, Plus } from 'lucide-react';
import { useMemo, useState } from 'react';
import type { LineSortKey } from '@shared/schemas/equipment';
import type { LineDto } from '@shared/types/equipment';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { Quantity } from '@/components/ui/quantity';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useDeleteLine } from '../api/delete-line';
import { useLines } from '../api/get-lines';
import { ConfirmDeleteDialog } from './confirm-delete-dialog';
import { LineFormDialog } from './line-form-dialog';
import { SearchBox, useListState } from './list-toolbar';
import { Measured } from './measured';
import { RowActions } from './row-actions';


export function LinesSection() {
  const mayEdit = useCan('equipment:edit');
  const mayDelete = useCan('records:delete');
  const units = useUnits();
  const list = useListState<LineSortKey>('name');
  const lines = useLines(list.params);
  const remove = useDeleteLine();
  const [editing, setEditing] = useState<LineDto | 'new' | null>(null);
  const [deleting, setDeleting] = useState<LineDto | null>(null);

  const columns = useMemo<ColumnDef<LineDto>[]>(
    () => [
      {
        id: 'name',
        accessorFn: (r) => r.name,
        header: 'Name',
        cell: ({ row }) => (
          <div className="min-w-36">
            <div className="font-semibold text-ink-900">{row.original.name}</div>
            {row.original.notes ? <div className="max-w-64 truncate text-xs text-ink-600">{row.original.notes}</div> : null}
          </div>
        ),
      },
      {
        id: 'requiredFlowLh',
        header: 'Filters must carry',
        enableSorting: false,
        meta: { numeric: true },
        cell: ({ row }) => (
          <span className="font-semibold" title={`With a ${row.original.flowMarginPct} % margin`}>
            <Measured formatted={units.format('flow', row.original.requiredFlowLh)} />
          </span>
        ),
      },
      { id: 'bottlesPerHour', accessorFn: (r) => r.bottlesPerHour, header: 'Filler speed', meta: { numeric: true }, cell: ({ row }) => <Quantity value={row.original.bottlesPerHour} unit="bottles/h" digits={0} /> },
      { id: 'bottleMl', accessorFn: (r) => r.bottleMl, header: 'Bottle', meta: { numeric: true }, cell: ({ row }) => <Quantity value={row.original.bottleMl} unit="mL" digits={0} /> },
      { id: 'fillerFlowLh', header: 'Filler draws', enableSorting: false, meta: { numeric: true }, cell: ({ row }) => <Measured formatted={units.format('flow', row.original.fillerFlowLh)} /> },
      ...(mayEdit
        ? [
            {
              id: 'actions',
              enableSorting: false,
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row }: { row: { original: LineDto } }) => (
                <RowActions name={row.original.name} mayDelete={mayDelete} onEdit={() => setEditing(row.original)} onDelete={() => setDeleting(row.original)} />
              ),
            } satisfies ColumnDef<LineDto>,
          ]
        : []),
    ],
    [mayEdit, units, mayDelete],
  );

  const addButton = mayEdit ? (
    <Button icon={<Plus />} onClick={() => setEditing('new')}>
      Add bottling line
    </Button>
  ) : null;
  const data = lines.data;
  const firstRun = data && data.total === 0 && !list.params.q;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-2 sm:flex-row sm:items-center sm:justify-between">
        <SearchBox id="line-search" label="Search bottling lines" value={list.text} onChange={list.setText} />
        {firstRun ? null : addButton}
      </div>
      {lines.isPending ? (
        <LoadingState variant="skeleton" />
      ) : lines.isError ? (
        <ErrorState message={errorMessage(lines.error)} onRetry={() => lines.refetch()} />
      ) : firstRun ? (
        <EmptyState icon={<Factory />} title="No bottling line yet" action={addButton}>
          Add your filler with its speed in bottles per hour and the bottle size; plans use it for the flow the filters must carry.
          {mayEdit ? null : ' An owner or cellar master can add it.'}
        </EmptyState>
      ) : (
        <DataTable
          caption="Bottling lines"
          columns={columns}
          data={data!.items}
          getRowId={(l) => l.id}
          sorting={list.sorting}
          onSortingChange={list.onSortingChange}
          empty="No bottling line matches this search."
          pagination={{ page: list.params.page, pageSize: list.params.pageSize, total: data!.total, onPageChange: list.setPage }}
        />
      )}
      {data && data.total > 0 ? (
        <p className="text-sm text-ink-600">“Filters must carry” adds the default {data.items[0]?.flowMarginPct ?? 10} % margin over what the filler draws.</p>
      ) : null}
      <LineFormDialog open={editing !== null} line={editing === 'new' ? null : editing} onClose={() => setEditing(null)} />
      <ConfirmDeleteDialog
        open={deleting !== null}
        name={deleting?.name ?? ''}
        what="bottling line"
        pending={remove.isPending}
        onClose={() => setDeleting(null)}
        onConfirm={() => remove.mutateAsync(deleting!.id)}
      />
    </div>
  );
}
