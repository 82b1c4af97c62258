import { parseISO } from 'date-fns';
import { Activity, AlertTriangle, ChevronRight, CircleCheck, Eye } from 'lucide-react';
import { Link } from 'react-router-dom';
import { MAX_DURATION_HOURS } from '@shared/engine';
import type { RunInProgressDto, RunInProgressStageDto } from '@shared/types/runs';
import { Card } from '@/components/ui/card';
import { StatusBadge } from '@/components/ui/status-badge';
import { formatDay } from '@/lib/dates';
import { paths } from '@/config/paths';
import { useUnits } from '@/lib/units';
import { formatDuration } from '@/utils/duration';

/** Largest litres figure shown for one stage; anything larger is not a forecast anyone should read. */
const MAX_SHOWN_LITRES = 1e8;
const showable = (x: number, max: number) => Number.isFinite(x) && x >= 0 && x <= max;

/** The stage's forecast in words: "About 870 L / 21 min left", or why there is no figure. */
function forecastWords(stage: RunInProgressStageDto, volume: (litres: number) => string): { text: string; figure: boolean } {
  const f = stage.forecast;
  if (!f) return { text: stage.note ?? 'No forecast yet.', figure: false };
  if (f.reachedTerminal) return { text: 'Terminal ΔP reached: regenerate or change the cartridges.', figure: false };
  if (f.beyondReadings || !showable(f.volumeLeftL, MAX_SHOWN_LITRES) || !showable(f.hoursLeft, MAX_DURATION_HOURS)) {
    return { text: 'ΔP is rising, but the end lies beyond the readings: log more for a figure.', figure: false };
  }
  return { text: `About ${volume(f.volumeLeftL)} / ${formatDuration(f.timeLeft)} left`, figure: true };
}

function Alarm({ stage }: { stage: RunInProgressStageDto }) {
  const units = useUnits();
  if (!stage.alarm) return null;
  if (stage.alarm.level === 'alarm')
    return (
      <StatusBadge tone="stop" size="sm" icon={<AlertTriangle aria-hidden="true" className="size-3.5" />}>
        Alarm: about {units.format('volume', stage.alarm.shortfallL)} short
      </StatusBadge>
    );
  if (stage.alarm.level === 'watch')
    return (
      <StatusBadge tone="watch" size="sm" icon={<Eye aria-hidden="true" className="size-3.5" />}>
        Watch: may fall short
      </StatusBadge>
    );
  return (
    <StatusBadge tone="ok" size="sm" icon={<CircleCheck aria-hidden="true" className="size-3.5" />}>
      Enough for the lot
    </StatusBadge>
  );
}

function StageLine({ stage }: { stage: RunInProgressStageDto }) {
  const units = useUnits();
  const words = forecastWords(stage, (litres) => units.format('volume', litres));
  return (
    <li className="flex flex-col gap-1 border-t border-ink-100 py-2 first:border-t-0" data-testid={`today-run-stage-${String(stage.index)}`}>
      <span className="flex flex-wrap items-baseline justify-between gap-x-3 gap-y-1">
        <span className="min-w-0 font-semibold text-ink-900">
          {stage.index + 1}. {stage.name} <span className="font-normal text-ink-600">({stage.cartridgeTypeName})</span>
        </span>
        <span className="num text-sm text-ink-700">
          ΔP {units.format('dp', stage.dpBar)} of {units.format('dp', stage.terminalDpBar)}
        </span>
      </span>
      <span className="flex flex-wrap items-center gap-x-2 gap-y-1">
        <span className={words.figure ? 'num text-base font-semibold text-ink-900' : 'text-sm text-ink-700'}>{words.text}</span>
        {words.figure ? <Alarm stage={stage} /> : null}
      </span>
      {stage.flatWarning ? (
        <span className="flex items-start gap-1.5 text-sm font-semibold text-watch-800">
          <AlertTriangle aria-hidden="true" className="mt-0.5 size-4 shrink-0" />
          <span>{stage.flatWarning}</span>
        </span>
      ) : null}
    </li>
  );
}

function RunItem({ run }: { run: RunInProgressDto }) {
  const units = useUnits();
  const date = parseISO(run.plan.plannedDate);
  return (
    <li className="px-4 py-3" data-testid="today-run">
      <Link to={paths.run(run.id)} className="flex min-h-11 items-start justify-between gap-3 rounded hover:bg-ink-50 active:bg-ink-100">
        <span className="min-w-0">
          <span className="block font-semibold text-primary-700">
            Lot {run.lot.code} <span className="font-normal text-ink-700">· {run.lot.name}</span>
          </span>
          <span className="block text-sm text-ink-600">
            {run.plan.name} ·{' '}
            <time dateTime={run.plan.plannedDate}>{formatDay(date)}</time>
            {' · '}
            <span className="num">
              {units.format('volume', run.currentVolumeL)} of {units.format('volume', run.volumeL)}
            </span>
          </span>
        </span>
        <span className="inline-flex shrink-0 items-center gap-1 text-sm font-semibold text-primary-700">
          Open run
          <ChevronRight aria-hidden="true" className="size-4" />
        </span>
      </Link>
      <ul className="mt-1">
        {run.stages.map((s) => (
          <StageLine key={s.index} stage={s} />
        ))}
      </ul>
    </li>
  );
}

/** The runs in progress, each stage with its ΔP, forecast and alarm, each run a link to its page. */
export function RunsInProgress({ runs }: { runs: RunInProgressDto[] }) {
  if (runs.length === 0) {
    return (
      <p className="flex items-start gap-2 text-sm text-ink-600">
        <Activity aria-hidden="true" className="mt-0.5 size-4 shrink-0" />
        <span>
          Runs in progress, with their readings and forecasts, are on the{' '}
          <Link to={paths.runs} className="inline-flex min-h-11 items-center text-primary-700 underline-offset-2 hover:underline">
            Runs
          </Link>{' '}
          page.
        </span>
      </p>
    );
  }
  return (
    <Card
      title="Runs in progress"
      description="Litres and time left before each stage reaches terminal ΔP, from its readings."
      actions={
        <Link to={paths.runs} className="inline-flex min-h-11 items-center text-sm font-semibold text-primary-700 underline underline-offset-2">
          All runs
        </Link>
      }
      flush
      data-testid="runs-in-progress"
    >
      <ul className="divide-y divide-ink-200">
        {runs.map((r) => (
          <RunItem key={r.id} run={r} />
        ))}
      </ul>
    </Card>
  );
}
