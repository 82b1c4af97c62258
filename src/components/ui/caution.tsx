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

/**
 * The gas caution: CO₂ or nitrogen used to push wine out of a train or to blanket a tank can
 * displace the air in a cellar or a tank (asphyxiation). Shown at push-out and changeover and
 * on tank pages; defers to the site's rules.
 */
export function GasCaution({ title = 'CO₂ and nitrogen – no air to breathe', className }: { title?: ReactNode; className?: string }) {
  return (
    <CautionPanel title={title} className={className}>
      <ul>
        <li>Pushing wine out with CO₂ or nitrogen fills drains, pits and low cellars with gas that gives no warning before collapse.</li>
        <li>Vent to the outside, keep the cellar ventilated, and use a gas monitor where one is fitted.</li>
        <li>Never enter or lean into a tank without the site’s confined-space procedure: tested air, a permit and a standby person.</li>
      </ul>
      <p className="mt-1">Local rules and the site’s own procedures govern.</p>
    </CautionPanel>
  );
}
