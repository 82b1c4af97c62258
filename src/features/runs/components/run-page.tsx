import { AlertTriangle, CircleCheck, Eye, FileUp } from 'lucide-react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { LogReadingInput } from '@shared/schemas/runs';
import type { RunReadingDto, RunStageDto, RunStageFinalDto } from '@shared/types/runs';
import { FetchedAt } from '@/components/offline/fetched-at';
import { CautionPanel } from '@/components/ui/caution';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { useOutbox, type OutboxEntry } from '@/lib/offline/outbox-runtime';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useRun } from '../api/get-run';
import { CloseRun } from './close-run';
import { forecastView } from './forecast-text';
import { ReadingCorrections } from './reading-corrections';
import { ReadingForm } from './reading-form';
import { ReadingsTable } from './readings-table';
import { StageChart } from './stage-chart-lazy';
import { RunCartridges } from './run-cartridges';
import { formatDateTime } from '@/lib/dates';

function AlarmBadge({ stage }: { stage: RunStageDto }) {
  if (!stage.alarm) return null;
  if (stage.alarm.level === 'alarm')
    return (
      <StatusBadge tone="stop" icon={<AlertTriangle aria-hidden="true" className="size-5" />}>
        Alarm: short of the lot
      </StatusBadge>
    );
  if (stage.alarm.level === 'watch')
    return (
      <StatusBadge tone="watch" icon={<Eye aria-hidden="true" className="size-5" />}>
        Watch: may fall short
      </StatusBadge>
    );
  return (
    <StatusBadge tone="ok" icon={<CircleCheck aria-hidden="true" className="size-5" />}>
      Enough for the lot
    </StatusBadge>
  );
}

/** A closed run's stage: what it did, in words and figures; no forecast and no alarm. */
function FinalFigures({ stage, final }: { stage: RunStageDto; final: RunStageFinalDto }) {
  const units = useUnits();
  const swaps = [final.changes ? `${String(final.changes)} change${final.changes === 1 ? '' : 's'}` : '', final.regenerations ? `${String(final.regenerations)} regeneration${final.regenerations === 1 ? '' : 's'}` : ''].filter(Boolean).join(' and ');
  return (
    <div className="flex flex-col gap-2" data-testid={`final-${String(stage.index)}`}>
      <p className="text-sm font-semibold uppercase tracking-wide text-ink-600">Final figures</p>
      <dl className="grid grid-cols-1 gap-x-6 gap-y-1 sm:grid-cols-2">
        <div className="flex items-baseline justify-between gap-3 border-b border-ink-100 py-1">
          <dt className="text-sm text-ink-600">Litres through the stage</dt>
          <dd className="num text-right text-base font-semibold text-ink-900">{units.format('volume', final.litresL)}</dd>
        </div>
        <div className="flex items-baseline justify-between gap-3 border-b border-ink-100 py-1">
          <dt className="text-sm text-ink-600">Through the last set</dt>
          <dd className="num text-right text-base font-semibold text-ink-900">
            {units.format('volume', final.litresLastSetL)}
            <span className="block text-xs font-normal text-ink-600">{swaps ? `after ${swaps}` : 'one set for the whole run'}</span>
          </dd>
        </div>
        <div className="flex items-baseline justify-between gap-3 border-b border-ink-100 py-1">
          <dt className="text-sm text-ink-600">Final ΔP</dt>
          <dd className="num text-right text-base font-semibold text-ink-900">
            {final.lastDpBar === null ? 'no reading' : units.format('dp', final.lastDpBar)}
            <span className="font-normal text-ink-600"> of {units.format('dp', stage.terminalDpBar)} terminal</span>
          </dd>
        </div>
        <div className="flex items-baseline justify-between gap-3 border-b border-ink-100 py-1">
          <dt className="text-sm text-ink-600">Terminal ΔP</dt>
          <dd className="text-right text-base font-semibold text-ink-900">
            {final.terminalReached ? 'reached by the last set' : final.maxDpBar === null ? 'unknown: no reading on the last set' : 'not reached'}
            {final.maxDpBar !== null ? <span className="num block text-xs font-normal text-ink-600">highest {units.format('dp', final.maxDpBar)}</span> : null}
          </dd>
        </div>
      </dl>
    </div>
  );
}

function StageCard({ runId, stage, kept, rowActions, importTo }: { runId: string; stage: RunStageDto; kept: OutboxEntry[]; rowActions?: (reading: RunReadingDto) => ReactNode; importTo?: string }) {
  const units = useUnits();
  const f = stage.forecast;
  const view = forecastView(f, stage.note, (litres) => units.format('volume', litres));
  const waitingPoints = kept.map((e) => {
    const x = e.body as LogReadingInput;
    return { volumeL: x.volumeL, dpBar: x.upstreamBar - x.downstreamBar };
  });
  return (
    <Card title={`${String(stage.index + 1)}. ${stage.name}`} description={`${stage.cartridgeTypeName} in ${stage.housingName} · terminal ΔP ${units.format('dp', stage.terminalDpBar)}`}>
      <div className="flex flex-col gap-4">
        {stage.final ? <FinalFigures stage={stage} final={stage.final} /> : null}
        {stage.final && stage.note ? <p className="text-sm text-ink-700">{stage.note}</p> : null}
        {stage.flatWarning && stage.final ? (
          <p className="text-sm text-ink-700" data-testid={`flat-${String(stage.index)}`}>
            {stage.flatWarning} Worth checking the housing’s bypass and drain valves and the gauge before the next run.
          </p>
        ) : null}
        {stage.flatWarning && !stage.final ? (
          <div role="alert" className="flex items-start gap-2 rounded border border-watch-200 bg-watch-50 px-4 py-3 text-base text-ink-900" data-testid={`flat-${String(stage.index)}`}>
            <AlertTriangle aria-hidden="true" className="mt-0.5 size-5 shrink-0 text-watch-700" />
            <span>{stage.flatWarning} Check the housing’s bypass and drain valves and the gauge before trusting any forecast.</span>
          </div>
        ) : null}
        {stage.final ? null : f && view.kind !== 'none' ? (
          <div className="flex flex-col gap-2" data-testid={`forecast-${String(stage.index)}`}>
            <p className="text-sm font-semibold uppercase tracking-wide text-ink-600">Left before terminal ΔP</p>
            <p className="num text-2xl font-semibold text-ink-900">{view.headline}</p>
            <p className="num text-base text-ink-700">
              {view.kind === 'figure' ? view.band : view.detail}
              {stage.flowLh ? <> · at {units.format('flow', stage.flowLh)}</> : null}
            </p>
            {view.kind === 'figure' ? <AlarmBadge stage={stage} /> : null}
            {view.kind === 'figure' && stage.alarm?.alarm ? (
              <p className="text-base font-semibold text-stop-700">About {units.format('volume', stage.alarm.shortfallL)} short: have the next cartridges ready.</p>
            ) : null}
          </div>
        ) : (
          <p className="text-base text-ink-700" data-testid={`forecast-note-${String(stage.index)}`}>
            {view.headline}
          </p>
        )}
        {stage.readings.length + kept.length > 0 ? (
          <StageChart stage={stage} waiting={waitingPoints} />
        ) : null}
        <p className="text-sm text-ink-600">
          {stage.readingCount.toLocaleString('en')} reading{stage.readingCount === 1 ? '' : 's'}
          {stage.readings.length > 0 ? <> · last ΔP {units.format('dp', stage.readings[stage.readings.length - 1].dpBar)}</> : null}
          {kept.length > 0 ? <> · {kept.length} waiting to send</> : null}
        </p>
        <ReadingsTable runId={runId} stage={stage} kept={kept} rowActions={rowActions} />
        {importTo ? (
          <Link to={importTo} className="inline-flex min-h-11 items-center gap-2 self-start font-semibold text-primary-700 hover:underline">
            <FileUp aria-hidden="true" className="size-5" /> Import logger file
          </Link>
        ) : null}
      </div>
    </Card>
  );
}

export interface RunPageProps {
  runId: string;
  /** Slot for a stored reading's actions in the readings tables (correct / void). */
  readingActions?: (reading: RunReadingDto, stage: RunStageDto) => ReactNode;
}

export function RunPage({ runId, readingActions }: RunPageProps) {
  const units = useUnits();
  const run = useRun(runId);
  const mayLog = useCan('runs:log');
  const outbox = useOutbox();
  if (run.isPending) return <LoadingState />;
  if (run.isError && !run.data) return <ErrorState title="This run could not be loaded" message={errorMessage(run.error)} onRetry={() => void run.refetch()} />;
  const r = run.data;
  const running = r.status === 'running';
  const kept = outbox.filter((e) => e.kind === 'reading' && e.runId === r.id);
  const keptOf = (index: number) => kept.filter((e) => (e.body as LogReadingInput).stageIndex === index);
  return (
    <div className="mx-auto flex w-full max-w-3xl flex-col gap-6">
      <PageHeader
        context={
          <Link to={paths.runs} className="underline">
            Runs
          </Link>
        }
        title={
          <>
            <span className="num">{r.lotCode}</span> · {r.lotName}
          </>
        }
        description={`${r.planName} · ${r.trainName}${r.lineName ? ` · ${r.lineName}` : ''}`}
        actions={<StatusBadge tone="neutral">{running ? 'Running' : 'Closed'}</StatusBadge>}
      />
      <FetchedAt at={run.dataUpdatedAt} />
      {running && mayLog ? (
        <Card>
          <ReadingForm run={r} />
        </Card>
      ) : null}
      <section aria-label={running ? 'Run so far' : 'The run as closed'} className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <div className="rounded-lg border border-ink-200 p-4">
          <p className="text-sm font-semibold uppercase tracking-wide text-ink-600">Filtered</p>
          <p className="num text-2xl font-semibold text-ink-900">{units.format('volume', r.currentVolumeL)}</p>
          <p className="num text-base text-ink-700">of {units.format('volume', r.volumeL)}</p>
        </div>
        <div className="rounded-lg border border-ink-200 p-4">
          <p className="text-sm font-semibold uppercase tracking-wide text-ink-600">{running ? 'Still to bottle' : 'Left unfiltered'}</p>
          <p className="num text-2xl font-semibold text-ink-900">{units.format('volume', r.volumeToBottleL)}</p>
          <p className="text-base text-ink-700">{running ? 'Running' : `Closed${r.closedAt ? ` ${formatDateTime(r.closedAt)}` : ''}${r.closedByName ? ` by ${r.closedByName}` : ''}`}</p>
        </div>
      </section>
      <CautionPanel title="Under pressure">
        Never open a housing under pressure and keep within its pressure and temperature ratings. Forecasts are planning estimates from the readings so far.
      </CautionPanel>
      {r.stages.map((s) => (
        <StageCard
          key={s.index}
          runId={r.id}
          stage={s}
          kept={keptOf(s.index)}
          rowActions={readingActions ? (reading) => readingActions(reading, s) : undefined}
          importTo={running && mayLog ? paths.runImport(r.id, s.index) : undefined}
        />
      ))}
      <RunCartridges run={r} />
      <ReadingCorrections run={r} />
      {r.notes ? (
        <Card title="Closing notes">
          <p className="whitespace-pre-line text-base text-ink-900">{r.notes}</p>
        </Card>
      ) : null}
      {running && mayLog ? (
        <div className="flex justify-end border-t border-ink-200 pt-4">
          <CloseRun run={r} waiting={kept.filter((e) => e.status === 'waiting').length} />
        </div>
      ) : null}
    </div>
  );
}
