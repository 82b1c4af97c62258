import type { ReactNode } from 'react';
import { cn } from '@/utils/cn';

export interface PageHeaderProps {
  title: ReactNode;
  description?: ReactNode;
  /** Buttons for the page's main commands; they wrap below the title on narrow screens. */
  actions?: ReactNode;
  /** Small line above the title, e.g. a back link or the lot name. */
  context?: ReactNode;
  className?: string;
}

export function PageHeader({ title, description, actions, context, className }: PageHeaderProps) {
  return (
    <header
      className={cn(
        'flex flex-col gap-3 border-b border-ink-200 pb-4 sm:flex-row sm:items-end sm:justify-between sm:gap-6',
        className,
      )}
    >
      <div className="min-w-0">
        {context ? <div className="mb-1 text-sm text-ink-600">{context}</div> : null}
        <h1 className="text-xl font-semibold text-ink-950 [overflow-wrap:anywhere]">{title}</h1>
        {description ? <p className="mt-1 max-w-prose text-base text-ink-600">{description}</p> : null}
      </div>
      {actions ? (
        <div className="flex flex-wrap gap-2 max-sm:[&>*]:flex-1 sm:shrink-0 sm:justify-end">{actions}</div>
      ) : null}
    </header>
  );
}
