import { hash, verify } from '@node-rs/argon2';

// Argon2id with the OWASP minimum (19 MiB, 2 passes, 1 lane).
const options = { memoryCost: 19456, timeCost: 2, outputLen: 32, parallelism: 1 } as const;

export const hashPassword = (password: string) => hash(password, options);
export const verifyPassword = (passwordHash: string, password: string) =>
  verify(passwordHash, password, options).catch(() => false);

/** A fixed hash to verify against when the account does not exist, so timing does not reveal it. */
let dummyHash: Promise<string> | null = null;
export function dummyPasswordHash() {
  dummyHash ??= hashPassword('porewise-no-such-account');
  return dummyHash;
}
