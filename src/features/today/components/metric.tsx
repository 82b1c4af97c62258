import { DISPLAY_UNITS, formatNumber, toUserUnits, type QuantityKind } from '@shared/engine';
import { Quantity } from '@/components/ui/quantity';
import { useUnits } from '@/lib/units';

/** A stored metric value in the person's units, number first and unit lighter. */
export function Metric({ kind, value, digits }: { kind: QuantityKind; value: number; digits?: number }) {
  const { system } = useUnits();
  const shown = toUserUnits(kind, value, system);
  return <Quantity value={formatNumber(shown.value, digits ?? DISPLAY_UNITS[system][kind].digits)} unit={shown.unit} />;
}
