import type { ApiErrorBody } from '@shared/types/api';
import { noteReachable, noteUnreachable } from './offline/reachability';

/** An error answer from the API, with the server's code, message and field messages. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: Record<string, string> = {},
    /** The whole error body, for codes that carry more (run_blocked reasons, in_record record). */
    readonly body: ApiErrorBody['error'] | null = null,
  ) {
    super(message);
  }
}

const NETWORK_RETRIES = 2;

/** A random request key (getRandomValues also works on plain-HTTP LAN addresses, unlike randomUUID). */
function requestKey() {
  return Array.from(crypto.getRandomValues(new Uint8Array(16)), (b) => b.toString(16).padStart(2, '0')).join('');
}

/** Per-request options: a caller's own Idempotency-Key (the outbox keeps one per entry). */
export type RequestOptions = { idempotencyKey?: string };

async function request<T>(method: string, path: string, body?: unknown, opts: RequestOptions = {}): Promise<T> {
  const headers: Record<string, string> = { accept: 'application/json' };
  if (body !== undefined) headers['content-type'] = 'application/json';
  // A create that loses its answer on a poor cellar connection is sent again with the same key,
  // and the server answers the retry instead of making a second record.
  if (method === 'POST') headers['idempotency-key'] = opts.idempotencyKey ?? requestKey();
  let res: Response | null = null;
  for (let attempt = 0; !res; attempt += 1) {
    try {
      res = await fetch(`/api${path}`, {
        method,
        credentials: 'same-origin',
        headers,
        body: body === undefined ? undefined : JSON.stringify(body),
      });
    } catch {
      if (attempt >= NETWORK_RETRIES || method === 'PATCH' || method === 'DELETE') {
        noteUnreachable();
        throw new ApiError(0, 'offline', 'Porewise cannot be reached. Check the connection and try again.');
      }
      await new Promise((r) => setTimeout(r, 400 * (attempt + 1)));
      continue;
    }
    // The first copy of this request is still running on the server: wait for its answer.
    if (res.status === 409 && attempt < NETWORK_RETRIES + 3 && (await res.clone().json().catch(() => null))?.error?.code === 'request_in_progress') {
      res = null;
      await new Promise((r) => setTimeout(r, 500));
    }
  }
  noteReachable();
  if (res.status === 204) return undefined as T;
  const data = (await res.json().catch(() => null)) as unknown;
  if (!res.ok) {
    const err = (data as ApiErrorBody | null)?.error;
    throw new ApiError(res.status, err?.code ?? 'http_error', err?.message ?? `The server answered ${res.status}.`, err?.fields, err ?? null);
  }
  return data as T;
}

/** The one fetch wrapper: JSON in, JSON out, errors as ApiError. */
export const api = {
  get: <T>(path: string) => request<T>('GET', path),
  post: <T>(path: string, body: unknown = {}, opts?: RequestOptions) => request<T>('POST', path, body, opts),
  put: <T>(path: string, body: unknown = {}) => request<T>('PUT', path, body),
  patch: <T>(path: string, body: unknown = {}) => request<T>('PATCH', path, body),
  delete: <T>(path: string) => request<T>('DELETE', path),
};

/** The message to show a person for any failure: the server's own words, or a plain fallback. */
export function errorMessage(error: unknown, opts: { preferField?: boolean } = {}): string {
  if (!(error instanceof ApiError)) return 'Something went wrong. Try again.';
  return (opts.preferField ? Object.values(error.fields)[0] : undefined) ?? error.message;
}
