import { useState, type ReactNode } from 'react';
import {
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type Header,
  type RowData,
  type SortingState,
  type Updater,
} from '@tanstack/react-table';
import { ChevronDown, ChevronLeft, ChevronRight, ChevronUp, ChevronsUpDown } from 'lucide-react';
import { cn } from '@/utils/cn';
import { Button } from './button';

declare module '@tanstack/react-table' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    /** Right-aligns header, cells and footer and uses tabular digits. */
    numeric?: boolean;
    /** Extra classes for this column's cells. */
    className?: string;
    /** Extra classes for this column's header cell. */
    headerClassName?: string;
  }
}

export type { ColumnDef, SortingState };

export interface DataTablePagination {
  /** 1-based page number. */
  page: number;
  pageSize: number;
  /** Total number of rows across all pages. */
  total: number;
  onPageChange: (page: number) => void;
}

export interface DataTableProps<T> {
   
  columns: ColumnDef<T, any>[];
  data: T[];
  /** Controlled sorting. With onSortingChange the table sorts nothing itself (server-side). */
  sorting?: SortingState;
  onSortingChange?: (sorting: SortingState) => void;
  /** Sort in the browser when no onSortingChange is given. Default false. */
  clientSorting?: boolean;
  pagination?: DataTablePagination;
  /** Shown in place of rows when data is empty. */
  empty?: ReactNode;
  /** Accessible name of the table (visually hidden caption). */
  caption?: string;
  getRowId?: (row: T, index: number) => string;
  /** Max height of the scrolling frame; the header stays visible inside it. Default 70vh. */
  maxHeight?: string;
  className?: string;
}

function resolve<S>(updater: Updater<S>, current: S): S {
  return typeof updater === 'function' ? (updater as (old: S) => S)(current) : updater;
}

function SortIcon({ state }: { state: false | 'asc' | 'desc' }) {
  if (state === 'asc') return <ChevronUp aria-hidden="true" className="size-4 shrink-0 text-primary-700" />;
  if (state === 'desc') return <ChevronDown aria-hidden="true" className="size-4 shrink-0 text-primary-700" />;
  return <ChevronsUpDown aria-hidden="true" className="size-4 shrink-0 text-ink-400" />;
}

function HeaderCell<T>({ header }: { header: Header<T, unknown> }) {
  const meta = header.column.columnDef.meta;
  const numeric = meta?.numeric;
  const canSort = header.column.getCanSort();
  const sorted = header.column.getIsSorted();
  const content = header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext());

  return (
    <th
      scope="col"
      colSpan={header.colSpan}
      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : canSort ? 'none' : undefined}
      className={cn(
        'sticky top-0 z-10 border-b border-ink-300 bg-ink-100 px-3 py-2 text-sm font-semibold whitespace-nowrap text-ink-700',
        numeric ? 'text-right' : 'text-left',
        meta?.headerClassName,
      )}
    >
      {canSort && !header.isPlaceholder ? (
        <button
          type="button"
          onClick={header.column.getToggleSortingHandler()}
          className={cn(
            '-mx-1 inline-flex min-h-7 items-center gap-1 rounded-sm px-1 font-semibold hover:text-ink-950',
            numeric && 'flex-row-reverse',
          )}
        >
          <span>{content}</span>
          <SortIcon state={sorted} />
        </button>
      ) : (
        content
      )}
    </th>
  );
}

export function DataTable<T>({
  columns,
  data,
  sorting,
  onSortingChange,
  clientSorting = false,
  pagination,
  empty,
  caption,
  getRowId,
  maxHeight = '70vh',
  className,
}: DataTableProps<T>) {
  const [localSorting, setLocalSorting] = useState<SortingState>([]);
  const manual = Boolean(onSortingChange);
  const currentSorting = sorting ?? localSorting;
  const sortingEnabled = manual || clientSorting;

  const table = useReactTable<T>({
    columns,
    data,
    getRowId,
    state: { sorting: currentSorting },
    enableSorting: sortingEnabled,
    manualSorting: manual,
    onSortingChange: (updater) => {
      const next = resolve(updater, currentSorting);
      if (onSortingChange) onSortingChange(next);
      if (sorting === undefined) setLocalSorting(next);
    },
    getCoreRowModel: getCoreRowModel(),
    ...(manual || !clientSorting ? {} : { getSortedRowModel: getSortedRowModel() }),
  });

  const rows = table.getRowModel().rows;
  const leafCount = table.getVisibleLeafColumns().length;
  const hasFooter = table
    .getFooterGroups()
    .some((group) => group.headers.some((h) => h.column.columnDef.footer !== undefined));

  return (
    <div className={cn('overflow-hidden rounded border border-ink-200 bg-white', className)}>
      <div className="overflow-auto overscroll-x-contain" style={{ maxHeight }}>
        <table className="w-full border-separate border-spacing-0 text-sm">
          {caption ? <caption className="sr-only">{caption}</caption> : null}
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => (
                  <HeaderCell key={header.id} header={header as Header<T, unknown>} />
                ))}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={leafCount} className="px-3 py-8 text-center text-ink-600">
                  {empty ?? 'Nothing to show yet.'}
                </td>
              </tr>
            ) : (
              rows.map((row) => (
                <tr key={row.id} className="hover:bg-ink-50">
                  {row.getVisibleCells().map((cell) => {
                    const meta = cell.column.columnDef.meta;
                    return (
                      <td
                        key={cell.id}
                        className={cn(
                          'border-b border-ink-100 px-3 py-1.5 align-middle text-ink-900',
                          meta?.numeric ? 'num text-right whitespace-nowrap' : 'text-left',
                          meta?.className,
                        )}
                      >
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    );
                  })}
                </tr>
              ))
            )}
          </tbody>
          {hasFooter && rows.length > 0 ? (
            <tfoot>
              {table.getFooterGroups().map((group) => (
                <tr key={group.id}>
                  {group.headers.map((header) => {
                    const meta = header.column.columnDef.meta;
                    return (
                      <td
                        key={header.id}
                        colSpan={header.colSpan}
                        className={cn(
                          'border-t border-ink-300 bg-ink-50 px-3 py-2 font-semibold text-ink-900',
                          meta?.numeric ? 'num text-right whitespace-nowrap' : 'text-left',
                        )}
                      >
                        {header.isPlaceholder ? null : flexRender(header.column.columnDef.footer, header.getContext())}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tfoot>
          ) : null}
        </table>
      </div>
      {pagination ? <PaginationFooter {...pagination} /> : null}
    </div>
  );
}

function PaginationFooter({ page, pageSize, total, onPageChange }: DataTablePagination) {
  const pageCount = Math.max(1, Math.ceil(total / Math.max(1, pageSize)));
  const current = Math.min(Math.max(1, page), pageCount);
  const first = total === 0 ? 0 : (current - 1) * pageSize + 1;
  const last = Math.min(total, current * pageSize);
  const fmt = (n: number) => n.toLocaleString();

  return (
    <nav
      aria-label="Pages"
      className="flex flex-wrap items-center justify-between gap-2 border-t border-ink-200 bg-ink-50 px-3 py-2 text-sm text-ink-700"
    >
      <p className="num">
        {total === 0 ? (
          'No rows'
        ) : (
          <>
            Rows {fmt(first)}–{fmt(last)} of {fmt(total)}
          </>
        )}
      </p>
      <div className="flex items-center gap-2">
        <span className="num text-ink-600">
          Page {fmt(current)} of {fmt(pageCount)}
        </span>
        <Button
          variant="secondary"
          size="md"
          className="min-h-11 min-w-11 px-2"
          aria-label="Previous page"
          disabled={current <= 1}
          onClick={() => onPageChange(current - 1)}
        >
          <ChevronLeft aria-hidden="true" />
        </Button>
        <Button
          variant="secondary"
          size="md"
          className="min-h-11 min-w-11 px-2"
          aria-label="Next page"
          disabled={current >= pageCount}
          onClick={() => onPageChange(current + 1)}
        >
          <ChevronRight aria-hidden="true" />
        </Button>
      </div>
    </nav>
  );
}
