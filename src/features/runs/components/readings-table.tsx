import { CloudOff, OctagonX } from 'lucide-react';
import type { ReactNode } from 'react';
import type { LogReadingInput } from '@shared/schemas/runs';
import type { RunReadingDto, RunStageDto } from '@shared/types/runs';
import type { OutboxEntry } from '@/lib/offline/outbox-runtime';
import { useUnits } from '@/lib/units';
import { formatDayMonthTime } from '@/lib/dates';
import { useRunReadingPages } from '../api/get-run-readings';
import { ReadingsPager } from './readings-pager';

const PAGE = 10;

/** A row of the table: a stored reading, or one kept on this device (waiting or refused). */
export type ReadingRow =
  | { kind: 'stored'; reading: RunReadingDto }
  | { kind: 'kept'; entry: OutboxEntry; input: LogReadingInput };

export interface ReadingsTableProps {
  runId: string;
  stage: RunStageDto;
  /** This stage's readings kept on the device, not yet stored. */
  kept: OutboxEntry[];
  /**
   * The slot for a stored reading's actions (e.g. correct or void it); rendered in the last
   * column and under each phone row. Kept readings have their own actions on the Waiting page.
   */
  rowActions?: (reading: RunReadingDto) => ReactNode;
}

function when(iso: string) {
  return formatDayMonthTime(iso);
}

function KeptBadge({ entry }: { entry: OutboxEntry }) {
  if (entry.status === 'refused') {
    return (
      <span className="inline-flex items-center gap-1 text-sm font-semibold text-stop-700" title={entry.refusal?.message}>
        <OctagonX aria-hidden="true" className="size-4" /> Refused
      </span>
    );
  }
  return (
    <span className="inline-flex items-center gap-1 text-sm font-semibold text-watch-800">
      <CloudOff aria-hidden="true" className="size-4" /> Waiting
    </span>
  );
}

/**
 * The readings of one stage, newest first, a page at a time from the server; those still waiting
 * to send (kept on this device) stand on top of the first page, marked.
 */
export function ReadingsTable({ runId, stage, kept, rowActions }: ReadingsTableProps) {
  const units = useUnits();
  const { stored, page: pageNo, setPage: setPageNo, total, pages } = useRunReadingPages(runId, stage.index, PAGE);
  const rows: ReadingRow[] = [
    ...(pageNo === 1 ? kept.map((entry) => ({ kind: 'kept' as const, entry, input: entry.body as LogReadingInput })).reverse() : []),
    ...(stored.data?.items ?? []).map((reading) => ({ kind: 'stored' as const, reading })),
  ];
  if (rows.length === 0 && pageNo === 1) return null;
  const page = rows;
  const cells = (r: ReadingRow) => {
    const x = r.kind === 'stored' ? r.reading : { ...r.input, at: r.input.at ?? r.entry.createdAt, dpBar: r.input.upstreamBar - r.input.downstreamBar, byName: null };
    return {
      key: r.kind === 'stored' ? r.reading.id : r.entry.id,
      at: when(x.at),
      volume: units.format('volume', x.volumeL),
      up: units.format('pressure', x.upstreamBar),
      down: units.format('pressure', x.downstreamBar),
      dp: units.format('dp', x.dpBar),
      flow: units.format('flow', x.flowLh ?? null),
      temp: units.format('temperature', x.tempC ?? null),
      who: r.kind === 'stored' ? (x.byName ?? '—') : <KeptBadge entry={r.entry} />,
      actions: r.kind === 'stored' && rowActions ? rowActions(r.reading) : null,
    };
  };
  const headers = ['Time', 'Litres', 'Upstream', 'Downstream', 'ΔP', 'Flow', 'Temp.', 'Who'];
  return (
    <div className="flex flex-col gap-2" data-testid={`readings-${String(stage.index)}`}>
      <h3 className="text-base font-semibold text-ink-900">Readings, newest first</h3>
      {/* Phones: one card per reading. */}
      <ul className="flex flex-col divide-y divide-ink-200 rounded border border-ink-200 sm:hidden">
        {page.map((r) => {
          const c = cells(r);
          return (
            <li key={c.key} className={r.kind === 'kept' ? 'bg-watch-50 px-3 py-2' : 'px-3 py-2'} data-waiting={r.kind === 'kept' || undefined}>
              <div className="flex items-baseline justify-between gap-2">
                <span className="num font-semibold text-ink-900">
                  {c.volume} · ΔP {c.dp}
                </span>
                <span className="text-sm text-ink-600">{c.at}</span>
              </div>
              <div className="num flex flex-wrap gap-x-3 text-sm text-ink-700">
                <span>
                  {c.up} → {c.down}
                </span>
                {c.flow !== '—' ? <span>{c.flow}</span> : null}
                {c.temp !== '—' ? <span>{c.temp}</span> : null}
                <span>{c.who}</span>
              </div>
              {c.actions ? <div className="mt-1">{c.actions}</div> : null}
            </li>
          );
        })}
      </ul>
      {/* Wider screens: the table. */}
      <div className="hidden overflow-x-auto sm:block">
        <table className="w-full text-sm">
          <caption className="sr-only">Readings of {stage.name}, newest first</caption>
          <thead>
            <tr className="border-b border-ink-200 text-left text-ink-600">
              {headers.map((h) => (
                <th key={h} scope="col" className="px-2 py-1.5 font-semibold">
                  {h}
                </th>
              ))}
              {rowActions ? (
                <th scope="col" className="px-2 py-1.5">
                  <span className="sr-only">Actions</span>
                </th>
              ) : null}
            </tr>
          </thead>
          <tbody>
            {page.map((r) => {
              const c = cells(r);
              return (
                <tr key={c.key} className={r.kind === 'kept' ? 'border-b border-ink-100 bg-watch-50' : 'border-b border-ink-100'} data-waiting={r.kind === 'kept' || undefined}>
                  <td className="px-2 py-1.5 whitespace-nowrap">{c.at}</td>
                  <td className="num px-2 py-1.5 whitespace-nowrap">{c.volume}</td>
                  <td className="num px-2 py-1.5 whitespace-nowrap">{c.up}</td>
                  <td className="num px-2 py-1.5 whitespace-nowrap">{c.down}</td>
                  <td className="num px-2 py-1.5 font-semibold whitespace-nowrap">{c.dp}</td>
                  <td className="num px-2 py-1.5 whitespace-nowrap">{c.flow}</td>
                  <td className="num px-2 py-1.5 whitespace-nowrap">{c.temp}</td>
                  <td className="px-2 py-1.5">{c.who}</td>
                  {rowActions ? <td className="px-2 py-1.5">{c.actions}</td> : null}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <ReadingsPager label={`Pages of ${stage.name}'s readings`} page={pageNo} pages={pages} onPageChange={setPageNo} extra={` · ${total.toLocaleString('en')} stored`} />
    </div>
  );
}
