import { Quantity } from '@/components/ui/quantity';
import { quantityParts } from './derived-figure';

/** A formatted quantity ("8.00 bar", from useUnits().format) in tabular digits with the unit lighter; "—" when absent. */
export function Measured({ formatted }: { formatted: string }) {
  const { value, unit } = quantityParts(formatted);
  return value === null || value === '—' ? <span className="text-ink-400">—</span> : <Quantity value={value} unit={unit} />;
}
