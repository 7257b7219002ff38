import { hash, verify } from '@node-rs/argon2';

// argon2id with OWASP's minimum parameters (Password Storage Cheat Sheet: m=19456 KiB, t=2, p=1).
// @node-rs/argon2's defaults are these values; we state them so a library upgrade cannot lower them.
export const ARGON2_OPTIONS = { memoryCost: 19456, timeCost: 2, parallelism: 1, algorithm: 2 } as const;

/** Hashes a password with argon2id. */
export function hashPassword(password: string): Promise<string> {
  return hash(password, ARGON2_OPTIONS);
}

/** Checks a password against a stored hash; false (never throws) for a malformed hash. */
export async function verifyPassword(storedHash: string, password: string): Promise<boolean> {
  try {
    return await verify(storedHash, password);
  } catch {
    return false;
  }
}
