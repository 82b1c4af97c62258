import type { ColumnDef } from '@tanstack/react-table';
import { Download } from 'lucide-react';
import { useMemo } from 'react';
import { useSearchParams } from 'react-router-dom';
import { auditActionLabels, auditActions, auditKindLabels, auditKinds, fromInstant, toInstant, type AuditAction, type AuditKind } from '@shared/schemas/audit';
import type { AuditEventDto } from '@shared/types/audit';
import { buttonClasses } from '@/components/ui/button';
import { DataTable } from '@/components/ui/data-table';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { Button } from '@/components/ui/button';
import { Pager } from '@/components/ui/pager';
import { useAuditEvents } from '../api/get-audit-events';
import { useAuditPeople } from '../api/get-audit-people';
import { auditCsvUrl, type AuditFilters } from '../api/keys';
import { EventChanges } from './event-changes';
import { EventEntry } from './event-entry';
import { formatDateTimeSeconds } from '@/lib/dates';

export const CHANGE_LOG_PAGE_SIZE = 25;

const when = (iso: string) => formatDateTimeSeconds(iso);

const columns: ColumnDef<AuditEventDto>[] = [
  { id: 'at', header: 'When', cell: ({ row }) => <time dateTime={row.original.at} className="num whitespace-nowrap">{when(row.original.at)}</time> },
  { id: 'who', header: 'Who', cell: ({ row }) => row.original.userName || <span className="text-ink-500">—</span>, meta: { className: 'whitespace-nowrap' } },
  { id: 'action', header: 'Action', cell: ({ row }) => auditActionLabels[row.original.action] ?? row.original.action, meta: { className: 'whitespace-nowrap' } },
  {
    id: 'record',
    header: 'Record',
    cell: ({ row }) => (
      <span className="flex flex-col">
        <span className="text-xs font-semibold tracking-wide text-ink-600 uppercase">{auditKindLabels[row.original.recordKind] ?? row.original.recordKind}</span>
        <span className="[overflow-wrap:anywhere]">{row.original.recordLabel || row.original.recordId}</span>
      </span>
    ),
    meta: { className: 'min-w-44' },
  },
  { id: 'changes', header: 'Changes', cell: ({ row }) => <EventChanges event={row.original} />, meta: { className: 'min-w-64' } },
];

const isKind = (v: string | null): v is AuditKind => !!v && (auditKinds as readonly string[]).includes(v);
const isAction = (v: string | null): v is AuditAction => !!v && (auditActions as readonly string[]).includes(v);
const isDate = (v: string | null): v is string => !!v && /^\d{4}-\d{2}-\d{2}$/.test(v) && Number.isFinite(fromInstant(v));

/** Records → Change log: who changed what and when, filtered and paged on the server, with a CSV download. */
export function ChangeLogPage() {
  const [params, setParams] = useSearchParams();
  const kind = params.get('kind');
  const action = params.get('action');
  const from = params.get('from');
  const to = params.get('to');
  const rangeBackwards = isDate(from) && isDate(to) && fromInstant(from) > toInstant(to);
  const filters: AuditFilters = useMemo(
    () => ({
      kind: isKind(kind) ? kind : undefined,
      recordId: params.get('recordId') || undefined,
      userId: params.get('userId') || undefined,
      action: isAction(action) ? action : undefined,
      from: isDate(from) && !rangeBackwards ? from : undefined,
      to: isDate(to) && !rangeBackwards ? to : undefined,
      page: Math.max(1, Number(params.get('page')) || 1),
      pageSize: CHANGE_LOG_PAGE_SIZE,
    }),
    [params, kind, action, from, to, rangeBackwards],
  );
  const events = useAuditEvents(filters);
  const people = useAuditPeople();

  /** Sets one filter in the address (so the view can be shared) and goes back to page 1. */
  const setFilter = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    if (key !== 'page') next.delete('page');
    setParams(next, { replace: true });
  };
  const filtered = Boolean(filters.kind || filters.recordId || filters.userId || filters.action || filters.from || filters.to);

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        context="Records"
        title="Change log"
        description="Every change to the winery’s records: who made it, when, and each field before and after. Entries are never edited or deleted."
        actions={
          <a href={auditCsvUrl(filters)} download className={buttonClasses('secondary', 'md')}>
            <Download aria-hidden="true" className="size-4" />
            Download CSV
          </a>
        }
      />
      <form className="grid grid-cols-2 gap-3 lg:grid-cols-5" aria-label="Filter the change log" onSubmit={(e) => e.preventDefault()}>
        <FilterSelect
          label="Record kind"
          id="changes-kind"
          value={filters.kind}
          onChange={(v) => setFilter('kind', v)}
          placeholder="All records"
          options={auditKinds.map((k) => ({ value: k, label: auditKindLabels[k] }))}
        />
        <FilterSelect
          label="Person"
          id="changes-person"
          value={filters.userId}
          onChange={(v) => setFilter('userId', v)}
          placeholder="Everyone"
          options={(people.data?.items ?? []).map((p) => ({ value: p.userId, label: p.userName || p.userId }))}
        />
        <FilterSelect
          label="Action"
          id="changes-action"
          value={filters.action}
          onChange={(v) => setFilter('action', v)}
          placeholder="Any action"
          options={auditActions.map((a) => ({ value: a, label: auditActionLabels[a] }))}
        />
        <FormField label="From" htmlFor="changes-from">
          <Input id="changes-from" type="date" className="font-normal" value={from ?? ''} onChange={(e) => setFilter('from', e.target.value)} />
        </FormField>
        <FormField label="To" htmlFor="changes-to" error={rangeBackwards ? 'The end is before the start; the dates are not applied.' : undefined}>
          <Input id="changes-to" type="date" className="font-normal" value={to ?? ''} onChange={(e) => setFilter('to', e.target.value)} />
        </FormField>
      </form>
      {filters.recordId ? (
        <p className="flex flex-wrap items-center gap-2 text-sm text-ink-700">
          Showing one record’s history.
          <Button variant="ghost" size="sm" onClick={() => setFilter('recordId', '')}>
            Show every record
          </Button>
        </p>
      ) : null}
      {events.isPending ? (
        <LoadingState variant="skeleton" label="Loading the change log …" />
      ) : events.isError ? (
        <ErrorState message={events.error.message} onRetry={() => events.refetch()} />
      ) : (
        <>
          <p className="text-sm text-ink-600" aria-live="polite">
            {events.data.total === 1 ? '1 change' : `${events.data.total.toLocaleString()} changes`}
            {filtered ? (events.data.total === 1 ? ' matches the filters' : ' match the filters') : ''}
          </p>
          <ChangeLogPhoneList events={events.data.items} />
          <DataTable
            className="max-sm:hidden"
            caption="Change log"
            columns={columns}
            data={events.data.items}
            getRowId={(e) => e.id}
            pagination={{ page: filters.page ?? 1, pageSize: CHANGE_LOG_PAGE_SIZE, total: events.data.total, onPageChange: (p) => setFilter('page', String(p)) }}
            empty={filtered ? 'No change matches these filters.' : 'No changes recorded yet.'}
          />
          <PhonePager page={filters.page ?? 1} total={events.data.total} onPageChange={(p) => setFilter('page', String(p))} />
        </>
      )}
    </div>
  );
}

/** One filter of the change log as a list to choose from (empty = the filter is off); half a row on a phone. */
function FilterSelect(props: {
  label: string;
  id: string;
  value: string | undefined;
  onChange: (value: string) => void;
  placeholder: string;
  options: { value: string; label: string }[];
}) {
  return (
    <FormField label={props.label} htmlFor={props.id} className="max-sm:col-span-2">
      <Select
        id={props.id}
        className="font-normal"
        value={props.value ?? ''}
        onChange={(e) => props.onChange(e.target.value)}
        placeholder={props.placeholder}
        options={props.options}
      />
    </FormField>
  );
}

function ChangeLogPhoneList({ events }: { events: AuditEventDto[] }) {
  if (events.length === 0) return <p className="text-ink-600 sm:hidden">No changes to show.</p>;
  return (
    <ol className="flex flex-col divide-y divide-ink-100 rounded border border-ink-200 bg-white sm:hidden" aria-label="Change log">
      {events.map((e) => (
        <EventEntry key={e.id} event={e} at={when(e.at)} showRecord max={4} className="flex flex-col gap-1 px-3 py-2.5" />
      ))}
    </ol>
  );
}

function PhonePager({ page, total, onPageChange }: { page: number; total: number; onPageChange: (page: number) => void }) {
  const pages = Math.max(1, Math.ceil(total / CHANGE_LOG_PAGE_SIZE));
  return (
    <Pager label="Pages" className="sm:hidden" page={page} pages={pages} onPageChange={onPageChange} previous="Newer" next="Older">
      <span className="text-sm text-ink-700">
        Page {page} of {pages}
      </span>
    </Pager>
  );
}
