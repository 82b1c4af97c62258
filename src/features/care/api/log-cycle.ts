import type { LogCycleInput } from '@shared/schemas/care';
import type { CycleResultDto } from '@shared/types/care';
import { sendCareEntry, useCareEntry } from './care-entry';

/**
 * Kept on the device first and sent with its own Idempotency-Key (so a resend is stored once);
 * without a connection it waits in the outbox and this throws KeptOnDevice. Once stored, the care
 * lists, the cartridge screens and Today are read again (online here, from the outbox through the
 * entry's `invalidate` list): see `care-entry.ts`.
 */
export const logCycle = (v: { cartridgeId: string; input: LogCycleInput; serial?: string }) =>
  sendCareEntry<CycleResultDto>({ kind: 'care-cycle', path: 'cycles', label: 'Care cycle', what: 'the care cycle' }, v);

export function useLogCycle() {
  return useCareEntry(logCycle);
}
