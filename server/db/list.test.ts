import { describe, expect, it } from 'vitest';
import { likePattern, pageWindow } from './list';
import { createToken, hashToken } from '../lib/tokens';

describe('list helpers', () => {
  it.each([
    [{ page: 1, pageSize: 25 }, { limit: 25, offset: 0 }],
    [{ page: 3, pageSize: 10 }, { limit: 10, offset: 20 }],
  ])('pageWindow(%o)', (query, window) => {
    expect(pageWindow(query)).toEqual(window);
  });

  it('escapes LIKE wildcards in search text', () => {
    expect(likePattern('50%_a\\b')).toBe('%50\\%\\_a\\\\b%');
  });
});

describe('tokens', () => {
  it('are URL-safe, 256-bit and different every time', () => {
    const tokens = Array.from({ length: 200 }, createToken);
    expect(new Set(tokens).size).toBe(200);
    for (const t of tokens) expect(t).toMatch(/^[A-Za-z0-9_-]{43}$/);
  });

  it('hash to SHA-256 hex (FIPS 180-4 test vector "abc")', async () => {
    expect(await hashToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});
