import { useMutation, useQueryClient } from '@tanstack/react-query';
import { answerOf } from '@/lib/offline/kept';
import type { OutboxKind } from '@/lib/offline/outbox';
import { submit } from '@/lib/offline/outbox-runtime';
import { queryRoots } from '@/lib/query-keys';
import { careKeys } from './keys';

/** What a stored care entry changes: the recent list, the cartridge's care page, the cartridge screens and Today. */
const refreshedBy = (cartridgeId: string) => [careKeys.recent(), careKeys.target(cartridgeId), queryRoots.cartridges, queryRoots.today];

/**
 * Sends one care entry (a cycle, a test) of a cartridge: kept on the device first and sent with
 * its own Idempotency-Key (so a resend is stored once); without a connection it waits in the
 * outbox and this throws KeptOnDevice. `what` names it in messages ("the care cycle").
 */
export async function sendCareEntry<T>(
  entry: { kind: OutboxKind; path: string; label: string; what: string },
  { cartridgeId, input, serial }: { cartridgeId: string; input: object; serial?: string },
) {
  return answerOf<T>(
    await submit({
      kind: entry.kind,
      path: `/cartridges/${encodeURIComponent(cartridgeId)}/${entry.path}`,
      body: input as Record<string, unknown>,
      label: `${entry.label}${serial ? ` · ${serial}` : ''}`,
      invalidate: refreshedBy(cartridgeId).map((key) => [...key]),
    }),
    entry.what,
  );
}

/** The mutation of a care entry; once stored, what it changes is read again. */
export function useCareEntry<V extends { cartridgeId: string }, T>(send: (v: V) => Promise<T>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: (_result, { cartridgeId }) => {
      for (const queryKey of refreshedBy(cartridgeId)) void qc.invalidateQueries({ queryKey });
    },
  });
}
