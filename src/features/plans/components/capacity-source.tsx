import { pastRunsEvidence, type StageSizing } from '@shared/engine';
import { useUnits } from '@/lib/units';

/**
 * Where a stage's capacity per m² came from, in words, with its evidence: typed on the stage, the
 * lot's Vmax test, or the winery's closed runs of similar wines ("3 runs of whites, 800–1,200 L/m²").
 */
export function CapacitySource({ s }: { s: StageSizing }) {
  const u = useUnits();
  let words: string;
  if (s.capacitySource === 'past-runs' && s.capacityPastRuns) {
    const number = (v: number) => {
      const text = u.format('loading', v);
      const cut = text.lastIndexOf(' ');
      return cut > 0 ? text.slice(0, cut) : text;
    };
    words = `from past runs: ${pastRunsEvidence(s.capacityPastRuns, { number, unit: u.symbol('loading') })} (median ${u.format('loading', s.capacityPastRuns.lPerM2)})`;
  } else if (s.capacitySource === 'vmax') {
    words = `from the lot’s Vmax test (${u.format('loading', s.capacityLPerM2)} at this stage’s clean ΔP)`;
  } else if (s.capacitySource === 'stage') {
    words = 'from the stage’s capacity (typed; overrides the Vmax test and past runs)';
  } else {
    return null;
  }
  return (
    <span className="block text-xs font-normal text-ink-600" data-testid="stage-capacity-source">
      {words}
    </span>
  );
}
