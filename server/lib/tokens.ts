import { randomBytes } from 'node:crypto';
import { sha256 } from 'oslo/crypto';
import { encodeHex } from 'oslo/encoding';

/** A random single-use token for e-mailed links (256 bits, base64url: safe in a URL). Only its hash is stored. */
export function createToken(): string {
  return randomBytes(32).toString('base64url');
}

/** SHA-256 of a token, hex: what the database keeps instead of the token itself. */
export async function hashToken(token: string): Promise<string> {
  return encodeHex(await sha256(new TextEncoder().encode(token)));
}
