import type { ReactNode } from 'react';
import type { BudgetFactor, LimitingFactor } from '@shared/engine';
import type { TodayCartridgeFigure } from '@shared/types/today';
import { formatNumber, Quantity } from '@/components/ui/quantity';
import type { StatusTone } from '@/components/ui/status-badge';
import { Metric } from './metric';
import { formatDayMonth } from '@/lib/dates';

const cycleWords: Partial<Record<LimitingFactor, [string, string]>> = {
  'steam cycles': ['steam cycle', 'steam cycles'],
  'hot-water cycles': ['hot-water cycle', 'hot-water cycles'],
  'chemical cycles': ['chemical cycle', 'chemical cycles'],
};

/** What runs out when the limit is not a cycle count of one kind. */
const limitWords: Partial<Record<LimitingFactor, string>> = {
  'steam minutes': 'its rated steam time',
  litres: 'its rated litres',
  'flow recovery': 'flow recovery falls below its floor',
};

/** How urgent a figure is, as a word with a tone (never colour alone). */
export function urgencyOf(figure: TodayCartridgeFigure): { tone: StatusTone; word: string } {
  switch (figure.kind) {
    case 'integrity-failed':
      return { tone: 'stop', word: 'failed test' };
    case 'life-ended':
      return { tone: 'stop', word: 'spent' };
    case 'cycles-left':
      return { tone: 'watch', word: 'near end' };
    default:
      return { tone: 'watch', word: 'watch' };
  }
}

function budgetAmount(factor: BudgetFactor, value: number): ReactNode {
  if (factor === 'litres') return <Metric kind="volume" value={value} />;
  if (factor === 'steam minutes') return <Quantity value={formatNumber(value, 0)} unit="min" />;
  return <span className="num">{formatNumber(value, 0)}</span>;
}

/** The figure behind a cartridge's reason, e.g. "3 hot-water cycles left" or "Integrity test failed on 20 Nov". */
export function CartridgeFigure({ figure }: { figure: TodayCartridgeFigure }) {
  switch (figure.kind) {
    case 'integrity-failed':
      return (
        <>
          Integrity test failed on <time dateTime={figure.at} className="num">{formatDayMonth(figure.at)}</time>
        </>
      );
    case 'life-ended':
      return <>{figure.because}</>;
    case 'cycles-left': {
      const n = figure.cyclesLeft;
      const words = cycleWords[figure.factor];
      if (words) {
        return n === 0 ? (
          <>No {words[1]} left</>
        ) : (
          <>
            <span className="num">{formatNumber(n, 0)}</span> {n === 1 ? words[0] : words[1]} left
          </>
        );
      }
      return (
        <>
          <span className="num">{formatNumber(n, 0)}</span> {n === 1 ? 'care cycle' : 'care cycles'} left before {limitWords[figure.factor] ?? figure.factor}
        </>
      );
    }
    case 'budget-used':
      return (
        <>
          <Quantity value={formatNumber(figure.fraction * 100, 0)} unit="%" /> of rated {figure.factor} used ({budgetAmount(figure.factor, figure.used)} of{' '}
          {budgetAmount(figure.factor, figure.rated)})
        </>
      );
    case 'flow-recovery':
      return (
        <>
          Flow recovered to <Quantity value={formatNumber(figure.latestPct, 0)} unit="%" />, floor <Quantity value={formatNumber(figure.minPct, 0)} unit="%" />
        </>
      );
  }
}
