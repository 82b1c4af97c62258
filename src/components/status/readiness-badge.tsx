import type { ReadinessVerdict } from '@shared/engine';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';

export const readinessWords: Record<ReadinessVerdict, { tone: StatusTone; word: string }> = {
  ready: { tone: 'ok', word: 'ready' },
  borderline: { tone: 'watch', word: 'borderline' },
  'not-ready': { tone: 'stop', word: 'not ready' },
  unknown: { tone: 'neutral', word: 'no verdict' },
};

/** The lot readiness verdict as a word with an icon. */
export function ReadinessBadge({ verdict, size }: { verdict: ReadinessVerdict; size?: 'sm' | 'md' }) {
  const r = readinessWords[verdict];
  return (
    <StatusBadge tone={r.tone} size={size}>
      {r.word}
    </StatusBadge>
  );
}
