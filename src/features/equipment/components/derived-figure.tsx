import { Calculator } from 'lucide-react';
import type { ReactNode } from 'react';
import { Quantity } from '@/components/ui/quantity';
import { cn } from '@/utils/cn';

export interface DerivedFigureProps {
  label: string;
  /** The formatted figure, or null when the inputs are not complete yet. */
  value: string | null;
  unit?: string;
  /** Inputs and formula or source, in one line. */
  how: ReactNode;
  /** What to fill in when value is null. */
  missing?: string;
  className?: string;
  'data-testid'?: string;
}

/** A computed figure that opens to show how it was computed. */
export function DerivedFigure({ label, value, unit = '', how, missing = 'Fill in the fields above.', className, ...rest }: DerivedFigureProps) {
  return (
    <details className={cn('group rounded border border-ink-200 bg-ink-50 px-3 py-2', className)} data-testid={rest['data-testid']}>
      <summary className="flex min-h-8 cursor-pointer list-none items-center justify-between gap-3 [&::-webkit-details-marker]:hidden">
        <span className="flex items-center gap-1.5 text-sm text-ink-700">
          <Calculator aria-hidden="true" className="size-4 shrink-0 text-ink-500" />
          {label}
        </span>
        {value === null ? (
          <span className="text-sm text-ink-500">—</span>
        ) : (
          <Quantity value={value} unit={unit} className="text-lg font-semibold text-ink-950" />
        )}
      </summary>
      <p className="mt-1 border-t border-ink-200 pt-1.5 text-sm text-ink-600">{value === null ? missing : how}</p>
    </details>
  );
}

/** "2.10 × 10¹⁰" for large figures such as a medium resistance. */
export function scientific(value: number, digits = 2): string {
  const [mantissa, exponent] = value.toExponential(digits).split('e');
  const sup: Record<string, string> = { '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹' };
  const exp = String(Number(exponent))
    .split('')
    .map((c) => sup[c] ?? c)
    .join('');
  return `${mantissa} × 10${exp}`;
}

/** Splits "6.30 m²" into the figure and its unit, for {@link DerivedFigure}. */
export function quantityParts(formatted: string | null): { value: string | null; unit: string } {
  if (formatted === null) return { value: null, unit: '' };
  const i = formatted.indexOf(' ');
  return i < 0 ? { value: formatted, unit: '' } : { value: formatted.slice(0, i), unit: formatted.slice(i + 1) };
}
