import { Link } from 'react-router-dom';
import type { TodayDto } from '@shared/types/today';
import { Card } from '@/components/ui/card';
import { formatNumber, Quantity } from '@/components/ui/quantity';
import { StatusBadge } from '@/components/ui/status-badge';
import { paths } from '@/config/paths';
import { cn } from '@/utils/cn';

/** Cartridges on the shelf per type; a type with none in stock is a shortfall, said in words. */
export function StockCard({ stock }: { stock: TodayDto['stock'] }) {
  // Shortfalls first, so they are read before the figures that are fine.
  const types = [...stock.types].sort((a, b) => Number(b.shortfall) - Number(a.shortfall));
  return (
    <Card
      title="Stock"
      description="Cartridges on the shelf per type: count, and 10-inch equivalents (a 30-inch cartridge counts 3)."
      actions={
        stock.types.length ? (
          <Link to={paths.cartridges} className="inline-flex min-h-11 items-center text-sm font-semibold text-primary-700 underline underline-offset-2">
            All cartridges
          </Link>
        ) : null
      }
      flush
    >
      {stock.types.length === 0 ? (
        <p className="px-4 py-4 text-ink-700">
          No cartridge types yet. Add the types you use in{' '}
          <Link to={paths.equipment} className="font-semibold text-primary-700 underline underline-offset-2">
            Equipment
          </Link>
          .
        </p>
      ) : (
        // Each cell draws its right and bottom rule; the list is pulled 1 px under the card's own border.
        <div className="overflow-hidden rounded-b">
          <ul className="-mr-px -mb-px grid sm:grid-cols-2 lg:grid-cols-3" aria-label="Stock by type">
            {types.map((t) => (
              <li key={t.typeId} className={cn('flex flex-col gap-1 border-r border-b border-ink-200 bg-white px-4 py-3', t.shortfall && 'bg-stop-50')}>
                <div className="flex items-start justify-between gap-3">
                  <div className="min-w-0">
                    <div className="font-semibold text-ink-900">{t.typeName}</div>
                    <div className="text-xs text-ink-600">
                      {t.kind} · <Quantity value={t.ratingUm} unit="µm" />
                    </div>
                  </div>
                  {t.shortfall ? (
                    <StatusBadge tone="stop" size="sm">
                      none in stock
                    </StatusBadge>
                  ) : (
                    <span className="text-right leading-tight">
                      <span className="num block text-lg font-semibold text-ink-950">{formatNumber(t.inStock.count)}</span>
                      <span className="block text-xs text-ink-600">
                        in stock · <Quantity value={formatNumber(t.inStock.elementEquivalents)} unit="× 10″" />
                      </span>
                    </span>
                  )}
                </div>
                {t.shortfall ? <p className="text-sm font-semibold text-stop-800">No {t.typeName} in stock</p> : null}
                <p className="text-xs text-ink-600">
                  <span className="num">{formatNumber(t.installed.count)}</span> installed · <span className="num">{formatNumber(t.regenerating.count)}</span> regenerating
                </p>
              </li>
            ))}
          </ul>
        </div>
      )}
    </Card>
  );
}
