import { hash, verify } from '@node-rs/argon2';

/** argon2id with the library's defaults (19 MiB, 2 passes), as OWASP's password guidance suggests. */
export const hashPassword = (password: string) => hash(password);

export async function verifyPassword(passwordHash: string | null | undefined, password: string): Promise<boolean> {
  if (!passwordHash) return false;
  try {
    return await verify(passwordHash, password);
  } catch {
    return false;
  }
}

/** A hash to verify against when the account does not exist, so both paths take the same time. */
let decoy: Promise<string> | undefined;
export function decoyHash(): Promise<string> {
  decoy ??= hash('not-a-real-password-oxbloom');
  return decoy;
}
