import type { ReactNode } from 'react';
import { Inbox } from 'lucide-react';
import { cn } from '@/utils/cn';

export interface EmptyStateProps {
  /** Icon element; defaults to a quiet tray. Pass null for none. */
  icon?: ReactNode;
  title: ReactNode;
  /** What to do first. */
  children?: ReactNode;
  /** Usually one Button that does the first step. */
  action?: ReactNode;
  className?: string;
}

export function EmptyState({ icon, title, children, action, className }: EmptyStateProps) {
  const iconNode = icon === undefined ? <Inbox /> : icon;
  return (
    <div
      className={cn(
        'flex flex-col items-center rounded border border-dashed border-ink-300 bg-white px-4 py-8 text-center',
        className,
      )}
    >
      {iconNode ? (
        <span aria-hidden="true" className="mb-3 inline-flex text-ink-400 [&_svg]:size-8">
          {iconNode}
        </span>
      ) : null}
      <p className="text-lg font-semibold text-ink-900">{title}</p>
      {children ? <div className="mt-1 max-w-prose text-base text-ink-600">{children}</div> : null}
      {action ? <div className="mt-4 flex flex-wrap justify-center gap-2">{action}</div> : null}
    </div>
  );
}
