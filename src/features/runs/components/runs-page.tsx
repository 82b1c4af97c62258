import { Gauge, Play } from 'lucide-react';
import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { StatusBadge } from '@/components/ui/status-badge';
import { useToast } from '@/components/ui/toast';
import { paths } from '@/config/paths';
import { ApiError, errorMessage } from '@/lib/api-client';
import { useCan } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { useRunStartOptions } from '../api/get-run-start-options';
import { useRuns } from '../api/get-runs';
import { useStartRun } from '../api/start-run';
import { StartBlockedDialog, type BlockReason } from './start-blocked-dialog';
import { formatDate } from '@/lib/dates';

function StartOptions() {
  const units = useUnits();
  const options = useRunStartOptions();
  const start = useStartRun();
  const toast = useToast();
  const navigate = useNavigate();
  const mayLog = useCan('runs:log');
  const [blocked, setBlocked] = useState<{ planLotId: string; reasons: BlockReason[] } | null>(null);
  if (options.isPending) return <LoadingState label="Loading approved plans …" />;
  if (options.isError) return <ErrorState title="Approved plans could not be loaded" message={errorMessage(options.error)} onRetry={() => void options.refetch()} />;
  const items = options.data.items;
  return (
    <Card title="Start a run" description="Lots of approved plans with a chosen train.">
      {items.length === 0 ? (
        <p className="text-base text-ink-700">No approved plan has a lot with a chosen train yet. Approve a plan on the Plans page first.</p>
      ) : (
        <ul className="flex flex-col gap-3">
          {items.map((o) => (
            <li key={o.planLotId} className="flex flex-col gap-2 rounded-md border border-ink-200 p-3 sm:flex-row sm:items-center sm:justify-between">
              <div>
                <p className="text-lg font-semibold text-ink-900">
                  <span className="num">{o.lotCode}</span> · {o.lotName}
                </p>
                <p className="text-base text-ink-700">
                  {o.planName} · {formatDate(o.plannedDate)} · {units.format('volume', o.volumeL)} · {o.trainName}
                </p>
              </div>
              {o.runningRunId ? (
                <Link className="text-base font-semibold text-brand-700 underline" to={paths.run(o.runningRunId)}>
                  Open the running run
                </Link>
              ) : mayLog ? (
                <Button
                  size="lg"
                  disabled={start.isPending}
                  onClick={() =>
                    start.mutate(
                      { planLotId: o.planLotId },
                      {
                        onSuccess: (run) => void navigate(paths.run(run.id)),
                        onError: (e) => {
                          if (e instanceof ApiError && e.code === 'run_blocked') setBlocked({ planLotId: o.planLotId, reasons: e.body?.reasons ?? [] });
                          else toast.show({ tone: 'error', title: errorMessage(e) });
                        },
                      },
                    )
                  }
                >
                  <Play aria-hidden="true" className="size-5" /> Start run
                </Button>
              ) : null}
            </li>
          ))}
        </ul>
      )}
      {blocked ? (
        <StartBlockedDialog
          planLotId={blocked.planLotId}
          reasons={blocked.reasons}
          onClose={() => setBlocked(null)}
          onStarted={(id) => {
            setBlocked(null);
            void navigate(paths.run(id));
          }}
        />
      ) : null}
    </Card>
  );
}

export function RunsPage() {
  const units = useUnits();
  const runs = useRuns();
  return (
    <div className="flex flex-col gap-6">
      <PageHeader title="Runs" description="Follow each lot through its train by pressure readings. Forecasts are planning estimates." />
      <StartOptions />
      <Card title="Runs so far">
        {runs.isPending ? (
          <LoadingState />
        ) : runs.isError ? (
          <ErrorState title="Runs could not be loaded" message={errorMessage(runs.error)} onRetry={() => void runs.refetch()} />
        ) : runs.data.items.length === 0 ? (
          <EmptyState icon={<Gauge aria-hidden="true" className="size-8" />} title="No runs yet">
            Start a run from an approved plan’s lot above, then log pressure readings as the wine goes through.
          </EmptyState>
        ) : (
          <ul className="flex flex-col gap-2">
            {runs.data.items.map((r) => (
              <li key={r.id}>
                <Link to={paths.run(r.id)} className="flex min-h-11 flex-col gap-1 rounded-md border border-ink-200 p-3 hover:bg-ink-50 sm:flex-row sm:items-center sm:justify-between">
                  <span className="text-lg font-semibold text-ink-900">
                    <span className="num">{r.lotCode}</span> · {r.lotName}
                  </span>
                  <span className="flex items-center gap-3 text-base text-ink-700">
                    <span className="num">
                      {units.format('volume', r.currentVolumeL)} of {units.format('volume', r.volumeL)}
                    </span>
                    <StatusBadge tone={r.status === 'running' ? 'info' : 'neutral'}>{r.status === 'running' ? 'Running' : 'Closed'}</StatusBadge>
                  </span>
                </Link>
              </li>
            ))}
          </ul>
        )}
      </Card>
    </div>
  );
}
