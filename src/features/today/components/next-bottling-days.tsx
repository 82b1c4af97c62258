import { differenceInCalendarDays, parseISO } from 'date-fns';
import { CalendarDays, CircleCheck, FilePen, Lock, OctagonX, TriangleExclamationPoint } from 'lucide-react';
import { Link } from 'react-router-dom';
import type { TodayPlanDto } from '@shared/types/today';
import { Card } from '@/components/ui/card';
import { formatNumber } from '@/components/ui/quantity';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/session';
import { Metric } from './metric';
import { formatDayLong } from '@/lib/dates';

const statusWords: Record<TodayPlanDto['status'], { tone: StatusTone; icon: typeof FilePen }> = {
  draft: { tone: 'neutral', icon: FilePen },
  approved: { tone: 'info', icon: Lock },
};

function PlanStatus({ status }: { status: TodayPlanDto['status'] }) {
  const w = statusWords[status];
  const Icon = w.icon;
  return (
    <StatusBadge tone={w.tone} size="sm" icon={<Icon aria-hidden="true" className="size-3.5" />}>
      {status}
    </StatusBadge>
  );
}

/** "today", "tomorrow", "in 6 days" from the person's calendar; nothing for a day already past here. */
function fromNow(date: Date): string | null {
  const days = differenceInCalendarDays(date, new Date());
  if (days < 0) return null;
  if (days === 0) return 'today';
  if (days === 1) return 'tomorrow';
  return `in ${days} days`;
}

function PlanDate({ plannedDate }: { plannedDate: string }) {
  const date = parseISO(plannedDate);
  const relative = fromNow(date);
  return (
    <span className="text-sm text-ink-700">
      <time dateTime={plannedDate} className="font-semibold text-ink-900">
        {formatDayLong(date)}
      </time>
      {relative ? <span className="text-ink-600"> · {relative}</span> : null}
    </span>
  );
}

function Trains({ plan }: { plan: TodayPlanDto }) {
  if (plan.lotCount === 0) return <StatusBadge tone="neutral" size="sm">no lots yet</StatusBadge>;
  return plan.trainsChosen ? (
    <StatusBadge tone="ok" size="sm">
      trains chosen
    </StatusBadge>
  ) : (
    <StatusBadge tone="watch" size="sm">
      trains to choose
    </StatusBadge>
  );
}

function PlanItem({ plan }: { plan: TodayPlanDto }) {
  return (
    <Link to={paths.plan(plan.id)} className="block min-h-11 px-4 py-3 hover:bg-ink-50 active:bg-ink-100">
      <span className="flex flex-wrap items-start justify-between gap-x-3 gap-y-1">
        <span className="flex min-w-0 items-center gap-2">
          <CalendarDays aria-hidden="true" className="size-4 shrink-0 text-ink-500" />
          <PlanDate plannedDate={plan.plannedDate} />
        </span>
        <PlanStatus status={plan.status} />
      </span>
      <span className="mt-1 block font-semibold text-primary-700">{plan.name}</span>
      <span className="mt-1 flex flex-wrap items-center gap-x-2 gap-y-1 text-sm text-ink-600">
        <span>{plan.line ? plan.line.name : 'No line chosen'}</span>
        <span aria-hidden="true">·</span>
        <span>
          <span className="num">{formatNumber(plan.lotCount)}</span> {plan.lotCount === 1 ? 'lot' : 'lots'}
        </span>
        {plan.lotCount > 0 ? (
          <>
            <span aria-hidden="true">·</span>
            <Metric kind="volume" value={plan.volumeL} />
          </>
        ) : null}
        <Trains plan={plan} />
      </span>
      {plan.shortfalls.length > 0 ? (
        <span className="mt-2 flex flex-col gap-1">
          {plan.shortfalls.map((s) => (
            <span key={`${s.cartridgeTypeId}-${s.lengthIn}`} className="flex items-start gap-1.5 text-sm font-semibold text-stop-800">
              <OctagonX aria-hidden="true" className="mt-0.5 size-4 shrink-0" />
              <span>
                Short <span className="num">{formatNumber(s.short)}</span> × {s.typeName} (<span className="num">{s.lengthIn}</span>&nbsp;in)
              </span>
            </span>
          ))}
        </span>
      ) : plan.trainsChosen ? (
        <span className="mt-2 flex items-start gap-1.5 text-sm text-ok-800">
          <CircleCheck aria-hidden="true" className="mt-0.5 size-4 shrink-0" />
          <span>Enough cartridges for the chosen trains.</span>
        </span>
      ) : plan.lotCount > 0 ? (
        <span className="mt-2 flex items-start gap-1.5 text-sm text-ink-700">
          <TriangleExclamationPoint aria-hidden="true" className="mt-0.5 size-4 shrink-0 text-watch-700" />
          <span>Cartridges are counted once every lot has a chosen train.</span>
        </span>
      ) : null}
    </Link>
  );
}

/** The bottling days ahead, soonest first, each a link to its plan. */
export function NextBottlingDays({ plans }: { plans: TodayPlanDto[] }) {
  const canDraft = useCan('plans:draft');
  return (
    <Card
      title="Next bottling days"
      description={
        plans.length > 0
          ? 'Draft and approved plans from today on. Cartridges needed are planning estimates, against those in stock and installed.'
          : undefined
      }
      actions={
        plans.length > 0 ? (
          <Link to={paths.plans} className="inline-flex min-h-11 items-center text-sm font-semibold text-primary-700 underline underline-offset-2">
            All plans
          </Link>
        ) : null
      }
      flush
    >
      {plans.length === 0 ? (
        <p className="flex flex-wrap items-center gap-x-2 px-4 py-3 text-ink-700">
          <span>No bottling day planned yet.</span>
          {canDraft ? (
            <Link to={paths.plans} className="inline-flex min-h-11 items-center font-semibold text-primary-700 underline underline-offset-2">
              Plan a bottling day
            </Link>
          ) : null}
        </p>
      ) : (
        <ul className="divide-y divide-ink-200" aria-label="Next bottling days">
          {plans.map((p) => (
            <li key={p.id}>
              <PlanItem plan={p} />
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
