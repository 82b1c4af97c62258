import type { PlanDto } from '@shared/types/plans';
import { Card } from '@/components/ui/card';
import { StatusBadge } from '@/components/ui/status-badge';

/** What the chosen trains need of each cartridge type and length, against stock and installed. */
export function CartridgeNeeds({ plan }: { plan: PlanDto }) {
  const short = plan.needs.filter((n) => n.verdict === 'short').length;
  return (
    <Card
      title="Cartridges needed"
      description="New cartridges the chosen trains need over the day, lot after lot (a set stays in for the next lot of the same train while it has capacity), against usable ones in stock and installed. Spent cartridges, those whose latest integrity test failed and those being regenerated are not counted. A shortfall needs a written reason at approval."
      actions={plan.needs.length > 0 ? short > 0 ? <StatusBadge tone="stop">{`${short} short`}</StatusBadge> : <StatusBadge tone="ok">enough</StatusBadge> : null}
      flush
    >
      {plan.needs.length === 0 ? (
        <p className="px-4 py-3 text-sm text-ink-600">Choose a train for a lot to see the cartridges it needs.</p>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full text-sm" aria-label="Cartridges needed">
            <thead className="bg-ink-100 text-ink-700">
              <tr>
                <th scope="col" className="px-3 py-2 text-left font-semibold">Type</th>
                <th scope="col" className="px-3 py-2 text-right font-semibold">Length</th>
                <th scope="col" className="px-3 py-2 text-right font-semibold">Needed</th>
                <th scope="col" className="px-3 py-2 text-right font-semibold">On hand</th>
                <th scope="col" className="px-3 py-2 text-left font-semibold">Stock</th>
              </tr>
            </thead>
            <tbody>
              {plan.needs.map((n) => (
                <tr key={`${n.cartridgeTypeId}-${n.lengthIn}`} className="border-t border-ink-200">
                  <td className="px-3 py-2">
                    <div className="font-semibold text-ink-900">{n.typeName}</div>
                    <div className="text-xs text-ink-600">
                      {n.kind}, {n.ratingUm} µm · {n.lotCodes.join(', ')}
                    </div>
                  </td>
                  <td className="num px-3 py-2 text-right">{n.lengthIn}&nbsp;in</td>
                  <td className="num px-3 py-2 text-right">
                    <span className="font-semibold">{n.cartridgesNeeded}</span>
                    <div className="text-xs text-ink-600">{n.elementEquivalentsNeeded} × 10-in</div>
                  </td>
                  <td className="num px-3 py-2 text-right">
                    <span className="font-semibold">{n.cartridgesAvailable}</span>
                    <div className="text-xs text-ink-600">
                      {n.inStock} in stock, {n.installed} installed
                      {n.notUsable > 0 ? `; ${n.notUsable} not usable` : ''}
                    </div>
                  </td>
                  <td className="px-3 py-2">
                    {n.verdict === 'short' ? <StatusBadge tone="stop" size="sm">{`short ${n.shortfall}`}</StatusBadge> : <StatusBadge tone="ok" size="sm">enough</StatusBadge>}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </Card>
  );
}
