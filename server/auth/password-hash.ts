import { hash, verify } from '@node-rs/argon2';

// @node-rs/argon2 defaults to argon2id with OWASP-recommended memory and time costs.
export function hashPassword(password: string): Promise<string> {
  return hash(password);
}

/** A fixed hash to verify against when the user does not exist, so both paths take the same time. */
let decoy: Promise<string> | undefined;

export async function passwordMatches(storedHash: string | null, password: string): Promise<boolean> {
  if (!storedHash) {
    decoy ??= hash('decoy-password-for-timing');
    await verify(await decoy, password).catch(() => false);
    return false;
  }
  return verify(storedHash, password).catch(() => false);
}
