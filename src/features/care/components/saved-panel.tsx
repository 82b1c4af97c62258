import { CircleCheck, ShieldCheck, ShieldX } from 'lucide-react';
import { Link } from 'react-router-dom';
import { evaluateIntegrityTest, type CartridgeLife, type IntegrityTestInput } from '@shared/engine';
import { cycleKindLabels, integrityTestLabels, type CycleKind } from '@shared/schemas/care';
import type { CycleResultDto, IntegrityResultDto } from '@shared/types/care';
import { Button, buttonClasses } from '@/components/ui/button';
import { paths } from '@/config/paths';
import { useUnits } from '@/lib/units';
import { cn } from '@/utils/cn';

function LifeLine({ life, lifeError }: { life: CartridgeLife | null; lifeError: string | null }) {
  const units = useUnits();
  if (!life) return lifeError ? <p className="text-base text-ink-700">No life forecast: {lifeError}</p> : null;
  if (life.ended) return <p className="text-base font-semibold text-stop-700">Life forecast: ended — {life.endedBecause.join(' ')}</p>;
  return (
    <p className="text-base text-ink-800">
      Life forecast (planning estimate):{' '}
      {life.remainingCycles !== null ? <strong className="num">{life.remainingCycles} care cycles left</strong> : 'cycles left not known'}
      {life.remainingLitres !== null ? <> · {units.format('volume', life.remainingLitres)} left</> : null}
      {life.limitingFactor ? <> · limited by {life.limitingFactor}</> : null}.
    </p>
  );
}

function Actions({ cartridgeId, onAgain }: { cartridgeId: string; onAgain: () => void }) {
  return (
    <div className="mt-3 flex flex-col gap-2 sm:flex-row">
      <Link to={paths.cartridge(cartridgeId)} className={cn(buttonClasses('primary', 'lg'), 'justify-center')}>
        Open the cartridge page
      </Link>
      <Button variant="secondary" size="lg" onClick={onAgain}>
        Log more care
      </Button>
    </div>
  );
}

export function CycleSaved({ result, onAgain }: { result: CycleResultDto; onAgain: () => void }) {
  const units = useUnits();
  const d = result.event.details;
  const kind = cycleKindLabels[d.kind as CycleKind] ?? 'Care cycle';
  return (
    <section role="status" aria-labelledby="cycle-saved-title" className="rounded-lg border-2 border-ok-600 bg-ok-50 p-4">
      <h2 id="cycle-saved-title" className="flex items-center gap-2 text-xl font-semibold text-ok-800">
        <CircleCheck aria-hidden="true" className="size-8" /> {kind} cycle saved
      </h2>
      <p className="mt-1 text-lg text-ink-900">
        <span className="num font-semibold">{result.event.serial}</span> · {result.event.typeName}
        {typeof d.tempC === 'number' ? <> · {units.format('temperature', d.tempC, 0)}</> : null}
        {typeof d.durationMin === 'number' ? <> · {d.durationMin} min</> : null}
      </p>
      <p className="text-base text-ink-800">
        Counted: {result.steamCycles} steam, {result.hotWaterCycles} hot-water, {result.chemicalCycles} chemical.
      </p>
      <LifeLine life={result.life} lifeError={result.lifeError} />
      <Actions cartridgeId={result.event.cartridgeId} onAgain={onAgain} />
    </section>
  );
}

/** The saved reason, re-worded in the person's units from the stored reading and limit. */
function reasonInUnits(result: IntegrityResultDto, system: 'metric' | 'us'): string {
  if (system === 'metric') return result.reason;
  const d = result.event.details;
  const n = (v: unknown) => (typeof v === 'number' ? v : undefined);
  let input: IntegrityTestInput | null = null;
  if (result.test === 'bubble-point' && n(d.measuredBar) !== undefined && n(d.minBar) !== undefined) input = { kind: 'bubble-point', measuredBar: n(d.measuredBar)!, minimumBar: n(d.minBar)! };
  if (result.test === 'pressure-hold' && n(d.measuredDecayMbar) !== undefined && n(d.maxDecayMbar) !== undefined) input = { kind: 'pressure-hold', measuredDecayMbar: n(d.measuredDecayMbar)!, maximumDecayMbar: n(d.maxDecayMbar)! };
  return input ? evaluateIntegrityTest(input, system).reason : result.reason;
}

export function IntegritySaved({ result, onAgain }: { result: IntegrityResultDto; onAgain: () => void }) {
  const units = useUnits();
  const Icon = result.pass ? ShieldCheck : ShieldX;
  return (
    <section
      role="status"
      aria-labelledby="test-saved-title"
      className={cn('rounded-lg border-2 p-4', result.pass ? 'border-ok-600 bg-ok-50' : 'border-stop-600 bg-stop-50')}
    >
      <p className="text-base text-ink-800">
        {integrityTestLabels[result.test]} test saved for <span className="num font-semibold">{result.event.serial}</span>
      </p>
      <h2 id="test-saved-title" className={cn('mt-1 flex items-center gap-2 text-2xl font-semibold', result.pass ? 'text-ok-800' : 'text-stop-700')}>
        <Icon aria-hidden="true" className="size-9" /> {result.pass ? 'Passed' : result.retest ? 'Not judged yet: re-test with water' : 'Failed'}
      </h2>
      <p className="mt-2 text-lg text-ink-900">{reasonInUnits(result, units.system)}</p>
      {!result.pass && result.retest ? (
        <p className="mt-1 text-base text-ink-800">
          A product-wet reading below its limit is not a final fail. Do not filter wine through it until it passes: re-flush with water and test again.
        </p>
      ) : !result.pass ? (
        <p className="mt-1 text-base text-ink-800">
          Do not filter wine through it. Re-wet it and test again; if it fails again, everything filtered since its last good test is suspect.
        </p>
      ) : null}
      <LifeLine life={result.life} lifeError={result.lifeError} />
      <Actions cartridgeId={result.event.cartridgeId} onAgain={onAgain} />
    </section>
  );
}
