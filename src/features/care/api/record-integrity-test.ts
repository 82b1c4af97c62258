import type { RecordIntegrityInput } from '@shared/schemas/care';
import type { IntegrityResultDto } from '@shared/types/care';
import { sendCareEntry, useCareEntry } from './care-entry';

/**
 * Kept on the device first and sent with its own Idempotency-Key (so a resend is stored once);
 * without a connection it waits in the outbox and this throws KeptOnDevice.
 */
export const recordIntegrityTest = (v: { cartridgeId: string; input: RecordIntegrityInput; serial?: string }) =>
  sendCareEntry<IntegrityResultDto>({ kind: 'integrity-test', path: 'integrity-tests', label: 'Integrity test', what: 'the integrity test' }, v);

export function useRecordIntegrityTest() {
  return useCareEntry(recordIntegrityTest);
}
