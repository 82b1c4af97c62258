import type { ColumnDef } from '@tanstack/react-table';
import { Plus } from 'lucide-react';
import { useMemo, useState } from 'react';
import type { TankDto } from '@shared/types/cellar';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { GasCaution } from '@/components/ui/caution';
import { DataTable } from '@/components/ui/data-table';
import { ConfirmDialog } from '@/components/ui/confirm-dialog';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { useToast } from '@/components/ui/toast';
import { errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useDeleteTank } from '../api/delete-tank';
import { useTanks } from '../api/get-tanks';
import { MetricQuantity } from './metric-quantity';
import { TankFormDialog } from './tank-form-dialog';

/** The winery's tanks with what they hold; add, edit and delete for those who may. */
export function TanksSection({ onAddTank }: { onAddTank: () => void }) {
  const tanks = useTanks({ pageSize: 100, sort: 'name' });
  const mayEdit = useCan('cellar:edit');
  const mayDelete = useCan('records:delete');
  const remove = useDeleteTank();
  const toast = useToast();
  const [editing, setEditing] = useState<TankDto | null>(null);
  const [deleting, setDeleting] = useState<TankDto | null>(null);

  const columns = useMemo<ColumnDef<TankDto>[]>(
    () => [
      { header: 'Tank', accessorKey: 'name', meta: { className: 'font-semibold whitespace-nowrap' } },
      { header: 'Capacity', accessorKey: 'capacityL', meta: { numeric: true }, cell: ({ row }) => <MetricQuantity kind="volume" value={row.original.capacityL} /> },
      { header: 'Lots', accessorKey: 'lotCount', meta: { numeric: true } },
      {
        header: 'Wine held',
        accessorKey: 'lotVolumeL',
        meta: { numeric: true },
        cell: ({ row }) => (
          <span className="inline-flex flex-wrap items-center justify-end gap-2">
            <MetricQuantity kind="volume" value={row.original.lotVolumeL} />
            {row.original.lotVolumeL > row.original.capacityL ? (
              <StatusBadge size="sm" tone="stop">
                above capacity
              </StatusBadge>
            ) : null}
          </span>
        ),
      },
      { header: 'Notes', accessorKey: 'notes', meta: { className: 'min-w-40 text-ink-700' } },
      ...(mayEdit
        ? [
            {
              id: 'actions',
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row }: { row: { original: TankDto } }) => (
                <div className="flex justify-end gap-1">
                  <Button variant="ghost" size="sm" onClick={() => setEditing(row.original)} aria-label={`Edit ${row.original.name}`}>
                    Edit
                  </Button>
                  {mayDelete ? (
<Button variant="ghost" size="sm" onClick={() => setDeleting(row.original)} aria-label={`Delete ${row.original.name}`}>
                    Delete
                  </Button>
) : null}
                </div>
              ),
            } satisfies ColumnDef<TankDto>,
          ]
        : []),
    ],
    [mayEdit, mayDelete],
  );

  return (
    <Card
      title="Tanks"
      description="Where the lots are. A tank that holds lots cannot be deleted."
      flush
      actions={
        mayEdit ? (
          <Button variant="secondary" icon={<Plus aria-hidden="true" className="size-4" />} onClick={onAddTank}>
            Add tank
          </Button>
        ) : null
      }
    >
      {tanks.isPending ? (
        <LoadingState variant="skeleton" className="px-4" />
      ) : tanks.isError ? (
        <ErrorState className="m-4" message={tanks.error.message} onRetry={() => tanks.refetch()} />
      ) : (
        <>
          {tanks.data.items
            .filter((t) => t.lotVolumeL > t.capacityL)
            .map((t) => (
              <p key={t.id} role="alert" className="mx-4 my-2 rounded border border-stop-200 bg-stop-50 px-3 py-2 text-sm text-stop-700">
                {t.name} holds <MetricQuantity kind="volume" value={t.lotVolumeL} /> of lots, more than its capacity of <MetricQuantity kind="volume" value={t.capacityL} />: check the
                lots’ volumes or the tank’s capacity.
              </p>
            ))}
          <DataTable
            caption="Tanks"
            className="rounded-none border-0"
            columns={columns}
            data={tanks.data.items}
            getRowId={(t) => t.id}
            clientSorting
            empty="No tanks yet. Add the tanks your lots are in, with their capacity."
          />
        </>
      )}
      <div className="p-4">
        <GasCaution title="Tank work: CO₂ and nitrogen – no air to breathe" />
      </div>
      <TankFormDialog open={editing !== null} tank={editing} onClose={() => setEditing(null)} />
      <ConfirmDialog
        open={deleting !== null}
        onClose={() => setDeleting(null)}
        title={`Delete ${deleting?.name ?? ''}?`}
        description="The tank is removed from the cellar. Lots that were in it keep their records."
        cancelLabel="Keep"
        confirmLabel="Delete tank"
        pending={remove.isPending}
        onConfirm={() =>
          deleting &&
          remove.mutate(deleting.id, {
            onSuccess: () => toast.success('Tank deleted', deleting.name),
            onError: (error) => toast.error('Not deleted', errorMessage(error)),
            onSettled: () => setDeleting(null),
          })
        }
      />
    </Card>
  );
}
