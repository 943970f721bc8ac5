import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { hashPassword } from '@/lib/auth/passwords';
import { MAX_FAILURES_PER_ACCOUNT, signIn } from '@/lib/auth/sign-in';
import { db } from '@/lib/db';
import { AuditEvent, LoginAttempt, User, UserRole } from '@/models';
import { resetDatabase } from '../support/database';

async function makeUser(email: string, password: string) {
  const user = await User.create({
    email,
    name: 'Test Person',
    passwordHash: await hashPassword(password),
    disabledAt: null,
    lastSignInAt: null,
  });
  await UserRole.create({ userId: user.id, role: 'biologist' });
  return user;
}

describe('sign-in against the real database', () => {
  beforeEach(async () => {
    await resetDatabase();
  });
  afterAll(async () => {
    await db().close();
  });

  test('the right password signs in, is recorded, and audited', async () => {
    const user = await makeUser('bea@example.org', 'correct horse battery');
    const result = await signIn(' Bea@Example.org ', 'correct horse battery', '10.0.0.1');
    expect(result).toEqual({ ok: true, userId: user.id, sessionVersion: 1, passwordChangeRequired: false });
    expect(await LoginAttempt.count({ where: { email: 'bea@example.org', succeeded: true } })).toBe(1);
    expect(await AuditEvent.count({ where: { action: 'sign_in', actorId: user.id } })).toBe(1);
  });

  test('unknown account, wrong password and disabled account give the same answer', async () => {
    const user = await makeUser('bea@example.org', 'correct horse battery');
    await expect(signIn('nobody@example.org', 'whatever', '10.0.0.1')).resolves.toEqual({
      ok: false,
      reason: 'invalid',
    });
    await expect(signIn('bea@example.org', 'wrong', '10.0.0.1')).resolves.toEqual({
      ok: false,
      reason: 'invalid',
    });
    await user.update({ disabledAt: new Date() });
    await expect(signIn('bea@example.org', 'correct horse battery', '10.0.0.1')).resolves.toEqual({
      ok: false,
      reason: 'invalid',
    });
    expect(await AuditEvent.count({ where: { action: 'sign_in_failed' } })).toBe(3);
  });

  test(`after ${MAX_FAILURES_PER_ACCOUNT} failures the account is throttled, even with the right password`, async () => {
    await makeUser('bea@example.org', 'correct horse battery');
    for (let i = 0; i < MAX_FAILURES_PER_ACCOUNT; i += 1) {
      await signIn('bea@example.org', `wrong-${i}`, `10.0.0.${i}`);
    }
    await expect(signIn('bea@example.org', 'correct horse battery', '10.0.9.9')).resolves.toEqual({
      ok: false,
      reason: 'throttled',
    });
    // Throttling is per account: an unknown account from the same addresses is answered as usual.
    await expect(signIn('other@example.org', 'x', '10.0.9.9')).resolves.toEqual({
      ok: false,
      reason: 'invalid',
    });
  });
});
