import { Link } from 'react-router-dom';
import type { ReadinessVerdict } from '@shared/engine';
import { wineStyleLabels } from '@shared/schemas/cellar-labels';
import type { TodayDto } from '@shared/types/today';
import { Card } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { AllClear, LookAtList, LookAtRow } from './look-at-list';
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
        <AllClear>
          {lotCount === 1 ? (
            <span>The lot is ready by its latest lab result.</span>
          ) : (
            <span>
              All <span className="num">{lotCount}</span> lots are ready by their latest lab results.
            </span>
          )}
        </AllClear>
      ) : (
        <LookAtList label="Lots to look at" shown={lots.attention.length} total={lots.attentionTotal} moreTo={paths.cellar} moreLabel="See every lot in Cellar">
          {lots.attention.map((l) => (
            <LookAtRow key={l.id} to={paths.lot(l.id)} code={l.code} name={l.name} badge={<ReadinessBadge verdict={l.verdict} size="sm" />}>
              <span className="mt-0.5 block text-sm text-ink-600">
                {wineStyleLabels[l.style]} · <Metric kind="volume" value={l.volumeL} />
              </span>
              <span className="mt-1 block text-sm text-ink-800">{l.reason}</span>
            </LookAtRow>
          ))}
        </LookAtList>
      )}
    </Card>
  );
}
