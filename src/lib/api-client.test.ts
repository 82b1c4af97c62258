import { afterEach, describe, expect, it, vi } from 'vitest';
import { api, ApiError } from './api-client';

afterEach(() => {
  vi.unstubAllGlobals();
});

describe('api client', () => {
  it('sends a create again with the same Idempotency-Key when the answer is lost', async () => {
    const keys: string[] = [];
    let calls = 0;
    vi.stubGlobal(
      'fetch',
      vi.fn(async (_url: string, init: RequestInit) => {
        keys.push((init.headers as Record<string, string>)['idempotency-key']);
        calls += 1;
        if (calls === 1) throw new TypeError('network down');
        return new Response(JSON.stringify({ id: 'x' }), { status: 201, headers: { 'content-type': 'application/json' } });
      }),
    );
    await expect(api.post('/lots', { code: 'A' })).resolves.toEqual({ id: 'x' });
    expect(keys).toHaveLength(2);
    expect(keys[0]).toMatch(/^[0-9a-f]{32}$/);
    expect(keys[1]).toBe(keys[0]);
  });

  it('turns an error answer into an ApiError with the field messages', async () => {
    vi.stubGlobal(
      'fetch',
      vi.fn(async () => new Response(JSON.stringify({ error: { code: 'invalid_input', message: 'Check', fields: { code: 'Enter a code.' } } }), { status: 400 })),
    );
    const error = await api.post('/lots', {}).catch((e) => e);
    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 400, code: 'invalid_input', fields: { code: 'Enter a code.' } });
  });

  it('does not resend a delete after a network failure', async () => {
    const fetchMock = vi.fn(async () => {
      throw new TypeError('network down');
    });
    vi.stubGlobal('fetch', fetchMock);
    await expect(api.delete('/lots/1')).rejects.toMatchObject({ code: 'offline' });
    expect(fetchMock).toHaveBeenCalledTimes(1);
  });
});
