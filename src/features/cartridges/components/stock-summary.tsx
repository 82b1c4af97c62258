import type { ColumnDef } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { CartridgeStockRowDto, CartridgeSummaryDto, StockFigure } from '@shared/types/cartridges';
import { Card } from '@/components/ui/card';
import { DataTable } from '@/components/ui/data-table';
import { formatNumber, Quantity } from '@/components/ui/quantity';

function Figure({ f }: { f: StockFigure }) {
  return (
    <span className="inline-flex flex-col items-end leading-tight">
      <span className="font-semibold">{formatNumber(f.count)}</span>
      <span className="text-xs text-ink-600">
        <Quantity value={f.elementEquivalents} unit="× 10″" />
      </span>
    </span>
  );
}

const figureColumn = (
  key: 'inStock' | 'installed' | 'regenerating',
  header: string,
  shortHeader: string,
  totals: CartridgeSummaryDto['totals'],
): ColumnDef<CartridgeStockRowDto> => ({
  id: key,
  // A short heading on phones keeps the table inside 390 px.
  header: () => (
    <>
      <span className="sm:hidden" aria-hidden="true">
        {shortHeader}
      </span>
      <span className="max-sm:sr-only">{header}</span>
    </>
  ),
  meta: { numeric: true },
  cell: ({ row }) => <Figure f={row.original[key]} />,
  footer: () => <Figure f={totals[key]} />,
});

/** Stock per cartridge type: count and 10-inch equivalents in stock, installed and regenerating. */
export function StockSummary({ summary }: { summary: CartridgeSummaryDto }) {
  const columns = useMemo<ColumnDef<CartridgeStockRowDto>[]>(
    () => [
      {
        id: 'type',
        header: 'Type',
        cell: ({ row }) => (
          <div className="min-w-24">
            <div className="font-semibold text-ink-900">{row.original.typeName}</div>
            <div className="text-xs text-ink-600">
              {row.original.kind} · <Quantity value={row.original.ratingUm} unit="µm" />
            </div>
          </div>
        ),
        footer: () => 'All types',
      },
      figureColumn('inStock', 'In stock', 'Stock', summary.totals),
      figureColumn('installed', 'Installed', 'Inst.', summary.totals),
      figureColumn('regenerating', 'Regenerating', 'Regen.', summary.totals),
    ],
    [summary.totals],
  );
  return (
    <Card title="Stock by type" description="Count of cartridges, and below it their 10-inch element equivalents (a 30-inch cartridge counts 3)." flush>
      <DataTable columns={columns} data={summary.types} getRowId={(r) => r.typeId} caption="Cartridge stock by type" maxHeight="none" empty="No cartridge types yet." />
    </Card>
  );
}
