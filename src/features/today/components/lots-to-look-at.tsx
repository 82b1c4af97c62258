import { CircleCheck } from 'lucide-react';
import { Link } from 'react-router-dom';
import type { ReadinessVerdict } from '@shared/engine';
import { wineStyleLabels } from '@shared/schemas/cellar-labels';
import type { TodayDto } from '@shared/types/today';
import { Card } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { Metric } from './metric';
import { ReadinessBadge, readinessWords } from '@/components/status/readiness-badge';

const verdictOrder: ReadinessVerdict[] = ['not-ready', 'borderline', 'unknown', 'ready'];

/** Lots that are not ready, borderline or untested, most urgent first, each a link to its page. */
export function LotsToLookAt({ lots, lotCount }: { lots: TodayDto['lots']; lotCount: number }) {
  const tally = verdictOrder.filter((v) => lots.byVerdict[v] > 0);
  return (
    <Card
      title="Lots to look at"
      description={
        lotCount > 0 ? (
          <span className="flex flex-wrap gap-x-3 gap-y-0.5">
            {tally.map((v) => (
              <span key={v}>
                <span className="num font-semibold text-ink-900">{lots.byVerdict[v]}</span> {readinessWords[v].word}
              </span>
            ))}
          </span>
        ) : undefined
      }
      flush
    >
      {lotCount === 0 ? (
        <p className="px-4 py-4 text-ink-700">
          No lots yet. Add your tanks and lots in{' '}
          <Link to={paths.cellar} className="font-semibold text-primary-700 underline underline-offset-2">
            Cellar
          </Link>
          , then their lab results, and each lot’s readiness shows here.
        </p>
      ) : lots.attention.length === 0 ? (
        <p className="flex items-start gap-2 px-4 py-4 text-ink-700">
          <CircleCheck aria-hidden="true" className="mt-0.5 size-5 shrink-0 text-ok-600" />
          {lotCount === 1 ? (
            <span>The lot is ready by its latest lab result.</span>
          ) : (
            <span>
              All <span className="num">{lotCount}</span> lots are ready by their latest lab results.
            </span>
          )}
        </p>
      ) : (
        <>
          <ul className="divide-y divide-ink-200" aria-label="Lots to look at">
            {lots.attention.map((l) => (
              <li key={l.id}>
                <Link to={paths.lot(l.id)} className="block min-h-11 px-4 py-2.5 hover:bg-ink-50 active:bg-ink-100">
                  <span className="flex items-start justify-between gap-3">
                    <span className="min-w-0">
                      <span className="font-semibold text-primary-700">{l.code}</span> <span className="text-ink-900">{l.name}</span>
                    </span>
                    <ReadinessBadge verdict={l.verdict} size="sm" />
                  </span>
                  <span className="mt-0.5 block text-sm text-ink-600">
                    {wineStyleLabels[l.style]} · <Metric kind="volume" value={l.volumeL} />
                  </span>
                  <span className="mt-1 block text-sm text-ink-800">{l.reason}</span>
                </Link>
              </li>
            ))}
          </ul>
          {lots.attentionTotal > lots.attention.length ? (
            <p className="border-t border-ink-200 px-4 py-2 text-sm text-ink-700">
              Showing <span className="num">{lots.attention.length}</span> of <span className="num">{lots.attentionTotal}</span>.{' '}
              <Link to={paths.cellar} className="inline-flex min-h-11 items-center font-semibold text-primary-700 underline underline-offset-2">
                See every lot in Cellar
              </Link>
            </p>
          ) : null}
        </>
      )}
    </Card>
  );
}
