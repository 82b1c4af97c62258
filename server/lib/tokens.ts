import { sha256 } from 'oslo/crypto';
import { encodeBase64url, encodeHex } from 'oslo/encoding';

/** A random single-use token for e-mailed links (256 bits, URL-safe). Only its hash is stored. */
export function createToken(): string {
  return encodeBase64url(crypto.getRandomValues(new Uint8Array(32)));
}

/** SHA-256 of a token, hex: what the database keeps instead of the token itself. */
export async function hashToken(token: string): Promise<string> {
  return encodeHex(await sha256(new TextEncoder().encode(token)));
}
