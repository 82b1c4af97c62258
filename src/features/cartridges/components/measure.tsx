import { Quantity } from '@/components/ui/quantity';
import { useUnits, type QuantityKind } from '@/lib/units';

/** "24,000 L" → ["24,000", "L"], so the unit can be set lighter. */
function splitQuantity(text: string): [string, string] {
  const i = text.lastIndexOf(' ');
  return i > 0 ? [text.slice(0, i), text.slice(i + 1)] : [text, ''];
}

/** A stored metric value shown in the person's units, with the unit lighter. */
export function Measure({ kind, value, digits, className }: { kind: QuantityKind; value: number | null | undefined; digits?: number; className?: string }) {
  const units = useUnits();
  if (value === null || value === undefined || !Number.isFinite(value)) return <span className="text-ink-500">—</span>;
  const [v, unit] = splitQuantity(units.format(kind, value, digits));
  return <Quantity value={v} unit={unit} className={className} />;
}
