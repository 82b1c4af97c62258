import { Archive, Package, RefreshCw, SquareStack } from 'lucide-react';
import type { CartridgeStatus } from '@shared/schemas/cartridges';
import { StatusBadge, type StatusTone } from '@/components/ui/status-badge';

const look: Record<CartridgeStatus, { tone: StatusTone; word: string; icon: typeof Package }> = {
  'in-stock': { tone: 'info', word: 'in stock', icon: Package },
  installed: { tone: 'ok', word: 'installed', icon: SquareStack },
  regenerating: { tone: 'watch', word: 'regenerating', icon: RefreshCw },
  retired: { tone: 'neutral', word: 'retired', icon: Archive },
};

export const statusWord = (s: CartridgeStatus) => look[s].word;

/** A cartridge's status as a word with its own icon. */
export function CartridgeStatusBadge({ status, size = 'sm' }: { status: CartridgeStatus; size?: 'sm' | 'md' }) {
  const { tone, word, icon: Icon } = look[status];
  return (
    <StatusBadge tone={tone} size={size} icon={<Icon aria-hidden="true" className={size === 'sm' ? 'size-3.5' : 'size-4'} />}>
      {word}
    </StatusBadge>
  );
}
