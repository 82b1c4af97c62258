import { CircleCheck, FilePen, Lock } from 'lucide-react';
import type { PlanStatus } from '@shared/schemas/plans';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';

const words: Record<PlanStatus, { tone: StatusTone; icon: typeof FilePen }> = {
  draft: { tone: 'neutral', icon: FilePen },
  approved: { tone: 'info', icon: Lock },
  done: { tone: 'ok', icon: CircleCheck },
};

/** A plan's status as a word with an icon. */
export function PlanStatusBadge({ status, size }: { status: PlanStatus; size?: 'sm' | 'md' }) {
  const w = words[status];
  const Icon = w.icon;
  return (
    <StatusBadge tone={w.tone} size={size} icon={<Icon aria-hidden="true" className={size === 'sm' ? 'size-3.5' : 'size-4'} />}>
      {status}
    </StatusBadge>
  );
}
