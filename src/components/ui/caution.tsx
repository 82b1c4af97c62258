import { useId, type ReactNode } from 'react';
import { TriangleExclamationPoint } from 'lucide-react';
import { cn } from '@/utils/cn';

export interface CautionPanelProps {
  /** Short title, e.g. "Hot water – scald risk" or "Never open a housing under pressure". */
  title: ReactNode;
  children: ReactNode;
  /** Replaces the default warning icon (e.g. a thermometer for hot water). */
  icon?: ReactNode;
  className?: string;
}

/**
 * Safety caution placed beside the risky step (sanitation, steaming, chemical cleaning,
 * pressure tests, tank work). Stays in the page; nothing to click away.
 */
export function CautionPanel({ title, children, icon, className }: CautionPanelProps) {
  const titleId = useId();
  return (
    <aside
      role="note"
      aria-labelledby={titleId}
      className={cn('flex overflow-hidden rounded border border-watch-200 bg-white text-ink-900', className)}
    >
      <div aria-hidden="true" className="w-2 shrink-0 bg-caution-stripe" />
      <div className="flex min-w-0 flex-1 gap-2.5 px-3 py-2.5">
        <span aria-hidden="true" className="mt-0.5 inline-flex shrink-0 text-watch-700 [&_svg]:size-5">
          {icon ?? <TriangleExclamationPoint />}
        </span>
        <div className="min-w-0 flex-1">
          <p id={titleId} className="text-base font-semibold text-ink-950">
            <span className="sr-only">Caution: </span>
            {title}
          </p>
          <div className="mt-0.5 text-sm text-ink-700 [&_li]:mt-0.5 [&_ul]:list-disc [&_ul]:pl-5">{children}</div>
        </div>
      </div>
    </aside>
  );
}
