import { forwardRef, type ButtonHTMLAttributes, type ReactNode } from 'react';
import { LoaderCircle } from 'lucide-react';
import { cn } from '@/utils/cn';

export type ButtonVariant = 'primary' | 'secondary' | 'ghost' | 'danger';
export type ButtonSize = 'sm' | 'md' | 'lg';

export interface ButtonProps extends ButtonHTMLAttributes<HTMLButtonElement> {
  variant?: ButtonVariant;
  /** sm for dense office rows, md default, lg (≥ 44 px) for cellar screens. */
  size?: ButtonSize;
  /** Shows a spinner, sets aria-busy and disables the button. */
  loading?: boolean;
  /** Icon shown before the label (hidden while loading). */
  icon?: ReactNode;
}

const variantClasses: Record<ButtonVariant, string> = {
  primary:
    'border-primary-700 bg-primary-600 text-white hover:bg-primary-700 active:bg-primary-800 disabled:border-ink-300 disabled:bg-ink-300 disabled:text-ink-700',
  secondary:
    'border-ink-300 bg-white text-ink-900 hover:border-ink-400 hover:bg-ink-50 active:bg-ink-100 disabled:text-ink-500',
  ghost:
    'border-transparent bg-transparent text-primary-700 hover:bg-primary-50 active:bg-primary-100 disabled:text-ink-500',
  danger:
    'border-stop-700 bg-stop-600 text-white hover:bg-stop-700 active:bg-stop-800 disabled:border-ink-300 disabled:bg-ink-300 disabled:text-ink-700',
};

const sizeClasses: Record<ButtonSize, string> = {
  sm: 'min-h-8 px-2.5 text-sm gap-1.5 [&_svg]:size-4',
  md: 'min-h-10 px-3.5 text-base gap-2 [&_svg]:size-4',
  lg: 'min-h-12 min-w-touch px-5 text-base gap-2 [&_svg]:size-5',
};

export const buttonClasses = (variant: ButtonVariant = 'primary', size: ButtonSize = 'md', className?: string) =>
  cn(
    'inline-flex shrink-0 items-center justify-center rounded border font-semibold leading-tight whitespace-nowrap select-none',
    'transition-colors duration-100 disabled:cursor-not-allowed',
    variantClasses[variant],
    sizeClasses[size],
    className,
  );

export const Button = forwardRef<HTMLButtonElement, ButtonProps>(function Button(
  { variant = 'primary', size = 'md', loading = false, icon, disabled, type = 'button', className, children, ...rest },
  ref,
) {
  return (
    <button
      ref={ref}
      type={type}
      disabled={disabled || loading}
      aria-busy={loading || undefined}
      className={buttonClasses(variant, size, cn(loading && 'cursor-wait', className))}
      {...rest}
    >
      {loading ? (
        <LoaderCircle aria-hidden="true" className="animate-spin" />
      ) : icon ? (
        <span aria-hidden="true" className="inline-flex">
          {icon}
        </span>
      ) : null}
      {children}
    </button>
  );
});
