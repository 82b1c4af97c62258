import { Plus } from 'lucide-react';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import type { HousingViewDto, HousingViewHousingDto } from '@shared/types/cartridges';
import { Button } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { EmptyState } from '@/components/ui/empty-state';
import { Quantity } from '@/components/ui/quantity';
import { paths } from '@/config/paths';
import { useCan } from '@/lib/session';
import { InstallIntoRoundDialog } from './install-into-round-dialog';

/** Each housing as a small panel of its rounds: which serial sits in each, which are free. */
export function HousingView({ view }: { view: HousingViewDto }) {
  const mayMove = useCan('cartridges:move');
  const [target, setTarget] = useState<{ housing: HousingViewHousingDto; position: number } | null>(null);

  if (view.housings.length === 0) {
    return (
      <Card title="Housings">
        <EmptyState title="No housings yet">
          Add the winery&rsquo;s filter housings under Equipment (rounds and cartridge length); then you can install cartridges into them here.
        </EmptyState>
      </Card>
    );
  }
  return (
    <Card title="Housings" description="What is installed in each round. Choose a free round to install a cartridge from stock.">
      <ul className="grid grid-cols-1 gap-3 sm:grid-cols-2 lg:grid-cols-3" aria-label="Housings">
        {view.housings.map((h) => (
          <li key={h.id} className="min-w-0 rounded border border-ink-200 bg-ink-50" data-testid="housing-panel" aria-label={h.name}>
            <div className="flex items-baseline justify-between gap-2 border-b border-ink-200 px-3 py-2">
              <h3 className="font-semibold text-ink-950">{h.name}</h3>
              <span className="text-sm whitespace-nowrap text-ink-600">
                <Quantity value={h.rounds} unit={h.rounds === 1 ? 'round' : 'rounds'} /> × <Quantity value={h.lengthIn} unit="in" />
              </span>
            </div>
            <ol className="flex flex-col gap-1.5 p-2">
              {h.positions.map((p) => (
                <li key={p.position} className="flex min-h-11 items-center gap-2 rounded border border-ink-200 bg-white px-2">
                  <span className="num w-14 shrink-0 text-sm text-ink-600">Round {p.position}</span>
                  {p.cartridge ? (
                    <Link to={paths.cartridge(p.cartridge.id)} className="min-w-0 flex-1 truncate py-2 font-semibold text-primary-700 hover:underline">
                      {p.cartridge.serial}
                      <span className="ml-2 text-sm font-normal text-ink-600">{p.cartridge.typeName}</span>
                    </Link>
                  ) : (
                    <>
                      <span className="flex-1 text-sm text-ink-500 italic">free</span>
                      {mayMove ? (
                        <Button
                          variant="ghost"
                          size="md"
                          className="min-h-11"
                          icon={<Plus />}
                          aria-label={`Install into ${h.name}, round ${p.position}`}
                          onClick={() => setTarget({ housing: h, position: p.position })}
                        >
                          Install
                        </Button>
                      ) : null}
                    </>
                  )}
                </li>
              ))}
            </ol>
            <p className="border-t border-ink-200 px-3 py-1.5 text-sm text-ink-600">
              {h.freeRounds === 0 ? 'Full' : `${h.freeRounds} free of ${h.rounds}`}
            </p>
          </li>
        ))}
      </ul>
      <InstallIntoRoundDialog target={target} onClose={() => setTarget(null)} />
    </Card>
  );
}
