import { describe, expect, it, vi } from 'vitest';
import { fireEvent, render, screen, within } from '@testing-library/react';
import type { ColumnDef } from '@tanstack/react-table';
import { DataTable } from './data-table';

type Row = { id: string; lot: string; litres: number };

const columns: ColumnDef<Row, unknown>[] = [
  { accessorKey: 'lot', header: 'Lot', enableSorting: false },
  { accessorKey: 'litres', header: 'Volume (L)', meta: { numeric: true } },
];

const data: Row[] = [
  { id: 'a', lot: 'Riesling 24-03', litres: 4200 },
  { id: 'b', lot: 'Pinot noir 24-11', litres: 1850 },
];

describe('DataTable', () => {
  it('renders rows and right-aligns numeric columns', () => {
    render(<DataTable columns={columns} data={data} caption="Lots" getRowId={(r) => r.id} />);
    const table = screen.getByRole('table', { name: 'Lots' });
    const rows = within(table).getAllByRole('row');
    expect(rows).toHaveLength(3);
    const cell = within(rows[1]).getAllByRole('cell')[1];
    expect(cell.textContent).toBe('4200');
    expect(cell.className).toContain('text-right');
    expect(cell.className).toContain('num');
    expect(within(rows[1]).getAllByRole('cell')[0].className).toContain('text-left');
    expect(screen.getByRole('columnheader', { name: /Volume/ }).className).toContain('text-right');
  });

  it('reports sorting to the caller when a sortable header is clicked', () => {
    const onSortingChange = vi.fn();
    render(<DataTable columns={columns} data={data} sorting={[]} onSortingChange={onSortingChange} />);
    expect(within(screen.getByRole('columnheader', { name: 'Lot' })).queryByRole('button')).toBeNull();
    fireEvent.click(screen.getByRole('button', { name: /Volume/ }));
    expect(onSortingChange).toHaveBeenCalledTimes(1);
    const next = onSortingChange.mock.calls[0][0];
    expect(next).toHaveLength(1);
    expect(next[0].id).toBe('litres');
    // Server-side: the rows keep the order they were given.
    const firstCell = within(screen.getAllByRole('row')[1]).getAllByRole('cell')[0];
    expect(firstCell.textContent).toBe('Riesling 24-03');
  });

  it('marks the sorted column with aria-sort', () => {
    render(
      <DataTable columns={columns} data={data} sorting={[{ id: 'litres', desc: true }]} onSortingChange={() => {}} />,
    );
    expect(screen.getByRole('columnheader', { name: /Volume/ }).getAttribute('aria-sort')).toBe('descending');
  });

  it('shows the empty slot and a working pagination footer', () => {
    const onPageChange = vi.fn();
    const { rerender } = render(<DataTable columns={columns} data={[]} empty="No lots yet." />);
    expect(screen.getByText('No lots yet.')).toBeTruthy();

    rerender(
      <DataTable columns={columns} data={data} pagination={{ page: 1, pageSize: 2, total: 5, onPageChange }} />,
    );
    expect(screen.getByText(/Rows 1–2 of 5/)).toBeTruthy();
    expect((screen.getByRole('button', { name: 'Previous page' }) as HTMLButtonElement).disabled).toBe(true);
    fireEvent.click(screen.getByRole('button', { name: 'Next page' }));
    expect(onPageChange).toHaveBeenCalledWith(2);
  });
});
