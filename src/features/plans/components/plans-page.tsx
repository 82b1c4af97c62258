import type { ColumnDef, SortingState } from '@tanstack/react-table';
import { ShowArchivedToggle } from '@/components/records/archive-offer';
import { ClipboardList, Plus } from 'lucide-react';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { planStatuses, type PlanSortKey, type PlanStatus } from '@shared/schemas/plans';
import type { PlanListItemDto } from '@shared/types/plans';
import { Button } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { EmptyState } from '@/components/ui/empty-state';
import { Input } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { usePlans } from '../api/get-plans';
import { PlanFormDialog } from './plan-form-dialog';
import { PlanStatusBadge } from './plan-status-badge';
import { formatDay } from '@/lib/dates';

const PAGE_SIZE = 25;
export const dayLabel = (date: string) => formatDay(date);

/** Every bottling day of the winery, newest plans easy to find. */
export function PlansPage() {
  const mayDraft = useCan('plans:draft');
  const units = useUnits();
  const [q, setQ] = useState('');
  const [status, setStatus] = useState<PlanStatus | ''>('');
  const [sorting, setSorting] = useState<SortingState>([{ id: 'plannedDate', desc: true }]);
  const [page, setPage] = useState(1);
  const [creating, setCreating] = useState(false);
  const [showArchived, setShowArchived] = useState(false);
  const sort = (sorting[0]?.id ?? 'plannedDate') as PlanSortKey;
  const plans = usePlans({ q: q.trim() || undefined, status: status || undefined, sort, order: sorting[0]?.desc ? 'desc' : 'asc', page, pageSize: PAGE_SIZE, archived: showArchived ? 'true' : undefined });

  const columns = useMemo<ColumnDef<PlanListItemDto>[]>(
    () => [
      {
        id: 'name',
        header: 'Plan',
        cell: ({ row }) => (
          <Link to={paths.plan(row.original.id)} className="font-semibold text-primary-800 underline-offset-2 hover:underline">
            {row.original.name}
            {row.original.revision > 1 ? ` (revision ${String(row.original.revision)})` : ''}
            {row.original.archivedAt ? ' (archived)' : ''}
          </Link>
        ),
      },
      { id: 'plannedDate', header: 'Date', cell: ({ row }) => <span className="num whitespace-nowrap">{dayLabel(row.original.plannedDate)}</span> },
      { id: 'line', header: 'Line', enableSorting: false, cell: ({ row }) => row.original.line?.name ?? <span className="text-ink-500">no line</span> },
      { id: 'lots', header: 'Lots', enableSorting: false, meta: { numeric: true }, cell: ({ row }) => row.original.lotCount },
      { id: 'volume', header: 'Volume', enableSorting: false, meta: { numeric: true }, cell: ({ row }) => <span className="num">{units.format('volume', row.original.volumeL)}</span> },
      { id: 'status', header: 'Status', cell: ({ row }) => <PlanStatusBadge status={row.original.status} size="sm" /> },
    ],
    [units],
  );

  const newPlan = mayDraft ? (
    <Button icon={<Plus />} onClick={() => setCreating(true)}>
      New plan
    </Button>
  ) : null;
  const data = plans.data;
  const firstRun = data && data.total === 0 && !q && !status;

  return (
    <div className="flex flex-col gap-4">
      <PageHeader
        title="Plans"
        description="Bottling days: the line, the lots in order and the filter train for each, sized as you edit."
        actions={firstRun ? null : newPlan}
      />
      {firstRun ? null : (
        <div className="flex flex-col gap-2 sm:flex-row sm:items-end">
          <label className="flex flex-1 flex-col gap-1 text-sm font-semibold text-ink-800" htmlFor="plan-search">
            Search plans
            <Input id="plan-search" type="search" value={q} onChange={(e) => { setQ(e.target.value); setPage(1); }} placeholder="Name, line or notes" />
          </label>
          <label className="flex flex-col gap-1 text-sm font-semibold text-ink-800 sm:w-48" htmlFor="plan-status">
            Status
            <Select
              id="plan-status"
              value={status}
              onChange={(e) => { setStatus(e.target.value as PlanStatus | ''); setPage(1); }}
              options={[{ value: '', label: 'Any status' }, ...planStatuses.map((s) => ({ value: s, label: s }))]}
            />
          </label>
          <ShowArchivedToggle id="plan-show-archived" checked={showArchived} onChange={(v) => { setShowArchived(v); setPage(1); }} />
        </div>
      )}
      {plans.isPending ? (
        <LoadingState variant="skeleton" />
      ) : plans.isError ? (
        <ErrorState message={errorMessage(plans.error)} onRetry={() => plans.refetch()} />
      ) : firstRun ? (
        <EmptyState icon={<ClipboardList />} title="No plans yet" action={newPlan}>
          A plan is one bottling day: choose the line, add the lots in the order you bottle them, then build a filter train for each.
          It needs a bottling line, housings and cartridge types under Equipment, and lots in the Cellar.
          {mayDraft ? null : ' An owner, cellar master or winemaker can draft one.'}
        </EmptyState>
      ) : (
        <DataTable
          caption="Plans"
          columns={columns}
          data={data!.items}
          getRowId={(p) => p.id}
          sorting={sorting}
          onSortingChange={(s) => { setSorting(s); setPage(1); }}
          empty="No plan matches."
          pagination={{ page, pageSize: PAGE_SIZE, total: data!.total, onPageChange: setPage }}
        />
      )}
      <PlanFormDialog open={creating} plan={null} onClose={() => setCreating(false)} />
    </div>
  );
}
