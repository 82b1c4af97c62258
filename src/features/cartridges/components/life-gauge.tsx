import { CircleCheck, CircleHelp } from 'lucide-react';
import type { BudgetUse, CartridgeLife } from '@shared/engine';
import { Card } from '@/components/ui/card';
import { formatNumber, Quantity } from '@/components/ui/quantity';
import { StatusBadge } from '@/components/ui/status-badge';
import { cn } from '@/utils/cn';
import { Measure } from './measure';
import { formatDate } from '@/lib/dates';

const budgetLabel: Record<BudgetUse['factor'], string> = {
  'steam cycles': 'Steam cycles',
  'hot-water cycles': 'Hot-water cycles',
  'chemical cycles': 'Chemical cycles',
  'steam minutes': 'Steam time',
  litres: 'Volume',
};

function BudgetBar({ b, limiting }: { b: BudgetUse; limiting: boolean }) {
  const fraction = b.fraction ?? 0;
  const pct = Math.min(100, fraction * 100);
  const tone = fraction >= 1 ? 'bg-stop-600' : fraction >= 0.8 ? 'bg-watch-500' : 'bg-primary-600';
  const unit = b.unit === 'cycles' ? '' : b.unit;
  return (
    <div>
      <div className="flex flex-wrap items-baseline justify-between gap-x-3 text-sm">
        <span className="font-semibold text-ink-900">
          {budgetLabel[b.factor]}
          {limiting ? <span className="ml-2 font-normal text-ink-600">(limits life)</span> : null}
        </span>
        <span className="num text-ink-700">
          {b.unit === 'L' ? <Measure kind="volume" value={b.used} /> : <Quantity value={b.used ?? 0} unit={unit} digits={0} />} of{' '}
          {b.unit === 'L' ? <Measure kind="volume" value={b.rated} /> : <Quantity value={b.rated ?? 0} unit={unit} digits={0} />}
          <span className="ml-2 font-semibold">{formatNumber(fraction * 100, 0)} % used</span>
        </span>
      </div>
      <div
        role="meter"
        aria-label={`${budgetLabel[b.factor]} used`}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={Math.round(fraction * 100)}
        aria-valuetext={`${formatNumber(fraction * 100, 0)} % of the rated ${budgetLabel[b.factor].toLowerCase()} used`}
        className="mt-1 h-3 overflow-hidden rounded-sm border border-ink-300 bg-ink-100"
      >
        <div className={cn('h-full', tone)} style={{ width: `${pct}%` }} />
      </div>
    </div>
  );
}

/** The engine's life forecast: each rated budget used, the limiting factor, what remains, what is known and missing. */
export function LifeGauge({ life, lifeError }: { life: CartridgeLife | null; lifeError: string | null }) {
  if (!life) {
    return (
      <Card title="Life forecast">
        <p className="text-base text-ink-700">No forecast: {lifeError ?? 'the history could not be read.'}</p>
      </Card>
    );
  }
  const rated = life.budgets.filter((b) => b.rated !== null && b.fraction !== null);
  const unrated = life.budgets.filter((b) => b.rated === null);
  const trend = life.recovery.trend;
  return (
    <Card title="Life forecast" description="A planning estimate from the type's ratings and this cartridge's history; the maker's instructions govern.">
      <div className="flex flex-col gap-4">
        <div className="flex flex-wrap items-center gap-2">
          {life.ended ? (
            <StatusBadge tone="stop" size="md">
              end of life
            </StatusBadge>
          ) : life.limitingFactor ? (
            <StatusBadge tone={life.remainingCycles !== null && life.remainingCycles <= 5 ? 'watch' : 'ok'} size="md">
              in service life
            </StatusBadge>
          ) : (
            <StatusBadge tone="neutral" size="md">
              not enough to forecast
            </StatusBadge>
          )}
          {life.limitingFactor ? (
            <span className="text-base text-ink-800">
              Limited by <strong>{life.limitingFactor}</strong>
            </span>
          ) : null}
        </div>
        {life.ended ? (
          <ul className="list-disc pl-5 text-base text-ink-800">
            {life.endedBecause.map((r) => (
              <li key={r}>{r}</li>
            ))}
          </ul>
        ) : null}
        <dl className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          <div>
            <dt className="text-sm text-ink-600">Cycles left</dt>
            <dd className="text-2xl font-semibold text-ink-950">{life.remainingCycles === null ? '—' : <Quantity value={life.remainingCycles} unit="" digits={0} />}</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-600">Volume left</dt>
            <dd className="text-2xl font-semibold text-ink-950">
              <Measure kind="volume" value={life.remainingLitres} />
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-600">Estimated end</dt>
            <dd className="text-lg font-semibold text-ink-950">{life.estimatedEndMs ? formatDate(life.estimatedEndMs) : '—'}</dd>
          </div>
        </dl>
        {rated.length ? (
          <div className="flex flex-col gap-3">
            {rated.map((b) => (
              <BudgetBar key={b.factor} b={b} limiting={life.limitingFactor === b.factor} />
            ))}
          </div>
        ) : null}
        {unrated.length ? <p className="text-sm text-ink-600">Not rated by the type: {unrated.map((b) => budgetLabel[b.factor].toLowerCase()).join(', ')}.</p> : null}
        <div className="rounded border border-ink-200 px-3 py-2">
          <p className="text-sm font-semibold text-ink-900">Water-flow recovery</p>
          {life.recovery.latestPct === null ? (
            <p className="text-sm text-ink-700">Not measured yet.</p>
          ) : (
            <p className="text-sm text-ink-700">
              Latest <Quantity value={life.recovery.latestPct} unit="%" digits={0} /> of {life.recovery.basis === 'new' ? 'the as-new flow' : 'the first flow after regeneration'}; floor{' '}
              <Quantity value={life.recovery.minPct} unit="%" digits={0} />.
              {trend
                ? trend.model === 'linear'
                  ? ` Trend: ${formatNumber(trend.slopePctPerCycle ?? 0, 2)} % per cycle.`
                  : trend.model === 'quadratic'
                    ? ` Trend: ${(trend.curvaturePctPerCycle2 ?? 0) < 0 ? 'accelerating' : 'slowing'} decline.`
                    : ` Trend: exponential, rate ${formatNumber(trend.ratePerCycle ?? 0, 4)} per cycle.`
                : ''}
              {life.recovery.cyclesLeft !== null ? ` About ${formatNumber(Math.floor(life.recovery.cyclesLeft), 0)} cycles before the floor.` : ''}
            </p>
          )}
        </div>
        <div className="grid gap-4 md:grid-cols-2">
          <section aria-label="What the forecast knows">
            <h3 className="mb-1 flex items-center gap-1.5 text-sm font-semibold text-ink-900">
              <CircleCheck aria-hidden="true" className="size-4 text-ok-600" /> What it knows
            </h3>
            <ul className="list-disc pl-5 text-sm text-ink-700">
              {life.known.map((k) => (
                <li key={k}>{k}</li>
              ))}
            </ul>
          </section>
          <section aria-label="What the forecast is missing">
            <h3 className="mb-1 flex items-center gap-1.5 text-sm font-semibold text-ink-900">
              <CircleHelp aria-hidden="true" className="size-4 text-watch-700" /> What it is missing
            </h3>
            {life.missing.length ? (
              <ul className="list-disc pl-5 text-sm text-ink-700">
                {life.missing.map((m) => (
                  <li key={m}>{m}</li>
                ))}
              </ul>
            ) : (
              <p className="text-sm text-ink-700">Nothing.</p>
            )}
          </section>
        </div>
      </div>
    </Card>
  );
}
