import { Link } from 'react-router-dom';
import type { TodayCartridgeFigure, TodayDto } from '@shared/types/today';
import { statusWord } from '@/components/status/cartridge-status-badge';
import { Card } from '@/components/ui/card';
import { StatusBadge } from '@/components/ui/status-badge';
import { paths } from '@/config/paths';
import { CartridgeFigure, urgencyOf } from './cartridge-figure';
import { AllClear, LookAtList, LookAtRow } from './look-at-list';


/** Figures that already say the reason in full ("Integrity test failed on 20 Nov"), so it is not repeated. */
const restatesReason: Record<TodayCartridgeFigure['kind'], boolean> = {
  'integrity-failed': true,
  'budget-used': true,
  'flow-recovery': true,
  'life-ended': false,
  'cycles-left': false,
};

/** Cartridges near or at the end of their life, most urgent first, each a link to its page. */
export function CartridgesToLookAt({ cartridges, counts }: { cartridges: TodayDto['cartridges']; counts: TodayDto['counts'] }) {
  return (
    <Card
      title="Cartridges to look at"
      description="From each cartridge’s history and its type’s ratings; planning estimates."
      flush
    >
      {counts.cartridges === 0 ? (
        <p className="px-4 py-4 text-ink-700">
          No cartridges registered yet.{' '}
          {counts.cartridgeTypes === 0 ? (
            <>
              Add your housings and cartridge types in{' '}
              <Link to={paths.equipment} className="font-semibold text-primary-700 underline underline-offset-2">
                Equipment
              </Link>
              , then register cartridges.
            </>
          ) : (
            <>
              Register them in{' '}
              <Link to={paths.cartridges} className="font-semibold text-primary-700 underline underline-offset-2">
                Cartridges
              </Link>{' '}
              and their life shows here.
            </>
          )}
        </p>
      ) : cartridges.attention.length === 0 ? (
        <AllClear>
          <span>No cartridge needs a look: integrity tests, cycles and flow recovery are within their limits.</span>
        </AllClear>
      ) : (
        <LookAtList label="Cartridges to look at" shown={cartridges.attention.length} total={cartridges.attentionTotal} moreTo={paths.cartridges} moreLabel="See the inventory">
          {cartridges.attention.map((c) => {
            const urgency = urgencyOf(c.figure);
            return (
              <LookAtRow
                key={c.id}
                to={paths.cartridge(c.id)}
                code={c.serial}
                name={c.typeName}
                badge={
                  <StatusBadge tone={urgency.tone} size="sm">
                    {urgency.word}
                  </StatusBadge>
                }
              >
                <span className="mt-0.5 block text-sm text-ink-600">
                  {statusWord(c.status)}
                  {c.housing ? (
                    <>
                      {' '}
                      in {c.housing.name}
                      {c.position !== null ? (
                        <>
                          , round <span className="num">{c.position}</span>
                        </>
                      ) : null}
                    </>
                  ) : null}
                </span>
                <span className="mt-1 block text-sm text-ink-800">
                  {restatesReason[c.figure.kind] ? null : <span className="font-semibold">{c.reason}{c.figure.kind === 'life-ended' ? '. ' : ': '}</span>}
                  <CartridgeFigure figure={c.figure} />
                </span>
                {c.alsoNoted.length ? <span className="mt-0.5 block text-sm text-ink-600">Also: {c.alsoNoted.join(' ')}</span> : null}
              </LookAtRow>
            );
          })}
        </LookAtList>
      )}
    </Card>
  );
}
