import { pastRunsEvidence, type StageSizing } from '@shared/engine';
import { useUnits } from '@/lib/units';

/**
 * Where a stage's capacity per m² came from, in words, with its evidence: typed on the stage, the
 * lot's Vmax test, the winery's closed runs of similar wines ("3 runs of whites, 800–1,200 L/m²"), or
 * the type's nominal figure.
 */
export function CapacitySource({ s }: { s: StageSizing }) {
  const u = useUnits();
  const number = (v: number) => {
    const text = u.format('loading', v);
    const cut = text.lastIndexOf(' ');
    return cut > 0 ? text.slice(0, cut) : text;
  };
  let words: string;
  switch (s.capacitySource) {
    case 'past-runs':
      if (!s.capacityPastRuns) return null;
      words = `from past runs: ${pastRunsEvidence(s.capacityPastRuns, { number, unit: u.symbol('loading') })} (median ${u.format('loading', s.capacityPastRuns.lPerM2)})`;
      break;
    case 'vmax':
      words = `from the lot’s Vmax test (${u.format('loading', s.capacityLPerM2)} at this stage’s clean ΔP)`;
      break;
    case 'nominal':
      words = `from the type’s nominal figure (${u.format('loading', s.capacityLPerM2)}; no Vmax test or past runs for this wine)`;
      break;
    case 'stage':
      words = 'from the stage’s capacity (typed; overrides the Vmax test, past runs and the type’s nominal figure)';
      break;
    case null:
      return null;
    default: {
      const never: never = s.capacitySource;
      return never;
    }
  }
  return (
    <span className="block text-xs font-normal text-ink-600" data-testid="stage-capacity-source">
      {words}
    </span>
  );
}
