import type { DayBlockKind } from '@shared/engine';
import type { PlanDto } from '@shared/types/plans';
import { Card } from '@/components/ui/card';
import { GasCaution } from '@/components/ui/caution';
import { cn } from '@/utils/cn';

const kindWords: Record<DayBlockKind, string> = {
  sanitation: 'Sanitation',
  'integrity-before': 'Integrity test',
  run: 'Run',
  regeneration: 'Regeneration',
  change: 'Change of cartridges',
  'push-out': 'Push-out',
  changeover: 'Changeover',
  'integrity-after': 'Integrity test',
};
const kindBar: Record<DayBlockKind, string> = {
  sanitation: 'bg-watch-500',
  'integrity-before': 'bg-ink-500',
  run: 'bg-primary-600',
  regeneration: 'bg-watch-400',
  change: 'bg-stop-500',
  'push-out': 'bg-primary-300',
  changeover: 'bg-ink-300',
  'integrity-after': 'bg-ink-500',
};

const duration = (min: number) => (min >= 60 ? `${Math.floor(min / 60)} h ${String(Math.round(min % 60)).padStart(2, '0')} min` : `${Math.round(min)} min`);
const dayMark = (offset: number) => (offset > 0 ? ` (+${offset} d)` : '');

/** The day as ordered blocks with clock times and bars proportional to their length. */
export function DayTimeline({ plan }: { plan: PlanDto }) {
  const t = plan.timeline;
  return (
    <Card title="The day" description={t ? `Starts ${plan.startTime}, ends about ${t.end}${dayMark(t.endDayOffset)}: ${duration(t.totalMin)} in all, ${duration(t.runMin)} of running.` : undefined}>
      {!t ? (
        <p className="text-sm text-ink-600">{plan.timelineError}</p>
      ) : (
        <ol className="flex flex-col gap-1.5" aria-label="Timeline">
          {t.blocks.map((b, i) => (
            <li key={i} className="grid grid-cols-[5.5rem_1fr] items-center gap-x-3 gap-y-0.5 sm:grid-cols-[6.5rem_14rem_1fr]">
              <span className="num text-sm font-semibold text-ink-900">
                {b.start}–{b.end}
                {dayMark(b.startDayOffset)}
              </span>
              <span className="text-sm text-ink-800">
                <span className="sr-only">{kindWords[b.kind]}: </span>
                {b.label} <span className="text-ink-500">· {duration(b.minutes)}</span>
              </span>
              <div aria-hidden="true" className="col-span-2 h-2 rounded-full bg-ink-100 sm:col-span-1">
                <div className={cn('h-2 rounded-full', kindBar[b.kind])} style={{ width: `${Math.max(1.5, (b.minutes / t.totalMin) * 100)}%` }} />
              </div>
            </li>
          ))}
        </ol>
      )}
      {t && t.blocks.some((b) => b.kind === 'push-out' || b.kind === 'changeover') ? (
        <GasCaution title="At push-out and changeover: CO₂ and nitrogen – no air to breathe" className="mt-4" />
      ) : null}
    </Card>
  );
}
