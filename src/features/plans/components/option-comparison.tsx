import { CircleCheck, OctagonX, Star, TriangleExclamationPoint } from 'lucide-react';
import type { ReactNode } from 'react';
import { CLEAN_DP_MAX_FRACTION_OF_TERMINAL, COST_VOLUME_BASIS, costPerVolumeBasis, formatDurationWords, type TrainSizingResult } from '@shared/engine';
import { BLOCKING_WARNING_CODES } from '@shared/schemas/plans';
import type { TrainSizingOutcome } from '@shared/adapters/plans';
import type { PlanTrainDto } from '@shared/types/plans';
import { useUnits } from '@/lib/units';
import { cn } from '@/utils/cn';

type Units = ReturnType<typeof useUnits>;

/** One option as compared: its name, the engine's sizing (live while edited) and whether it has unsaved edits. */
export interface ComparedOption {
  train: PlanTrainDto;
  name: string;
  outcome: TrainSizingOutcome | null;
  dirty: boolean;
  chosen: boolean;
}

const money = (v: number | null, currency: string | null) =>
  v === null ? '—' : new Intl.NumberFormat(undefined, { style: 'currency', currency: currency ?? 'EUR', maximumFractionDigits: 2 }).format(v);

const plural = (n: number, word: string) => `${String(n)} ${word}${n === 1 ? '' : 's'}`;

/** Regenerations plus changes over every stage, or null when a stage's capacity is unknown. */
export function interventionsOf(r: TrainSizingResult): number | null {
  let sum = 0;
  for (const s of r.stages) {
    if (s.interventions === null) return null;
    sum += s.interventions;
  }
  return sum;
}

const interventionWords = (r: TrainSizingResult) => {
  const n = interventionsOf(r);
  if (n === null) return 'unknown';
  if (n === 0) return 'none';
  const regen = r.stages.reduce((a, s) => a + (s.regenerations ?? 0), 0);
  const change = r.stages.reduce((a, s) => a + (s.changes ?? 0), 0);
  return [regen ? plural(regen, 'regeneration') : '', change ? plural(change, 'change') : ''].filter(Boolean).join(', ');
};

/** The smallest margin between a stage's inlet pressure at the end of the run and its housing's rating, bar. */
export function housingMarginBar(o: TrainSizingOutcome): number | null {
  if (!o.ok) return null;
  let margin: number | null = null;
  o.result.stages.forEach((s, i) => {
    const h = o.input.stages[i]?.housing;
    if (!h) return;
    const m = h.maxPressureBar - s.inletPressureEndOfRunBar;
    margin = margin === null ? m : Math.min(margin, m);
  });
  return margin;
}

const counts = (r: TrainSizingResult) => {
  const stops = r.warnings.filter((w) => BLOCKING_WARNING_CODES.includes(w.code)).length;
  return { stops, watch: r.warnings.length - stops };
};

const limitWords = (r: TrainSizingResult) => {
  const { stops, watch } = counts(r);
  if (stops + watch === 0) return 'no limit broken';
  return [stops ? `${String(stops)} stop${stops === 1 ? '' : 's'}` : '', watch ? `${String(watch)} to watch` : ''].filter(Boolean).join(', ');
};

/** "€0.16 per hL · 2 h 25 min · 1 change · no limit broken": an option in one line. */
export function optionSummary(o: ComparedOption, u: Units): string {
  if (!o.outcome) return 'not sized yet';
  if (!o.outcome.ok) return `cannot be sized: ${o.outcome.error}`;
  const r = o.outcome.result;
  const cost = r.totals.costPerHl === null ? 'no price' : `${r.totals.costIsLowerBound ? 'at least ' : ''}${money(costPerVolumeBasis(r.totals.costPerHl, u.system).value, r.totals.currency)} per ${COST_VOLUME_BASIS[u.system].per}`;
  const n = interventionsOf(r);
  const changes = n === null ? 'changes unknown' : n === 0 ? 'no change' : interventionWords(r);
  return [cost, formatDurationWords(r.totals.runHours), changes, limitWords(r)].join(' · ');
}

/** A figure of one option in a row: what is shown, and the number that ranks it (null: not ranked). */
type Cell = { text: ReactNode; key: number | null; tone?: 'over' };
type Row = { label: string; hint?: string; better: 'lower' | 'higher' | null; cells: Cell[] };

const EPS = 1e-9;

/** Which cells hold the best value of a row: only when at least two options are ranked and they differ. */
export function bestOf(keys: (number | null)[], better: 'lower' | 'higher' | null): boolean[] {
  const known = keys.filter((k): k is number => k !== null && Number.isFinite(k));
  if (better === null || known.length < 2) return keys.map(() => false);
  const best = better === 'lower' ? Math.min(...known) : Math.max(...known);
  const worst = better === 'lower' ? Math.max(...known) : Math.min(...known);
  if (Math.abs(best - worst) <= EPS * Math.max(1, Math.abs(best))) return keys.map(() => false);
  return keys.map((k) => k !== null && Math.abs(k - best) <= EPS * Math.max(1, Math.abs(best)));
}

function buildRows(options: ComparedOption[], u: Units): Row[] {
  const results = options.map((o) => (o.outcome?.ok ? o.outcome.result : null));
  const none: Cell = { text: <span className="font-normal text-ink-500">—</span>, key: null };
  const per = (f: (r: TrainSizingResult, o: ComparedOption) => Cell) => options.map((o, i) => (results[i] ? f(results[i], o) : none));
  const rows: Row[] = [
    {
      label: `Cost per ${COST_VOLUME_BASIS[u.system].per}`,
      better: 'lower',
      cells: per((r) => ({
        text: r.totals.costPerHl === null ? 'no price' : `${r.totals.costIsLowerBound ? 'at least ' : ''}${money(costPerVolumeBasis(r.totals.costPerHl, u.system).value, r.totals.currency)}`,
        // A lower bound ("at least") is not ranked against a full cost.
        key: r.totals.costIsLowerBound ? null : r.totals.costPerHl,
      })),
    },
    { label: 'Run time', better: 'lower', cells: per((r) => ({ text: formatDurationWords(r.totals.runHours), key: r.totals.runHours })) },
    { label: 'Changes and regenerations', better: 'lower', cells: per((r) => ({ text: interventionWords(r), key: interventionsOf(r) })) },
    {
      label: 'Cartridges',
      hint: '10-inch equivalents',
      better: null,
      cells: per((r) => ({ text: `${String(r.stages.reduce((a, s) => a + s.elementEquivalents, 0))}`, key: null })),
    },
    {
      label: 'Pump pressure at the end',
      better: 'lower',
      cells: per((r) => ({ text: u.format('pressure', r.totals.pumpPressureEndOfRunBar), key: r.totals.pumpPressureEndOfRunBar })),
    },
    {
      label: 'Margin to the housing ratings',
      hint: 'smallest, at the end of the run',
      better: 'higher',
      cells: options.map((o) => {
        const m = o.outcome ? housingMarginBar(o.outcome) : null;
        return m === null ? none : { text: m < 0 ? `${u.format('pressure', -m)} over` : u.format('pressure', m), key: m, tone: m < 0 ? 'over' : undefined };
      }),
    },
  ];
  const stageCount = Math.max(0, ...results.map((r) => r?.stages.length ?? 0));
  for (let i = 0; i < stageCount; i += 1) {
    const kind = results.find((r) => r?.stages[i])?.stages[i].kind ?? '';
    const stage = (f: (s: TrainSizingResult['stages'][number]) => Cell) => results.map((r) => (r?.stages[i] ? f(r.stages[i]) : none));
    rows.push(
      {
        label: `Flux per 10-inch, stage ${String(i + 1)}`,
        hint: kind,
        better: 'lower',
        cells: stage((s) => ({
          text: (
            <>
              {u.format('flow', s.fluxLhPer10in)} <span className="font-normal text-ink-600">{Math.round((s.fluxLhPer10in / s.designFluxLhPer10in) * 100)} % of design</span>
            </>
          ),
          key: s.fluxLhPer10in / s.designFluxLhPer10in,
          tone: s.fluxLhPer10in > s.designFluxLhPer10in ? 'over' : undefined,
        })),
      },
      {
        label: `Clean ΔP, stage ${String(i + 1)}`,
        hint: kind,
        better: 'lower',
        cells: stage((s) => {
          const limit = s.terminalDpBar * CLEAN_DP_MAX_FRACTION_OF_TERMINAL;
          return {
            text: (
              <>
                {u.format('dp', s.cleanDpBar)} <span className="font-normal text-ink-600">of {u.format('dp', limit)}</span>
              </>
            ),
            key: s.cleanDpBar / limit,
            tone: s.cleanDpBar > limit ? 'over' : undefined,
          };
        }),
      },
      {
        label: `To terminal ΔP, stage ${String(i + 1)}`,
        hint: kind,
        better: 'higher',
        cells: stage((s) =>
          s.infeasible
            ? { text: 'none', key: 0, tone: 'over' }
            : s.capacityL === null
              ? { text: <span className="font-normal text-ink-600">unknown</span>, key: null }
              : { text: u.format('volume', s.capacityL), key: s.capacityL },
        ),
      },
    );
  }
  rows.push({
    label: 'Limits',
    better: 'lower',
    cells: per((r) => {
      const { stops, watch } = counts(r);
      return { text: limitWords(r), key: stops * 1000 + watch, tone: stops > 0 ? 'over' : undefined };
    }),
  });
  return rows;
}

/**
 * The options of a lot figure by figure: one table (rows are figures, columns are options) with
 * the best value of each row marked by a word and a quiet tint, and each option in one line.
 * Shown from the small breakpoint up; a phone gets {@link OptionSwitcher} instead.
 */
export function OptionComparison({ options, lotCode }: { options: ComparedOption[]; lotCode: string }) {
  const u = useUnits();
  const rows = buildRows(options, u);
  return (
    <div className="flex flex-col gap-2 max-sm:hidden">
      <div className="overflow-x-auto rounded border border-ink-200">
        <table className="w-full border-collapse text-sm" aria-label={`Compare the options for ${lotCode}`}>
          <thead className="bg-ink-50">
            <tr>
              <td className="w-72 border-b border-ink-200 px-3 py-2 text-xs text-ink-600">Figures of each option; unsaved edits count</td>
              {options.map((o) => (
                <th key={o.train.id} scope="col" className="border-b border-l border-ink-200 px-3 py-2 text-right font-semibold text-ink-900">
                  {o.name}
                  {o.chosen ? <span className="ml-1.5 font-normal text-ok-700">· chosen</span> : null}
                  {o.dirty ? <span className="ml-1.5 font-normal text-watch-800">· unsaved</span> : null}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rows.map((row) => {
              const best = bestOf(
                row.cells.map((c) => c.key),
                row.better,
              );
              return (
                <tr key={row.label} className="border-b border-ink-100 last:border-0">
                  <th scope="row" className="px-3 py-1.5 text-left font-normal text-ink-700">
                    {row.label}
                    {row.hint ? <span className="text-ink-500"> · {row.hint}</span> : null}
                  </th>
                  {row.cells.map((c, i) => (
                    <td
                      key={options[i].train.id}
                      data-best={best[i] ? 'true' : undefined}
                      className={cn('num border-l border-ink-100 px-3 py-1.5 text-right font-semibold', c.tone === 'over' ? 'text-stop-700' : 'text-ink-900', best[i] && 'bg-primary-50')}
                    >
                      {c.tone === 'over' ? <OctagonX aria-hidden="true" className="mr-1 inline size-3.5 align-[-2px]" /> : null}
                      {c.text}
                      {best[i] ? (
                        <span className="ml-1.5 inline-flex items-center gap-0.5 text-xs font-semibold text-primary-800">
                          <Star aria-hidden="true" className="size-3" />
                          best
                        </span>
                      ) : null}
                    </td>
                  ))}
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <ul aria-label={`Options in one line for ${lotCode}`} className="flex flex-col gap-0.5 text-sm">
        {options.map((o) => (
          <li key={o.train.id} className="text-ink-700">
            <span className="font-semibold text-ink-900">{o.name}</span>
            {o.chosen ? <span className="text-ok-700"> (chosen)</span> : null}: <span className="num">{optionSummary(o, u)}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** On a phone: one button per option (the pressed one is shown below) and the others each in one line. */
export function OptionSwitcher({ options, active, onChoose, lotCode }: { options: ComparedOption[]; active: string; onChoose: (trainId: string) => void; lotCode: string }) {
  const u = useUnits();
  const others = options.filter((o) => o.train.id !== active);
  return (
    <div className="flex flex-col gap-1.5 sm:hidden">
      <div role="group" aria-label={`Choose the option to see for ${lotCode}`} className="flex flex-wrap gap-1.5">
        {options.map((o) => {
          const on = o.train.id === active;
          const blocked = o.outcome?.ok ? counts(o.outcome.result).stops > 0 : o.outcome !== null;
          return (
            <button
              key={o.train.id}
              type="button"
              aria-pressed={on}
              onClick={() => onChoose(o.train.id)}
              className={cn(
                'inline-flex min-h-11 items-center gap-1 rounded border px-3 text-sm font-semibold',
                on ? 'border-primary-600 bg-primary-50 text-primary-800 ring-1 ring-primary-600' : 'border-ink-300 bg-white text-ink-800',
              )}
            >
              {blocked ? <TriangleExclamationPoint aria-label="a limit is broken" className="size-3.5 text-stop-700" /> : null}
              {o.name}
              {o.chosen ? <CircleCheck aria-label="chosen" className="size-3.5 text-ok-700" /> : null}
            </button>
          );
        })}
      </div>
      <ul aria-label={`The other options in one line for ${lotCode}`} className="flex flex-col text-xs text-ink-700">
        {others.map((o) => (
          <li key={o.train.id}>
            <span className="font-semibold text-ink-900">{o.name}</span>
            {o.chosen ? ' (chosen)' : ''}: <span className="num">{optionSummary(o, u)}</span>
          </li>
        ))}
      </ul>
    </div>
  );
}
