import { ApiError } from '../api-client';
import type { Outcome } from './outbox';

/** Thrown by a feature's write when the entry was kept on the device to send later (no connection). */
export class KeptOnDevice extends Error {
  constructor(readonly label: string) {
    super(`No connection: ${label} is kept on this device and sent by itself when the connection is back.`);
  }
}

/** The server's answer for a stored entry; an ApiError for a refused one; KeptOnDevice for a waiting one. */
export function answerOf<T>(outcome: Outcome, label: string): T {
  if (outcome.result === 'stored') return outcome.answer as T;
  if (outcome.result === 'refused') throw new ApiError(outcome.refusal.status, outcome.refusal.code, outcome.refusal.message, outcome.refusal.fields);
  throw new KeptOnDevice(label);
}
