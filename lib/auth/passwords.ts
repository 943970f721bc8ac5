import 'server-only';
import { randomBytes } from 'node:crypto';
import argon2 from 'argon2';

export { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from './password-policy';

/** A random password for an admin to hand over once: 16 URL-safe characters (96 bits). */
export function generatePassword(): string {
  return randomBytes(12).toString('base64url');
}

export function hashPassword(password: string): Promise<string> {
  return argon2.hash(password, { type: argon2.argon2id });
}

let dummyHash: Promise<string> | undefined;

/**
 * Verifies a password; with no stored hash it still spends the same work on a dummy hash,
 * so that unknown accounts and wrong passwords take the same time.
 */
export async function verifyPassword(storedHash: string | null, password: string): Promise<boolean> {
  if (storedHash === null) {
    dummyHash ??= hashPassword('gatewell-no-such-account');
    await argon2.verify(await dummyHash, password);
    return false;
  }
  try {
    return await argon2.verify(storedHash, password);
  } catch {
    return false;
  }
}
