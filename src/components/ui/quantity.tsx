import { cn } from '@/utils/cn';

export interface QuantityProps {
  /** A number (formatted for the reader's locale) or an already formatted string. */
  value: string | number;
  /** Unit after the number, e.g. "bar", "L/h", "NTU". Empty for dimensionless values. */
  unit: string;
  /** Fixed fraction digits when value is a number; otherwise up to 3 are shown. */
  digits?: number;
  className?: string;
}

export function formatNumber(value: number, digits?: number): string {
  if (!Number.isFinite(value)) return '–';
  return new Intl.NumberFormat(undefined, {
    minimumFractionDigits: digits ?? 0,
    maximumFractionDigits: digits ?? 3,
  }).format(value);
}

/** A figure in tabular digits with its unit in a lighter weight (same colour, so it keeps the text's contrast): "1.42 bar". */
export function Quantity({ value, unit, digits, className }: QuantityProps) {
  const text = typeof value === 'number' ? formatNumber(value, digits) : value;
  return (
    <span className={cn('num whitespace-nowrap', className)}>
      <span>{text}</span>
      {unit ? (
        <>
          {'\u00a0'}
          <span className="font-normal">{unit}</span>
        </>
      ) : null}
    </span>
  );
}
