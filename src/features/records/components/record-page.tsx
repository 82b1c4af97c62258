import { Download, Printer, ShieldCheck } from 'lucide-react';
import { useState, type FormEvent, type ReactNode } from 'react';
import { cycleKindLabels, integrityTestLabels } from '@shared/schemas/care';
import type { RecordIntegrityTestDto, RecordRunDto, RecordStageDto } from '@shared/types/records';
import { Button, buttonClasses } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { FormField } from '@/components/ui/form-field';
import { Input } from '@/components/ui/input';
import { PageHeader } from '@/components/ui/page-header';
import { BackLink } from '@/components/records/record-page';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { paths } from '@/config/paths';
import { ApiError, errorMessage } from '@/lib/api-client';
import { formatDate, formatDateTimeUtc } from '@/lib/dates';
import { useUnits } from '@/lib/units';
import { recordCsvUrl, recordPdfUrl, useRecord } from '../api/get-record';
import { useVerifyRecord } from '../api/verify-record';
import { RecordChart } from './record-chart';
import './record-print.css';

const when = (iso: string | null) => formatDateTimeUtc(iso);
const lawNames: Record<string, string> = { complete: 'complete blocking', standard: 'standard blocking', intermediate: 'intermediate blocking', cake: 'cake filtration' };
const verdictTone = { ready: 'ok', borderline: 'watch', 'not-ready': 'stop', unknown: 'neutral' } as const;

function Facts({ rows }: { rows: [string, ReactNode][] }) {
  return (
    <dl className="grid grid-cols-1 gap-x-6 gap-y-2 sm:grid-cols-[12rem_1fr]">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-sm font-semibold text-ink-600">{k}</dt>
          <dd className="text-base text-ink-900 [overflow-wrap:anywhere]">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

function Table({ caption, head, rows }: { caption: string; head: string[]; rows: ReactNode[][] }) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[36rem] border-collapse text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead>
          <tr>
            {head.map((h) => (
              <th key={h} scope="col" className="border-b border-ink-300 px-2 py-1.5 text-left font-semibold text-ink-700">
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((r, i) => (
            <tr key={i} className="border-b border-ink-100">
              {r.map((c, j) => (
                <td key={j} className="num px-2 py-1.5 align-top text-ink-900">
                  {c}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function IntegrityTable({ caption, tests }: { caption: string; tests: RecordIntegrityTestDto[] }) {
  const units = useUnits();
  const value = (t: RecordIntegrityTestDto, v: number | null) => (v === null ? '—' : t.unit === 'bar' ? units.format('pressure', v) : `${v.toLocaleString('en', { maximumFractionDigits: 2 })} ${t.unit}`);
  return (
    <Table
      caption={caption}
      head={['Serial', 'Result', 'Test', 'Measured', 'Limit', 'By', 'When']}
      rows={tests.map((t) => [
        <span key="s" className="whitespace-nowrap">
          {t.serial}
        </span>,
        <StatusBadge key="r" size="sm" tone={t.pass ? 'ok' : 'stop'}>
          {t.pass ? 'Pass' : 'Fail'}
        </StatusBadge>,
        integrityTestLabels[t.test],
        value(t, t.measured),
        `${t.limitKind === 'min' ? 'at least' : 'at most'} ${value(t, t.limit)}`,
        t.byName ?? '—',
        when(t.at),
      ])}
    />
  );
}

function Stage({ run, stage }: { run: RecordRunDto; stage: RecordStageDto }) {
  const units = useUnits();
  return (
    <section className="flex flex-col gap-4 border-t border-ink-200 pt-4" aria-labelledby={`stage-${run.id}-${stage.index}`}>
      <h3 id={`stage-${run.id}-${stage.index}`} className="text-lg font-semibold text-ink-950">
        Stage {stage.index + 1}: {stage.name} <span className="font-normal text-ink-600">({stage.kind}) in {stage.housingName}</span>
      </h3>
      <p className="text-sm text-ink-600">
        Planned type {stage.plannedTypeName}; terminal ΔP {units.format('dp', stage.terminalDpBar)}.
      </p>
      {stage.cartridges.length === 0 ? (
        <p className="font-semibold text-stop-700">No cartridge is on record for this stage.</p>
      ) : (
        <Table
          caption={`Cartridges of stage ${stage.index + 1}`}
          head={['Serial', 'Batch', 'Type', 'Rating', 'Length', 'Litres carried', 'Litres before', 'Cycles before (steam / hot water / chemical)']}
          rows={stage.cartridges.map((c) => [
            <span key="s" className="font-semibold whitespace-nowrap">
              {c.serial}
            </span>,
            c.batch || '—',
            c.typeName,
            `${c.ratingUm} µm`,
            `${c.lengthIn} in`,
            c.litresCarried === null ? 'run open' : units.format('volume', c.litresCarried),
            units.format('volume', c.litresAtStart),
            `${c.cyclesAtStart.steam} / ${c.cyclesAtStart.hotWater} / ${c.cyclesAtStart.chemical}`,
          ])}
        />
      )}
      {stage.changes.length === 0 ? (
        <p className="text-sm text-ink-600">No cartridge changes or regenerations during the run.</p>
      ) : (
        <ul className="list-disc pl-5 text-base">
          {stage.changes.map((c, i) => (
            <li key={i}>
              {c.kind === 'change' ? 'Change' : 'Regeneration'} at {units.format('volume', c.atVolumeL)} ({when(c.at)}, {c.byName ?? 'unknown'}): out {c.removedSerials.join(', ') || '—'}; in {c.installedSerials.join(', ') || '—'}.
            </li>
          ))}
        </ul>
      )}
      <div className="record-keep flex flex-col gap-2">
        <h4 className="font-semibold text-ink-800">Sanitation before the run</h4>
        {stage.sanitation.length === 0 ? (
          <p className="text-stop-700">No sanitation was logged for these cartridges since their previous run.</p>
        ) : (
          <Table
            caption={`Sanitation of stage ${stage.index + 1}`}
            head={['Serial', 'Cycle', 'Temperature', 'Duration', 'Agent', 'By', 'When']}
            rows={stage.sanitation.map((s) => [s.serial, cycleKindLabels[s.kind], units.format('temperature', s.tempC), s.durationMin === null ? '—' : `${s.durationMin} min`, s.agent ?? '—', s.byName ?? '—', when(s.at)])}
          />
        )}
      </div>
      {stage.integrity ? (
        <div className="flex flex-col gap-3" data-testid={`integrity-${stage.index}`}>
          <div className="record-keep flex flex-col gap-2">
            <h4 className="font-semibold text-ink-800">Integrity tests before the run</h4>
            {stage.integrity.before.length === 0 ? <p className="text-stop-700">None recorded.</p> : <IntegrityTable caption="Integrity tests before the run" tests={stage.integrity.before} />}
          </div>
          <div className="record-keep flex flex-col gap-2">
            <h4 className="font-semibold text-ink-800">Integrity tests after the run</h4>
            {stage.integrity.after.length === 0 ? (
              <p className="text-stop-700">{run.status === 'closed' ? 'None recorded.' : 'Not due yet: the run is open.'}</p>
            ) : (
              <IntegrityTable caption="Integrity tests after the run" tests={stage.integrity.after} />
            )}
          </div>
          <p className={stage.integrity.status === 'proven' ? 'rounded border border-ok-200 bg-ok-50 p-3 font-semibold text-ok-700' : 'rounded border border-stop-200 bg-stop-50 p-3 font-semibold text-stop-700'} data-testid={`integrity-statement-${stage.index}`}>
            {stage.integrity.statement}
          </p>
        </div>
      ) : null}
      <RecordChart stage={stage} />
      <p className="text-base text-ink-800">
        {stage.fit ? (
          <>
            Fitted law: {lawNames[stage.fit.law] ?? stage.fit.law}; clean ΔP {units.format('dp', stage.fit.dp0Bar, 3)}, r² {stage.fit.r2.toFixed(3)}, {stage.fit.n} readings.{' '}
          </>
        ) : (
          <>{stage.fitNote} </>
        )}
        Last ΔP {units.format('dp', stage.finalDpBar)}; terminal ΔP {units.format('dp', stage.terminalDpBar)}.
      </p>
    </section>
  );
}

function Run({ run, index, count }: { run: RecordRunDto; index: number; count: number }) {
  const units = useUnits();
  const readings = run.stages.flatMap((s) => s.readings.map((r) => ({ s, r })));
  return (
    <Card className="record-run" title={`Run ${index + 1} of ${count}: ${run.status === 'closed' ? 'closed' : 'still open'}`}>
      <div className="flex flex-col gap-6">
        <Facts
          rows={[
            ['Started', `${when(run.startedAt)} by ${run.startedByName ?? 'unknown'}`],
            ['Closed', run.closedAt ? `${when(run.closedAt)} by ${run.closedByName ?? 'unknown'}` : 'Not closed yet'],
            ['Filtered', `${units.format('volume', run.volumeFilteredL)}${run.bottles === null ? '' : ` (${run.bottles.toLocaleString('en')} bottles of ${run.plan.bottleMl ?? '?'} mL)`}`],
            ['Override at start', run.overrideReason ? `${run.overrideReason} (${run.overrideByName ?? 'unknown'})` : 'None: the run started without an override.'],
          ]}
        />
        <section className="record-keep flex flex-col gap-2">
          <h3 className="text-lg font-semibold text-ink-950">Wine at filtration</h3>
          <Facts
            rows={[
              ['Sampled', run.analyses ? when(run.analyses.sampledAt) : 'No lab result was sampled before the run started.'],
              ['Turbidity', run.analyses?.turbidityNtu !== null && run.analyses?.turbidityNtu !== undefined ? `${run.analyses.turbidityNtu} NTU` : '—'],
              ['Clogging index', run.analyses?.cloggingIndex !== null && run.analyses?.cloggingIndex !== undefined ? `${run.analyses.cloggingIndex} s` : '—'],
              ['Vmax', run.analyses?.vmaxLPerM2 !== null && run.analyses?.vmaxLPerM2 !== undefined ? `${Math.round(run.analyses.vmaxLPerM2).toLocaleString('en')} L/m²` : '—'],
              [
                'Readiness at start',
                <span key="r" className="flex flex-col gap-1">
                  <StatusBadge tone={verdictTone[run.readiness.verdict]}>{run.readiness.verdict.replace('-', ' ')}</StatusBadge>
                  {run.readiness.reasons.map((r) => (
                    <span key={r} className="text-sm text-ink-700">
                      {r}
                    </span>
                  ))}
                  <span className="text-xs text-ink-500" data-testid="readiness-thresholds">
                    {run.readiness.source === 'frozen-at-start' ? 'Judged when the run started, against ' : 'Judged now, against '}
                    {run.readiness.thresholds.isDefault ? 'Porewise’s default thresholds' : 'the winery’s own thresholds'}: turbidity ready up to{' '}
                    {run.readiness.thresholds.turbidity.limitNtu} NTU, clogging index ready up to {run.readiness.thresholds.cloggingIndex.readyMaxS} s.
                  </span>
                  {run.readiness.note ? <span className="text-sm font-medium text-watch-800">{run.readiness.note}</span> : null}
                </span>,
              ],
            ]}
          />
        </section>
        <section className="record-keep flex flex-col gap-2">
          <h3 className="text-lg font-semibold text-ink-950">Plan and approval</h3>
          <Facts
            rows={[
              ['Plan', `${run.plan.name} (${formatDate(run.plan.plannedDate)})`],
              ['Train', run.plan.trainName || '—'],
              ['Line', run.plan.lineName ?? '—'],
              ['Approved', run.plan.approvedAt ? `${when(run.plan.approvedAt)} by ${run.plan.approvedByName ?? 'unknown'}` : 'Not approved'],
              [
                'Sized for',
                run.plan.sizing
                  ? `${units.format('volume', run.plan.sizing.batchL)} at ${units.format('flow', run.plan.sizing.flowLh)}, ${run.plan.sizing.runHours.toFixed(1)} h; pump ${units.format('pressure', run.plan.sizing.pumpPressureCleanBar)} clean, ${units.format('pressure', run.plan.sizing.pumpPressureEndOfRunBar)} at end of run`
                  : `No sized figures: ${run.plan.sizingNote ?? 'unknown reason'}`,
              ],
            ]}
          />
          {run.plan.sizing ? (
            <Table
              caption="Sized stages"
              head={['Stage', 'Kind', 'Cartridges', 'Area', 'Clean ΔP', 'Terminal ΔP', 'Capacity']}
              rows={run.plan.sizing.stages.map((s) => [s.name, s.kind, s.cartridgeCount, units.format('area', s.areaM2), units.format('dp', s.cleanDpBar, 3), units.format('dp', s.terminalDpBar), s.capacityL === null ? 'unknown' : units.format('volume', s.capacityL)])}
            />
          ) : null}
        </section>
        {run.stages.map((s) => (
          <Stage key={s.index} run={run} stage={s} />
        ))}
        <section className="flex flex-col gap-2 border-t border-ink-200 pt-4">
          <h3 className="text-lg font-semibold text-ink-950">Readings</h3>
          {readings.length === 0 ? (
            <p className="text-ink-600">No readings were logged.</p>
          ) : (
            <Table
              caption="Readings"
              head={['Stage', 'When', 'Litres', 'Upstream', 'Downstream', 'ΔP', 'Flow', 'Temp.', 'By', 'Correction']}
              rows={readings.map(({ s, r }) => {
                const c = r.corrections.at(-1);
                const struck = c ? 'line-through text-ink-500' : '';
                return [
                  s.index + 1,
                  when(r.at),
                  <span key="v" className={struck}>{units.format('volume', r.volumeL)}</span>,
                  <span key="u" className={struck}>{units.format('pressure', r.upstreamBar)}</span>,
                  <span key="d" className={struck}>{units.format('pressure', r.downstreamBar)}</span>,
                  <span key="p" className={struck}>{units.format('dp', r.dpBar)}</span>,
                  units.format('flow', r.flowLh),
                  units.format('temperature', r.tempC),
                  r.byName ?? '—',
                  !c ? '' : c.kind === 'void' ? `Voided: ${c.reason} (${c.byName ?? '?'}, ${when(c.at)})` : `Corrected: ${c.reason} (${c.byName ?? '?'}, ${when(c.at)})`,
                ];
              })}
            />
          )}
        </section>
        <section className="record-keep flex flex-col gap-2 border-t border-ink-200 pt-4">
          <h3 className="text-lg font-semibold text-ink-950">Closing notes</h3>
          <p className="whitespace-pre-wrap text-base text-ink-900">{run.notes.trim() || <span className="text-ink-600">No closing notes.</span>}</p>
        </section>
      </div>
    </Card>
  );
}

function VerifyForm({ lotId }: { lotId: string }) {
  const verify = useVerifyRecord();
  const [value, setValue] = useState('');
  const fieldError = verify.error instanceof ApiError ? verify.error.fields.fingerprint : undefined;
  const submit = (e: FormEvent) => {
    e.preventDefault();
    verify.mutate({ lotId, fingerprint: value });
  };
  return (
    <form onSubmit={submit} className="record-no-print flex flex-col gap-2 sm:flex-row sm:items-end" aria-label="Check a printed fingerprint">
      <FormField className="flex-1" label="Check a printed copy: its fingerprint" htmlFor="verify-fp" error={fieldError ?? (verify.isError && !fieldError ? errorMessage(verify.error) : undefined)}>
        <Input id="verify-fp" value={value} onChange={(e) => setValue(e.target.value)} autoComplete="off" spellCheck={false} className="font-mono" />
      </FormField>
      <Button type="submit" variant="secondary" size="lg" loading={verify.isPending} icon={<ShieldCheck aria-hidden="true" />}>
        Check
      </Button>
      {verify.data ? (
        <p role="status" className={verify.data.matches ? 'font-semibold text-ok-700' : 'font-semibold text-stop-700'}>
          {verify.data.matches ? 'Matches: the copy shows the record as it stands.' : 'Does not match: the copy differs from the record as it stands now.'}
        </p>
      ) : null}
    </form>
  );
}

/** Prints the page on the chosen paper: the @page size is set just for this print. */
function printOn(paper: 'A4' | 'letter') {
  const style = document.createElement('style');
  style.textContent = `@page { size: ${paper}; }`;
  document.head.appendChild(style);
  const cleanup = () => {
    style.remove();
    window.removeEventListener('afterprint', cleanup);
  };
  window.addEventListener('afterprint', cleanup);
  window.print();
}

/** The bottling filtration record of one lot, with its downloads and fingerprint. */
export function RecordPage({ lotId }: { lotId: string }) {
  const query = useRecord(lotId);
  if (query.isPending) return <LoadingState label="Making the record …" />;
  if (query.isError) {
    const notFound = query.error instanceof ApiError && query.error.status === 404;
    return (
      <ErrorState
        title={notFound ? 'No record for this lot' : 'The record could not be made'}
        message={notFound ? 'The lot has no run yet, belongs to another winery, or the link is wrong.' : errorMessage(query.error)}
        onRetry={notFound ? undefined : () => void query.refetch()}
      />
    );
  }
  const r = query.data;
  return (
    <div className="record-sheet flex flex-col gap-6">
      <PageHeader
        context={
          <BackLink to={paths.records} className="record-no-print min-h-11">
            Records
          </BackLink>
        }
        title={
          <>
            Filtration record · <span className="num">{r.lot.code}</span> · {r.lot.name}
          </>
        }
        description={`${r.lot.style}${r.lot.vintage ? `, vintage ${r.lot.vintage}` : ''} · ${r.runs.length === 1 ? '1 run' : `${r.runs.length} runs`}`}
        actions={
          <div className="record-no-print flex flex-wrap gap-2">
            <a className={buttonClasses('primary', 'lg', 'gap-2')} href={recordPdfUrl(lotId, 'a4')} download>
              <Download aria-hidden="true" className="size-5" /> PDF (A4)
            </a>
            <a className={buttonClasses('secondary', 'lg', 'gap-2')} href={recordPdfUrl(lotId, 'letter')} download>
              <Download aria-hidden="true" className="size-5" /> PDF (Letter)
            </a>
            <a className={buttonClasses('secondary', 'lg', 'gap-2')} href={recordCsvUrl(lotId)} download>
              <Download aria-hidden="true" className="size-5" /> CSV
            </a>
            <Button variant="secondary" size="lg" icon={<Printer aria-hidden="true" />} onClick={() => printOn('A4')}>
              Print A4
            </Button>
            <Button variant="secondary" size="lg" icon={<Printer aria-hidden="true" />} onClick={() => printOn('letter')}>
              Print Letter
            </Button>
          </div>
        }
      />
      <Card title="Fingerprint">
        <div className="flex flex-col gap-3">
          <p className="font-mono text-sm break-all text-ink-900" data-testid="fingerprint">
            {r.fingerprint}
          </p>
          <p className="text-sm text-ink-600">
            SHA-256 of this record’s content, made {when(r.generatedAt)}. The same record always gives the same fingerprint; any change to it gives another. The time the copy was made is not part of it.
          </p>
          <VerifyForm lotId={lotId} />
        </div>
      </Card>
      {r.runs.map((run, i) => (
        <Run key={run.id} run={run} index={i} count={r.runs.length} />
      ))}
      <p className="record-print-footer text-xs text-ink-600">
        Fingerprint (SHA-256) {r.fingerprint} · made {when(r.generatedAt)}
      </p>
    </div>
  );
}
