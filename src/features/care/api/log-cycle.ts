import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LogCycleInput } from '@shared/schemas/care';
import type { CycleResultDto } from '@shared/types/care';
import { answerOf } from '@/lib/offline/kept';
import { submit } from '@/lib/offline/outbox-runtime';
import { queryRoots } from '@/lib/query-keys';
import { careKeys } from './keys';

/**
 * Kept on the device first and sent with its own Idempotency-Key (so a resend is stored once);
 * without a connection it waits in the outbox and this throws KeptOnDevice.
 */
export const logCycle = async ({ cartridgeId, input, serial }: { cartridgeId: string; input: LogCycleInput; serial?: string }) =>
  answerOf<CycleResultDto>(
    await submit({
      kind: 'care-cycle',
      path: `/cartridges/${encodeURIComponent(cartridgeId)}/cycles`,
      body: input as Record<string, unknown>,
      label: `Care cycle${serial ? ` · ${serial}` : ''}`,
      invalidate: [[...careKeys.recent()], [...careKeys.target(cartridgeId)], [...queryRoots.cartridges], [...queryRoots.today]],
    }),
    'the care cycle',
  );

export function useLogCycle() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: logCycle,
    onSuccess: (_result, { cartridgeId }) => {
      void qc.invalidateQueries({ queryKey: careKeys.recent() });
      void qc.invalidateQueries({ queryKey: careKeys.target(cartridgeId) });
      void qc.invalidateQueries({ queryKey: queryRoots.cartridges });
      void qc.invalidateQueries({ queryKey: queryRoots.today });
    },
  });
}
