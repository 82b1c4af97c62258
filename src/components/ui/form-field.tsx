import { Children, cloneElement, isValidElement, type ReactElement, type ReactNode } from 'react';
import { CircleExclamationPoint } from 'lucide-react';
import { cn } from '@/utils/cn';

export interface FormFieldProps {
  label: ReactNode;
  /** id of the control; the label points at it and hint/error ids derive from it. */
  htmlFor: string;
  hint?: ReactNode;
  /** What is wrong and what to do next. Linked to the control with aria-describedby. */
  error?: ReactNode;
  /** Adds a quiet "required" marker to the label. */
  required?: boolean;
  className?: string;
  children: ReactNode;
}

type DescribableProps = { 'aria-describedby'?: string; 'aria-invalid'?: boolean | 'true' | 'false' };

export function FormField({ label, htmlFor, hint, error, required, className, children }: FormFieldProps) {
  const hintId = hint ? `${htmlFor}-hint` : undefined;
  const errorId = error ? `${htmlFor}-error` : undefined;
  const ids = [hintId, errorId].filter(Boolean).join(' ');

  const only = Children.count(children) === 1 && isValidElement(children) ? children : null;
  const control = only
    ? cloneElement(only as ReactElement<DescribableProps>, {
        'aria-describedby':
          [(only.props as DescribableProps)['aria-describedby'], ids].filter(Boolean).join(' ') || undefined,
        ...(error ? { 'aria-invalid': true } : null),
      })
    : children;

  return (
    <div className={cn('flex flex-col gap-1.5', className)}>
      <label htmlFor={htmlFor} className="text-sm font-semibold text-ink-800">
        {label}
        {required ? <span className="ml-1 font-normal text-ink-500">(required)</span> : null}
      </label>
      {control}
      {hint ? (
        <p id={hintId} className="text-sm text-ink-600">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={errorId} role="alert" className="flex items-start gap-1.5 text-sm font-semibold text-stop-700">
          <CircleExclamationPoint aria-hidden="true" className="mt-0.5 size-4 shrink-0" />
          <span>{error}</span>
        </p>
      ) : null}
    </div>
  );
}
