import { cn } from '@/utils/cn';

/** The Porewise mark: a drop passing a layered medium. */
export function BrandMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 32 32" aria-hidden="true" className={cn('size-8 shrink-0', className)}>
      <rect width="32" height="32" rx="6" className="fill-primary-700" />
      <path d="M16 5c-4 5.5-7 9.6-7 13.2A7 7 0 0 0 23 18.2C23 14.6 20 10.5 16 5z" className="fill-primary-50" />
      <path d="M10.5 17.5h11M10 20.5h12M11.5 23.5h9" className="stroke-accent-600" strokeWidth="1.6" strokeLinecap="round" />
    </svg>
  );
}

export function Wordmark({ className }: { className?: string }) {
  return (
    <span className={cn('flex items-center gap-2', className)}>
      <BrandMark />
      <span className="text-lg font-semibold tracking-tight text-ink-900">Porewise</span>
    </span>
  );
}
