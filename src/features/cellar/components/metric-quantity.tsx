import { DISPLAY_UNITS, formatNumber, toUserUnits, type QuantityKind } from '@shared/engine';
import { Quantity } from '@/components/ui/quantity';
import { useUnits } from '@/lib/units';

/** A stored metric value shown in the person's units, number first and unit lighter; "—" when absent. */
export function MetricQuantity({ kind, value, digits }: { kind: QuantityKind; value: number | null | undefined; digits?: number }) {
  const { system } = useUnits();
  if (value === null || value === undefined || !Number.isFinite(value)) return <span className="text-ink-500">—</span>;
  const shown = toUserUnits(kind, value, system);
  return <Quantity value={formatNumber(shown.value, digits ?? DISPLAY_UNITS[system][kind].digits)} unit={shown.unit} />;
}

/** A figure in a fixed unit (NTU, s, mg/L, % vol); "—" when absent. */
export function FixedQuantity({ value, unit, digits }: { value: number | null | undefined; unit: string; digits: number }) {
  if (value === null || value === undefined || !Number.isFinite(value)) return <span className="text-ink-500">—</span>;
  return <Quantity value={formatNumber(value, digits)} unit={unit} />;
}
