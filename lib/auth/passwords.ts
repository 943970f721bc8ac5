import 'server-only';
import argon2 from 'argon2';

/** Minimum password length for Gatewell accounts (common practice, no source). */
export const MIN_PASSWORD_LENGTH = 10;

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
