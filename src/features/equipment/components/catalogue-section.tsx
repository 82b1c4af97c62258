import type { UseQueryResult } from '@tanstack/react-query';
import type { ColumnDef, ColumnMeta } from '@tanstack/react-table';
import { Plus } from 'lucide-react';
import { useState, type ReactNode } from 'react';
import type { ListDto } from '@shared/types/api';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { ErrorState, LoadingState } from '@/components/ui/states';
import type { ArchivableKind } from '@/components/records/archive-offer';
import { errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { ConfirmDeleteDialog } from './confirm-delete-dialog';
import type { useListState } from './list-toolbar';

interface Named {
  id: string;
  name: string;
}

/** Who may edit and delete equipment, and the row being edited (`'new'` for one being added) or deleted. */
export function useCatalogueEditing<T>() {
  const mayEdit = useCan('equipment:edit');
  const mayDelete = useCan('records:delete');
  const [editing, setEditing] = useState<T | 'new' | null>(null);
  const [deleting, setDeleting] = useState<T | null>(null);
  return { mayEdit, mayDelete, editing, setEditing, deleting, setDeleting };
}

/** The last column, with a row's actions, for those who may edit (none for the others). */
export function actionsColumn<T>(mayEdit: boolean, actions: (row: T) => ReactNode, meta?: ColumnMeta<T, unknown>): ColumnDef<T>[] {
  if (!mayEdit) return [];
  return [
    {
      id: 'actions',
      enableSorting: false,
      header: () => <span className="sr-only">Actions</span>,
      ...(meta ? { meta } : {}),
      cell: ({ row }) => actions(row.original),
    },
  ];
}

export interface CatalogueSectionProps<T extends Named> {
  editing: ReturnType<typeof useCatalogueEditing<T>>;
  list: ReturnType<typeof useListState<string>>;
  query: UseQueryResult<ListDto<T>>;
  /** A filter besides the search is set (so an empty list is no first run). */
  filtered?: boolean;
  /** Search box and filters, left of the Add button. */
  toolbar: ReactNode;
  addLabel: string;
  /** The first-run state, shown while the winery has none at all. */
  emptyIcon: ReactNode;
  emptyTitle: string;
  emptyText: ReactNode;
  caption: string;
  columns: ColumnDef<T>[];
  noMatch: string;
  /** `what` the delete dialog names (“Delete housing?”), and where a refused delete may archive. */
  what: string;
  archiveKind?: ArchivableKind;
  remove: { isPending: boolean; mutateAsync: (id: string) => Promise<unknown> };
  /** Below the table: notes and the section's own dialogs. */
  children?: ReactNode;
}

/** One equipment tab: search and Add, then loading, error, first-run or the paged table, and the delete dialog. */
export function CatalogueSection<T extends Named>({
  editing: { mayEdit, setEditing, deleting, setDeleting },
  list,
  query,
  filtered = false,
  toolbar,
  addLabel,
  emptyIcon,
  emptyTitle,
  emptyText,
  caption,
  columns,
  noMatch,
  what,
  archiveKind,
  remove,
  children,
}: CatalogueSectionProps<T>) {
  const addButton = mayEdit ? (
    <Button icon={<Plus />} onClick={() => setEditing('new')}>
      {addLabel}
    </Button>
  ) : null;
  const data = query.data;
  const firstRun = data && data.total === 0 && !list.params.q && !filtered;

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-col gap-2 sm:flex-row sm:items-center sm:justify-between">
        {toolbar}
        {firstRun ? null : addButton}
      </div>
      {query.isPending ? (
        <LoadingState variant="skeleton" />
      ) : query.isError ? (
        <ErrorState message={errorMessage(query.error)} onRetry={() => query.refetch()} />
      ) : firstRun ? (
        <EmptyState icon={emptyIcon} title={emptyTitle} action={addButton}>
          {emptyText}
        </EmptyState>
      ) : (
        <DataTable
          caption={caption}
          columns={columns}
          data={data!.items}
          getRowId={(r) => r.id}
          sorting={list.sorting}
          onSortingChange={list.onSortingChange}
          empty={noMatch}
          pagination={{ page: list.params.page, pageSize: list.params.pageSize, total: data!.total, onPageChange: list.setPage }}
        />
      )}
      {children}
      <ConfirmDeleteDialog
        open={deleting !== null}
        name={deleting?.name ?? ''}
        what={what}
        pending={remove.isPending}
        onClose={() => setDeleting(null)}
        onConfirm={() => remove.mutateAsync(deleting!.id)}
        archive={deleting && archiveKind ? { kind: archiveKind, id: deleting.id } : undefined}
      />
    </div>
  );
}
