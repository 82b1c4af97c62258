import type { ColumnDef } from '@tanstack/react-table';
import { Factory } from 'lucide-react';
import { useMemo } from 'react';
import type { LineSortKey } from '@shared/schemas/equipment';
import type { LineDto } from '@shared/types/equipment';
import { Quantity } from '@/components/ui/quantity';
import { useUnits } from '@/lib/units';
import { useDeleteLine } from '../api/delete-line';
import { useLines } from '../api/get-lines';
import { actionsColumn, CatalogueSection, useCatalogueEditing } from './catalogue-section';
import { LineFormDialog } from './line-form-dialog';
import { SearchBox, useListState } from './list-toolbar';
import { Measured } from './measured';
import { RowActions } from './row-actions';


export function LinesSection() {
  const units = useUnits();
  const list = useListState<LineSortKey>('name');
  const lines = useLines(list.params);
  const remove = useDeleteLine();
  const editing = useCatalogueEditing<LineDto>();
  const { mayEdit, mayDelete, setEditing, setDeleting } = editing;

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
      ...actionsColumn<LineDto>(mayEdit, (l) => <RowActions name={l.name} mayDelete={mayDelete} onEdit={() => setEditing(l)} onDelete={() => setDeleting(l)} />),
    ],
    [mayEdit, units, mayDelete, setEditing, setDeleting],
  );

  const data = lines.data;

  return (
    <CatalogueSection
      editing={editing}
      list={list}
      query={lines}
      toolbar={<SearchBox id="line-search" label="Search bottling lines" value={list.text} onChange={list.setText} />}
      addLabel="Add bottling line"
      emptyIcon={<Factory />}
      emptyTitle="No bottling line yet"
      emptyText={
        <>
          Add your filler with its speed in bottles per hour and the bottle size; plans use it for the flow the filters must carry.
          {mayEdit ? null : ' An owner or cellar master can add it.'}
        </>
      }
      caption="Bottling lines"
      columns={columns}
      noMatch="No bottling line matches this search."
      what="bottling line"
      remove={remove}
    >
      {data && data.total > 0 ? (
        <p className="text-sm text-ink-600">“Filters must carry” adds the default {data.items[0]?.flowMarginPct ?? 10} % margin over what the filler draws.</p>
      ) : null}
      <LineFormDialog open={editing.editing !== null} line={editing.editing === 'new' ? null : editing.editing} onClose={() => setEditing(null)} />
    </CatalogueSection>
  );
}
