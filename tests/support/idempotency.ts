import { expect } from 'vitest';
import type { Client } from './test-app';

/**
 * A create sent with an Idempotency-Key through `first`, then the same request again through
 * `second` (the same client for a retry, another instance's for a load balancer): both 201, the
 * second marked as a replay and answering the first's record. Returns the first answer.
 */
export async function expectReplayedCreate(first: Client, second: Client, path: string, body: unknown, key: string) {
  const made = await first.request('POST', path, body, { 'idempotency-key': key });
  const replay = await second.request('POST', path, body, { 'idempotency-key': key });
  expect(made.status).toBe(201);
  expect(replay.status).toBe(201);
  expect(replay.headers.get('idempotent-replay')).toBe('true');
  expect(replay.body.id).toBe(made.body.id);
  return made;
}
