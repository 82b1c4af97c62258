import type { ReactNode } from 'react';
import { Circle, CircleCheck, Info, OctagonX, TriangleExclamationPoint, type LucideIcon } from 'lucide-react';
import { cn } from '@/utils/cn';

export type StatusTone = 'ok' | 'watch' | 'stop' | 'neutral' | 'info';

export interface StatusBadgeProps {
  tone: StatusTone;
  /** Replaces the tone's default icon; pass null to show the word only. */
  icon?: ReactNode;
  /** The word for the state, e.g. "ready", "borderline", "not ready", "installed". */
  children: ReactNode;
  size?: 'sm' | 'md';
  className?: string;
}

const tones: Record<StatusTone, { icon: LucideIcon; classes: string }> = {
  ok: { icon: CircleCheck, classes: 'border-ok-200 bg-ok-50 text-ok-700' },
  watch: { icon: TriangleExclamationPoint, classes: 'border-watch-200 bg-watch-50 text-watch-800' },
  stop: { icon: OctagonX, classes: 'border-stop-200 bg-stop-50 text-stop-700' },
  neutral: { icon: Circle, classes: 'border-ink-200 bg-ink-50 text-ink-700' },
  info: { icon: Info, classes: 'border-primary-200 bg-primary-50 text-primary-800' },
};

/** A state shown as a word with an icon; colour only supports the two. */
export function StatusBadge({ tone, icon, children, size = 'md', className }: StatusBadgeProps) {
  const t = tones[tone];
  const DefaultIcon = t.icon;
  const iconNode =
    icon === undefined ? <DefaultIcon aria-hidden="true" className={size === 'sm' ? 'size-3.5' : 'size-4'} /> : icon;

  return (
    <span
      data-tone={tone}
      className={cn(
        'inline-flex max-w-full items-center gap-1 rounded-sm border font-semibold whitespace-nowrap',
        size === 'sm' ? 'px-1.5 py-px text-xs' : 'px-2 py-0.5 text-sm',
        t.classes,
        className,
      )}
    >
      {iconNode ? (
        <span aria-hidden="true" className="inline-flex shrink-0">
          {iconNode}
        </span>
      ) : null}
      <span className="truncate">{children}</span>
    </span>
  );
}
