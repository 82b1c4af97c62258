import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RecordIntegrityInput } from '@shared/schemas/care';
import type { IntegrityResultDto } from '@shared/types/care';
import { answerOf } from '@/lib/offline/kept';
import { submit } from '@/lib/offline/outbox-runtime';
import { queryRoots } from '@/lib/query-keys';
import { careKeys } from './keys';

/**
 * Kept on the device first and sent with its own Idempotency-Key (so a resend is stored once);
 * without a connection it waits in the outbox and this throws KeptOnDevice.
 */
export const recordIntegrityTest = async ({ cartridgeId, input, serial }: { cartridgeId: string; input: RecordIntegrityInput; serial?: string }) =>
  answerOf<IntegrityResultDto>(
    await submit({
      kind: 'integrity-test',
      path: `/cartridges/${encodeURIComponent(cartridgeId)}/integrity-tests`,
      body: input as Record<string, unknown>,
      label: `Integrity test${serial ? ` · ${serial}` : ''}`,
      invalidate: [[...careKeys.recent()], [...careKeys.target(cartridgeId)], [...queryRoots.cartridges], [...queryRoots.today]],
    }),
    'the integrity test',
  );

export function useRecordIntegrityTest() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: recordIntegrityTest,
    onSuccess: (_result, { cartridgeId }) => {
      void qc.invalidateQueries({ queryKey: careKeys.recent() });
      void qc.invalidateQueries({ queryKey: careKeys.target(cartridgeId) });
      void qc.invalidateQueries({ queryKey: queryRoots.cartridges });
      void qc.invalidateQueries({ queryKey: queryRoots.today });
    },
  });
}
