import { X } from 'lucide-react';
import { useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { can } from '@shared/permissions';
import type { CycleResultDto, IntegrityResultDto } from '@shared/types/care';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { PageHeader } from '@/components/ui/page-header';
import { ErrorState, LoadingState } from '@/components/ui/states';
import { errorMessage } from '@/lib/api-client';
import { activeMembership, useMe } from '@/lib/session';
import { useUnits } from '@/lib/units';
import { cn } from '@/utils/cn';
import { useCareTarget } from '../api/get-care-target';
import { CartridgeFinder, CartridgeStatus } from './cartridge-finder';
import { CycleForm } from './cycle-form';
import { IntegrityForm } from './integrity-form';
import { RecentCare } from './recent-care';
import { CycleSaved, IntegritySaved } from './saved-panel';

type Tab = 'cycle' | 'test';
type Saved = { kind: 'cycle'; result: CycleResultDto } | { kind: 'test'; result: IntegrityResultDto };

/** Care of cartridges from the cellar: find one, log a cycle or record a test, see what was saved. */
export function CarePage() {
  const me = useMe();
  const role = activeMembership(me.data)?.role;
  const mayLog = can(role, 'care:log');
  const units = useUnits();
  const [params, setParams] = useSearchParams();
  const cartridgeId = params.get('cartridge');
  const target = useCareTarget(cartridgeId);
  const [tab, setTab] = useState<Tab>('cycle');
  const [saved, setSaved] = useState<Saved | null>(null);

  const pick = (id: string | null) => {
    setSaved(null);
    setParams(id ? { cartridge: id } : {}, { replace: true });
  };

  return (
    <div className="mx-auto flex w-full max-w-3xl flex-col gap-5">
      <PageHeader title="Care" description="Log sanitation and regeneration cycles and integrity tests, cartridge by cartridge." />
      {saved ? (
        saved.kind === 'cycle' ? (
          <CycleSaved result={saved.result} onAgain={() => setSaved(null)} />
        ) : (
          <IntegritySaved result={saved.result} onAgain={() => setSaved(null)} />
        )
      ) : null}
      <Card title="Cartridge">
        {!cartridgeId ? (
          <CartridgeFinder onPick={(c) => pick(c.id)} />
        ) : target.isPending ? (
          <LoadingState label="Loading the cartridge …" />
        ) : target.isError ? (
          <ErrorState message={errorMessage(target.error)} onRetry={() => pick(null)} retryLabel="Find another cartridge" />
        ) : (
          <div className="flex flex-wrap items-start justify-between gap-3">
            <div className="min-w-0">
              <p className="num text-xl font-semibold text-ink-950">{target.data.serial}</p>
              <p className="text-base text-ink-700">
                {target.data.typeName} · {target.data.lengthIn}″ · batch {target.data.batch || '—'}
              </p>
              <p className="mt-1 flex flex-wrap items-center gap-2 text-sm text-ink-700">
                <CartridgeStatus status={target.data.status} />
                {target.data.housingName ? <span>in {target.data.housingName}</span> : null}
                <span>
                  {target.data.steamCycles} steam · {target.data.hotWaterCycles} hot-water · {target.data.chemicalCycles} chemical
                </span>
                {target.data.flowBasis ? (
                  <span>
                    {target.data.flowBasis.kind === 'new' ? 'as-new' : 'first'} water flow {units.format('flow', target.data.flowBasis.flowLh)}
                  </span>
                ) : null}
              </p>
            </div>
            <Button variant="secondary" size="lg" icon={<X />} onClick={() => pick(null)}>
              Change cartridge
            </Button>
          </div>
        )}
      </Card>

      {cartridgeId && target.isSuccess && target.data.id === cartridgeId ? (
        target.data.status === 'retired' ? (
          <p className="rounded border border-ink-200 bg-ink-50 px-3 py-2 text-base text-ink-800">
            {target.data.serial} is retired; no more care is logged for it.
          </p>
        ) : !mayLog ? (
          <p className="rounded border border-ink-200 bg-ink-50 px-3 py-2 text-base text-ink-800">Your role can read care records but not log them.</p>
        ) : (
          <Card>
            <div role="tablist" aria-label="What to record" className="mb-4 grid grid-cols-2 gap-1 rounded border border-ink-200 bg-ink-50 p-1">
              {(
                [
                  ['cycle', 'Log a cycle'],
                  ['test', 'Record an integrity test'],
                ] as const
              ).map(([key, label]) => (
                <button
                  key={key}
                  type="button"
                  role="tab"
                  id={`care-tab-${key}`}
                  aria-selected={tab === key}
                  aria-controls={`care-panel-${key}`}
                  onClick={() => setTab(key)}
                  className={cn(
                    'min-h-touch rounded px-2 text-base font-semibold',
                    tab === key ? 'bg-white text-primary-800 shadow-sm ring-1 ring-primary-600' : 'text-ink-700 hover:bg-white',
                  )}
                >
                  {label}
                </button>
              ))}
            </div>
            <div role="tabpanel" id={`care-panel-${tab}`} aria-labelledby={`care-tab-${tab}`}>
              {tab === 'cycle' ? (
                <CycleForm key={target.data.id} target={target.data} onSaved={(result) => { setSaved({ kind: 'cycle', result }); window.scrollTo({ top: 0 }); }} />
              ) : (
                <IntegrityForm key={target.data.id} target={target.data} onSaved={(result) => { setSaved({ kind: 'test', result }); window.scrollTo({ top: 0 }); }} />
              )}
            </div>
          </Card>
        )
      ) : null}

      <RecentCare />
    </div>
  );
}
