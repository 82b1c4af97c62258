import { Link } from 'react-router-dom';
import { wineStyleLabels } from '@shared/schemas/cellar';
import type { LotDto } from '@shared/types/cellar';
import { Card } from '@/components/ui/card';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/session';
import { ReadinessBadge } from '@/components/status/readiness-badge';

/** The verdict, its reasons, and the thresholds it was judged against with their sources. */
export function ReadinessPanel({ lot }: { lot: LotDto }) {
  const mayEditSettings = useCan('settings:edit');
  const t = lot.thresholds;
  const upper = t.turbidity.limitNtu + t.turbidity.borderlineMarginNtu;
  const rows = [
    {
      what: `Turbidity (${wineStyleLabels[lot.style].toLowerCase()})`,
      value: t.turbidity.borderlineMarginNtu > 0 ? `ready ≤ ${t.turbidity.limitNtu} NTU · borderline ≤ ${upper} NTU` : `ready ≤ ${t.turbidity.limitNtu} NTU · no borderline band`,
      source: t.turbidity.source,
    },
    {
      what: 'Clogging index',
      value: `ready ≤ ${t.cloggingIndex.readyMaxS} s · borderline ≤ ${t.cloggingIndex.borderlineMaxS} s`,
      source: t.cloggingIndex.source,
    },
    { what: 'Clogging test validity', value: `below ${t.cloggingIndexValidity.validBelowNtu} NTU`, source: t.cloggingIndexValidity.source },
    {
      what: 'Vmax safety factor',
      value: `ready ≥ ${t.vmax.readyMinSafetyFactor}× · borderline ≥ ${t.vmax.borderlineMinSafetyFactor}× the planned volume per filter area`,
      source: t.vmax.source,
    },
  ];
  return (
    <Card title="Readiness for membrane filtration" actions={<ReadinessBadge verdict={lot.readiness.verdict} />}>
      <div className="flex flex-col gap-4">
        <ul className="flex list-disc flex-col gap-1 pl-5 text-base text-ink-900" aria-label="Reasons">
          {lot.readiness.reasons.map((r) => (
            <li key={r}>{r}</li>
          ))}
        </ul>
        <p className="text-sm text-ink-600">
          Judged on the latest lab result. A planning aid: the winemaker’s judgement and the membrane maker’s guidance decide.
        </p>
        <details className="rounded border border-ink-200 bg-ink-50 px-3 py-2">
          <summary className="min-h-9 cursor-pointer py-1 text-sm font-semibold text-ink-800">
            Thresholds used — {t.isDefault ? 'defaults from the trade literature' : "this winery's own"}
          </summary>
          <dl className="mt-2 flex flex-col gap-3">
            {rows.map((r) => (
              <div key={r.what}>
                <dt className="text-sm font-semibold text-ink-900">{r.what}</dt>
                <dd className="num text-sm text-ink-800">{r.value}</dd>
                <dd className="text-xs text-ink-600">Source: {r.source}</dd>
              </div>
            ))}
          </dl>
          <p className="mt-3 text-sm">
            <Link to={paths.settings} className="font-semibold text-primary-700 underline underline-offset-2">
              {mayEditSettings ? 'Change the thresholds in Settings' : 'See the thresholds in Settings'}
            </Link>
            {mayEditSettings ? null : <span className="text-ink-600"> (the owner edits them)</span>}
          </p>
        </details>
      </div>
    </Card>
  );
}
