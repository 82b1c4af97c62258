import { FileText, Search, X } from 'lucide-react';
import { useState, type FormEvent } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { WINE_STYLES } from '@shared/engine';
import { Button } from '@/components/ui/button';
import { Pager } from '@/components/ui/pager';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { Select } from '@/components/ui/select';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useUnits } from '@/lib/units';
import { useRecordLots } from '../api/get-record-lots';
import type { RecordLotFilters } from '../api/keys';
import { formatDate } from '@/lib/dates';

const FIELDS = ['from', 'to', 'q', 'style', 'serial', 'batch'] as const;
type Field = (typeof FIELDS)[number];
const PAGE_SIZE = 25;

function filtersFrom(params: URLSearchParams): RecordLotFilters {
  const f: RecordLotFilters = {};
  for (const k of FIELDS) {
    const v = params.get(k);
    if (v) f[k] = v;
  }
  const page = Number(params.get('page'));
  if (Number.isInteger(page) && page > 1) f.page = page;
  return f;
}

/** Records: the bottled lots, found by date, lot, style, or the cartridge (serial or batch) that filtered them. */
export function RecordsPage() {
  const units = useUnits();
  const [params, setParams] = useSearchParams();
  const filters = filtersFrom(params);
  const [draft, setDraft] = useState<Record<Field, string>>(() => Object.fromEntries(FIELDS.map((k) => [k, params.get(k) ?? ''])) as Record<Field, string>);
  const lots = useRecordLots(filters);
  const fieldErrors = lots.error instanceof ApiError ? lots.error.fields : {};
  const set = (k: Field) => (e: { target: { value: string } }) => setDraft((d) => ({ ...d, [k]: e.target.value }));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const next = new URLSearchParams();
    for (const k of FIELDS) if (draft[k].trim()) next.set(k, draft[k].trim());
    setParams(next);
  };
  const clear = () => {
    setDraft(Object.fromEntries(FIELDS.map((k) => [k, ''])) as Record<Field, string>);
    setParams(new URLSearchParams());
  };
  const page = filters.page ?? 1;
  const goTo = (p: number) => {
    const next = new URLSearchParams(params);
    if (p > 1) next.set('page', String(p));
    else next.delete('page');
    setParams(next);
  };
  const tracing = Boolean(filters.serial || filters.batch);

  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Records" description="Every bottled lot with its filtration record: the cartridges that filtered it, the integrity tests before and after, the readings, and a fingerprint to check a printed copy." />
      <Card title="Find bottled lots" description="A cartridge serial or batch finds every lot it filtered — the trace a recall needs.">
        <form onSubmit={submit} className="grid grid-cols-1 gap-4 sm:grid-cols-2 lg:grid-cols-3" aria-label="Find bottled lots">
          <FormField label="Cartridge serial" htmlFor="rec-serial" error={fieldErrors.serial}>
            <Input id="rec-serial" value={draft.serial} onChange={set('serial')} autoComplete="off" />
          </FormField>
          <FormField label="Cartridge batch" htmlFor="rec-batch" error={fieldErrors.batch}>
            <Input id="rec-batch" value={draft.batch} onChange={set('batch')} autoComplete="off" />
          </FormField>
          <FormField label="Lot code, name or plan" htmlFor="rec-q" error={fieldErrors.q}>
            <Input id="rec-q" value={draft.q} onChange={set('q')} autoComplete="off" />
          </FormField>
          <FormField label="Style" htmlFor="rec-style" error={fieldErrors.style}>
            <Select id="rec-style" value={draft.style} onChange={set('style')} placeholder="Any style" options={WINE_STYLES.map((s) => ({ value: s, label: s[0].toUpperCase() + s.slice(1) }))} />
          </FormField>
          <FormField label="Bottled from" htmlFor="rec-from" error={fieldErrors.from}>
            <Input id="rec-from" type="date" value={draft.from} onChange={set('from')} />
          </FormField>
          <FormField label="Bottled to" htmlFor="rec-to" error={fieldErrors.to}>
            <Input id="rec-to" type="date" value={draft.to} onChange={set('to')} />
          </FormField>
          <div className="flex flex-wrap gap-2 sm:col-span-2 lg:col-span-3">
            <Button type="submit" size="lg" icon={<Search aria-hidden="true" />}>
              Find
            </Button>
            <Button type="button" size="lg" variant="secondary" icon={<X aria-hidden="true" />} onClick={clear}>
              Clear
            </Button>
          </div>
        </form>
      </Card>
      <Card title={tracing ? `Lots filtered by ${filters.serial ? `cartridge ${filters.serial}` : `batch ${filters.batch ?? ''}`}` : 'Bottled lots'}>
        {lots.isPending ? (
          <LoadingState />
        ) : lots.isError ? (
          <ErrorState title="Records could not be loaded" message={errorMessage(lots.error)} onRetry={() => void lots.refetch()} />
        ) : lots.data.items.length === 0 ? (
          <EmptyState icon={<FileText aria-hidden="true" className="size-8" />} title={Object.keys(filters).length ? 'No bottled lot matches' : 'No bottled lots yet'}>
            {Object.keys(filters).length ? 'Check the serial or batch, or widen the dates.' : 'A lot appears here once its run is closed on the Runs page.'}
          </EmptyState>
        ) : (
          <>
            <p className="mb-3 text-sm text-ink-600" aria-live="polite">
              {lots.data.total === 1 ? '1 lot' : `${lots.data.total.toLocaleString('en')} lots`}
            </p>
            <ul className="flex flex-col gap-2" aria-label="Bottled lots">
              {lots.data.items.map((l) => (
                <li key={l.lotId}>
                  <Link
                    to={paths.record(l.lotId)}
                    className="flex min-h-11 flex-col gap-1 rounded-md border border-ink-200 p-3 hover:bg-ink-50 sm:flex-row sm:items-center sm:justify-between"
                  >
                    <span className="min-w-0">
                      <span className="block text-lg font-semibold text-ink-900 [overflow-wrap:anywhere]">
                        <span className="num">{l.code}</span> · {l.name}
                      </span>
                      <span className="block text-sm text-ink-600 [overflow-wrap:anywhere]">
                        {l.style} · {l.planNames.join(', ')}
                      </span>
                    </span>
                    <span className="flex shrink-0 flex-col text-base text-ink-700 sm:items-end">
                      <span className="num">{units.format('volume', l.volumeFilteredL)} filtered</span>
                      <span className="text-sm text-ink-600">
                        bottled {formatDate(l.lastBottledAt)}
                        {l.runCount > 1 ? ` · ${l.runCount} runs` : ''}
                      </span>
                    </span>
                  </Link>
                </li>
              ))}
            </ul>
            <Pager label="Pages" align="start" className="mt-4" page={page} pages={Math.ceil(lots.data.total / PAGE_SIZE)} onPageChange={goTo} previous="Previous" next="Next">
              <span className="text-sm text-ink-700">
                Page {page} of {Math.ceil(lots.data.total / PAGE_SIZE)}
              </span>
            </Pager>
          </>
        )}
      </Card>
    </div>
  );
}
