import { Cylinder, Filter, Wine } from 'lucide-react';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import type { TodayDto } from '@shared/types/today';
import { Card } from '@/components/ui/card';
import { formatNumber } from '@/components/ui/quantity';
import { FetchedAt } from '@/components/offline/fetched-at';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { paths } from '@/config/paths';
import { errorMessage } from '@/lib/api-client';
import { activeMembership, useMe } from '@/lib/session';
import { useToday } from '../api/get-today';
import { CartridgesToLookAt } from './cartridges-to-look-at';
import { LotsToLookAt } from './lots-to-look-at';
import { NextBottlingDays } from './next-bottling-days';
import { RunsInProgress } from './runs-in-progress';
import { StockCard } from './stock-card';
import { formatDayLong, toDayInput } from '@/lib/dates';

function Figure({ to, value, label, detail }: { to: string; value: number; label: string; detail?: ReactNode }) {
  return (
    <Link to={to} className="flex min-h-11 flex-col rounded border border-ink-200 bg-white px-3 py-2 hover:border-ink-300 active:bg-ink-50">
      <span className="num text-2xl font-semibold text-ink-950">{formatNumber(value)}</span>
      <span className="text-sm text-ink-700">{label}</span>
      {detail ? <span className="text-xs text-ink-500">{detail}</span> : null}
    </Link>
  );
}

/** What a new winery enters first, in order, each step a link to where it is done. */
function GettingStarted() {
  const steps = [
    { to: paths.cellar, icon: <Wine aria-hidden="true" className="size-5" />, title: 'Add tanks and lots in Cellar', text: 'with a lab result for each lot, so its readiness can be judged.' },
    { to: paths.equipment, icon: <Cylinder aria-hidden="true" className="size-5" />, title: 'Add housings and cartridge types in Equipment', text: 'with the ratings from the makers’ data sheets.' },
    { to: paths.cartridges, icon: <Filter aria-hidden="true" className="size-5" />, title: 'Then register cartridges', text: 'one by one or from a delivery list, and install them.' },
  ];
  return (
    <Card title="Set up your cellar" description="Today fills in as you enter your cellar and equipment.">
      <ol className="flex flex-col gap-2">
        {steps.map((s, i) => (
          <li key={s.to}>
            <Link to={s.to} className="flex min-h-11 items-start gap-3 rounded border border-ink-200 px-3 py-2.5 hover:border-ink-300 hover:bg-ink-50">
              <span className="num mt-0.5 inline-flex size-6 shrink-0 items-center justify-center rounded-full bg-primary-50 text-sm font-semibold text-primary-800">{i + 1}</span>
              <span className="min-w-0">
                <span className="flex items-center gap-2 font-semibold text-primary-700">
                  {s.icon}
                  {s.title}
                </span>
                <span className="block text-sm text-ink-600">{s.text}</span>
              </span>
            </Link>
          </li>
        ))}
      </ol>
    </Card>
  );
}

const isNewWinery = (c: TodayDto['counts']) => c.lots === 0 && c.tanks === 0 && c.housings === 0 && c.cartridgeTypes === 0 && c.cartridges === 0;

/** The page a cellar team opens first: what needs a look today. */
/** `alerts`: the person's open alerts, shown under the heading (added by the app). */
export function TodayPage({ alerts }: { alerts?: ReactNode } = {}) {
  const me = useMe();
  const today = useToday();
  const wineryName = activeMembership(me.data)?.wineryName;
  const date = formatDayLong(new Date());

  return (
    <div className="flex flex-col gap-6">
      <PageHeader
        title="Today"
        description={
          <>
            {wineryName ? <span className="font-semibold text-ink-800">{wineryName}</span> : null}
            {wineryName ? ' · ' : null}
            <time dateTime={toDayInput()}>{date}</time>
          </>
        }
      />
      <FetchedAt at={today.dataUpdatedAt} />
      {today.isPending ? (
        <LoadingState />
      ) : today.isError ? (
        <ErrorState message={errorMessage(today.error)} onRetry={() => today.refetch()} />
      ) : (
        <>
          {isNewWinery(today.data.counts) ? (
            <GettingStarted />
          ) : (
            <div className="grid grid-cols-3 gap-2 sm:max-w-xl" aria-label="At a glance" role="group">
              <Figure to={paths.cellar} value={today.data.counts.lots} label={today.data.counts.lots === 1 ? 'lot' : 'lots'} />
              <Figure to={paths.cartridges} value={today.data.counts.cartridgesInstalled} label="cartridges installed" />
              <Figure
                to={paths.cartridges}
                value={today.data.counts.housingsWithFreeRounds}
                label="housings with free rounds"
                detail={
                  <>
                    of <span className="num">{formatNumber(today.data.counts.housings)}</span>
                  </>
                }
              />
            </div>
          )}
          {/* A run in progress is the most pressing thing of the day: first when there is one. */}
          {(today.data.runsInProgress ?? []).length > 0 ? <RunsInProgress runs={today.data.runsInProgress} /> : null}
          {/* A new winery starts with its cellar and equipment; a plan needs both. */}
          {!isNewWinery(today.data.counts) || today.data.upcomingPlans.length > 0 ? <NextBottlingDays plans={today.data.upcomingPlans} /> : null}
          {alerts}
          {(today.data.runsInProgress ?? []).length === 0 ? <RunsInProgress runs={[]} /> : null}
          {isNewWinery(today.data.counts) ? null : (
            <div className="grid items-start gap-6 lg:grid-cols-2">
              <LotsToLookAt lots={today.data.lots} lotCount={today.data.counts.lots} />
              <CartridgesToLookAt cartridges={today.data.cartridges} counts={today.data.counts} />
              <div className="lg:col-span-2">
                <StockCard stock={today.data.stock} />
              </div>
            </div>
          )}
        </>
      )}
    </div>
  );
}
