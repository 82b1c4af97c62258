import { forwardRef, useState, type CSSProperties, type InputHTMLAttributes, type TextareaHTMLAttributes } from 'react';
import { ambiguousReading, useDecimalMark } from '@/lib/number-input';
import { cn } from '@/utils/cn';

/** Shared field look: 1 px border, 6 px radius, primary focus, stop border when aria-invalid. */
export const fieldClasses = cn(
  'block w-full rounded border border-ink-300 bg-white px-3 text-base text-ink-900',
  'placeholder:text-ink-400',
  'hover:border-ink-400',
  'focus:border-primary-600 focus-visible:outline-offset-0',
  'disabled:cursor-not-allowed disabled:bg-ink-100 disabled:text-ink-600',
  '[&[readonly]]:bg-ink-50',
  'aria-[invalid=true]:border-stop-600 aria-[invalid=true]:focus-visible:outline-stop-600',
);

export interface InputProps extends InputHTMLAttributes<HTMLInputElement> {
  /** Marks the field invalid (sets aria-invalid). */
  invalid?: boolean;
}

export const Input = forwardRef<HTMLInputElement, InputProps>(function Input(
  { invalid, className, type = 'text', ...rest },
  ref,
) {
  return (
    <input
      ref={ref}
      type={type}
      {...rest}
      aria-invalid={invalid || rest['aria-invalid'] || undefined}
      className={cn(fieldClasses, 'min-h-11', className)}
    />
  );
});

export interface NumberInputProps extends Omit<InputProps, 'type' | 'inputMode'> {
  /** Unit shown inside the field, after the number, e.g. "bar" or "L/h". */
  unit?: string;
  /** Class for the wrapping element (the field frame). */
  wrapperClassName?: string;
}

/**
 * Text field for figures: opens the numeric keypad (inputMode="decimal"), right-aligned
 * tabular digits, optional unit suffix inside the field. The value stays a string so
 * callers decide how to parse decimal commas and empty input.
 */
export const NumberInput = forwardRef<HTMLInputElement, NumberInputProps>(function NumberInput(
  { unit, invalid, className, wrapperClassName, id, ...rest },
  ref,
) {
  const mark = useDecimalMark();
  // The text typed so far (registered fields are uncontrolled), to say how an ambiguous entry is read.
  const [typed, setTyped] = useState(() => String(rest.defaultValue ?? ''));
  const text = rest.value !== undefined ? String(rest.value) : typed;
  const reading = ambiguousReading(text, mark);
  const unitId = unit && id ? `${id}-unit` : undefined;
  const readingId = reading && id ? `${id}-reading` : undefined;
  const describedBy = [rest['aria-describedby'], unitId, readingId].filter(Boolean).join(' ') || undefined;
  return (
    <div className={cn('relative', wrapperClassName)}>
      <input
        ref={ref}
        id={id}
        type="text"
        inputMode="decimal"
        autoComplete="off"
        spellCheck={false}
        {...rest}
        onChange={(e) => {
          setTyped(e.target.value);
          rest.onChange?.(e);
        }}
        aria-describedby={describedBy}
        aria-invalid={invalid || rest['aria-invalid'] || undefined}
        className={cn(fieldClasses, 'num min-h-11 text-right', unit && 'pr-[calc(var(--unit-w)+1.25rem)]', className)}
        // Room for the unit: about 0.65 em per character covers wide letters such as "m".
        style={unit ? ({ '--unit-w': `${(Math.max(unit.length, 1) * 0.65).toFixed(2)}em`, ...rest.style } as CSSProperties) : rest.style}
      />
      {unit ? (
        <span
          id={unitId}
          className="pointer-events-none absolute inset-y-0 right-3 flex items-center text-base font-normal text-ink-500"
        >
          {unit}
        </span>
      ) : null}
      {reading ? (
        <p id={readingId} className="mt-1 text-right text-sm text-watch-800" role="status" data-testid="number-reading">
          {reading}
        </p>
      ) : null}
    </div>
  );
});

export interface TextareaProps extends TextareaHTMLAttributes<HTMLTextAreaElement> {
  invalid?: boolean;
}

export const Textarea = forwardRef<HTMLTextAreaElement, TextareaProps>(function Textarea(
  { invalid, className, rows = 3, ...rest },
  ref,
) {
  return (
    <textarea
      ref={ref}
      rows={rows}
      {...rest}
      aria-invalid={invalid || rest['aria-invalid'] || undefined}
      className={cn(fieldClasses, 'py-2 leading-normal', className)}
    />
  );
});
