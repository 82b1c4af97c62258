import type { ColumnDef } from '@tanstack/react-table';
import { Cylinder } from 'lucide-react';
import { useMemo } from 'react';
import type { HousingSortKey } from '@shared/schemas/equipment';
import type { HousingDto } from '@shared/types/equipment';
import { Quantity } from '@/components/ui/quantity';
import { ShowArchivedToggle } from '@/components/records/archive-offer';
import { useUnits } from '@/lib/units';
import { useDeleteHousing } from '../api/delete-housing';
import { useHousings } from '../api/get-housings';
import { actionsColumn, CatalogueSection, useCatalogueEditing } from './catalogue-section';
import { HousingFormDialog } from './housing-form-dialog';
import { Measured } from './measured';
import { RowActions } from './row-actions';
import { SearchBox, useListState } from './list-toolbar';


export function HousingsSection() {
  const units = useUnits();
  const list = useListState<HousingSortKey>('name');
  const housings = useHousings(list.params);
  const remove = useDeleteHousing();
  const editing = useCatalogueEditing<HousingDto>();
  const { mayEdit, mayDelete, setEditing, setDeleting } = editing;

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
      ...actionsColumn<HousingDto>(
        mayEdit,
        (h) => <RowActions name={h.name} mayDelete={mayDelete} onEdit={() => setEditing(h)} onDelete={() => setDeleting(h)} />,
        { className: 'text-right whitespace-nowrap' },
      ),
    ],
    [mayEdit, units, mayDelete, setEditing, setDeleting],
  );

  return (
    <CatalogueSection
      editing={editing}
      list={list}
      query={housings}
      toolbar={
        <>
          <SearchBox id="housing-search" label="Search housings" value={list.text} onChange={list.setText} />
          <ShowArchivedToggle id="housing-search-archived" checked={list.showArchived} onChange={list.setShowArchived} />
        </>
      }
      addLabel="Add housing"
      emptyIcon={<Cylinder />}
      emptyTitle="No housings yet"
      emptyText={
        <>
          Start here: add each filter housing of your train with its rounds, cartridge length and pressure and temperature ratings.
          Then add the cartridge types you use.
          {mayEdit ? null : ' An owner or cellar master can add them.'}
        </>
      }
      caption="Housings"
      columns={columns}
      noMatch="No housing matches this search."
      what="housing"
      archiveKind="housings"
      remove={remove}
    >
      <HousingFormDialog open={editing.editing !== null} housing={editing.editing === 'new' ? null : editing.editing} onClose={() => setEditing(null)} />
    </CatalogueSection>
  );
}
