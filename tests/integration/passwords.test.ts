import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { loadActor } from '@/lib/auth/current-actor';
import { MAX_FAILURES_PER_ACCOUNT, signIn } from '@/lib/auth/sign-in';
import { db } from '@/lib/db';
import { changeOwnPassword } from '@/lib/users/change-password';
import { resetPassword } from '@/lib/users/reset-password';
import { AuditEvent, LoginAttempt, User } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';

describe('password change and reset against the real database', () => {
  beforeEach(async () => {
    await resetDatabase();
  });
  afterAll(async () => {
    await db().close();
  });

  test('a user changes their password: other sessions end, the old password stops working', async () => {
    const bea = await makeActor(['biologist'], 'bea@example.org', 'old-password-1');
    const before = (await User.findByPk(bea.id))!;
    const { sessionVersion } = await changeOwnPassword(bea, {
      currentPassword: 'old-password-1',
      newPassword: 'new-password-2',
      confirmPassword: 'new-password-2',
    });
    const after = (await User.findByPk(bea.id))!;
    expect(sessionVersion).toBe(before.sessionVersion + 1);
    expect(after.passwordChangedAt.getTime()).toBeGreaterThan(before.passwordChangedAt.getTime());
    // A session sealed with the old version no longer matches (currentActor compares the two).
    expect((await loadActor(bea.id, '127.0.0.1'))?.sessionVersion).not.toBe(before.sessionVersion);
    await expect(signIn('bea@example.org', 'old-password-1', '10.2.0.1')).resolves.toEqual({
      ok: false,
      reason: 'invalid',
    });
    await expect(signIn('bea@example.org', 'new-password-2', '10.2.0.1')).resolves.toMatchObject({
      ok: true,
      sessionVersion,
    });

    const event = await AuditEvent.findOne({ where: { action: 'change_password' }, raw: true });
    expect(event).toMatchObject({
      actorId: bea.id,
      entityId: bea.id,
      before: { sessionVersion: 1 },
      after: { sessionVersion: 2 },
    });
    expect(JSON.stringify(event)).not.toMatch(/password-[12]|argon2/);
  });

  test('a wrong current password is refused on its field, counts as a failed attempt, and changes nothing', async () => {
    const bea = await makeActor(['biologist'], 'bea@example.org', 'old-password-1');
    await expect(
      changeOwnPassword(bea, {
        currentPassword: 'not-it',
        newPassword: 'new-password-2',
        confirmPassword: 'new-password-2',
      }),
    ).rejects.toMatchObject({
      code: 'invalid',
      details: { fieldErrors: { currentPassword: ['That password is not right.'] } },
    });
    expect(await LoginAttempt.count({ where: { email: 'bea@example.org', succeeded: false } })).toBe(1);
    expect(await AuditEvent.count({ where: { action: 'change_password_failed', entityId: bea.id } })).toBe(1);
    expect((await User.findByPk(bea.id))!.sessionVersion).toBe(1);
  });

  test.each([
    [{ newPassword: 'short', confirmPassword: 'short' }, 'newPassword', 'Use at least 10 characters.'],
    [
      { newPassword: 'new-password-2', confirmPassword: 'new-password-3' },
      'confirmPassword',
      'The two new passwords differ.',
    ],
    [
      { newPassword: 'old-password-1', confirmPassword: 'old-password-1' },
      'newPassword',
      'Choose a password different from the current one.',
    ],
  ])('bad new passwords are refused with a message on the field (%o)', async (fields, field, message) => {
    const bea = await makeActor(['biologist'], 'bea@example.org', 'old-password-1');
    await expect(
      changeOwnPassword(bea, { currentPassword: 'old-password-1', ...fields }),
    ).rejects.toMatchObject({
      details: { fieldErrors: { [field]: [message] } },
    });
    expect(await LoginAttempt.count()).toBe(0);
  });

  test('too many wrong current passwords throttle the change, even with the right one', async () => {
    const bea = await makeActor(['biologist'], 'bea@example.org', 'old-password-1');
    for (let i = 0; i < MAX_FAILURES_PER_ACCOUNT; i += 1) {
      await changeOwnPassword(bea, {
        currentPassword: `wrong-${i}`,
        newPassword: 'new-password-2',
        confirmPassword: 'new-password-2',
      }).catch(() => undefined);
    }
    await expect(
      changeOwnPassword(bea, {
        currentPassword: 'old-password-1',
        newPassword: 'new-password-2',
        confirmPassword: 'new-password-2',
      }),
    ).rejects.toMatchObject({
      code: 'rate_limited',
      message: 'Too many wrong passwords. Wait 15 minutes, then try again.',
    });
  });

  test('an admin resets a password: the person’s sessions end, the new password works, the audit has a reason', async () => {
    const admin = await makeActor(['admin']);
    const bea = await makeActor(['biologist'], 'bea@example.org', 'old-password-1');
    const reset = await resetPassword(admin, { userId: bea.id, reason: 'forgot it after leave' });
    expect(reset.temporaryPassword).toMatch(/^[A-Za-z0-9_-]{16}$/);
    expect((await User.findByPk(bea.id))!.sessionVersion).toBe(2);
    await expect(signIn('bea@example.org', reset.temporaryPassword!, '10.2.0.3')).resolves.toMatchObject({
      ok: true,
    });
    const event = await AuditEvent.findOne({ where: { action: 'reset_password' }, raw: true });
    expect(event).toMatchObject({
      actorId: admin.id,
      entityId: bea.id,
      reason: 'forgot it after leave',
      after: { newPassword: 'generated' },
    });
    expect(JSON.stringify(event)).not.toContain(reset.temporaryPassword);

    const chosen = await resetPassword(admin, {
      userId: bea.id,
      password: 'admin-chosen-1',
      reason: 'second try',
    });
    expect(chosen.temporaryPassword).toBeNull();
    await expect(signIn('bea@example.org', 'admin-chosen-1', '10.2.0.3')).resolves.toMatchObject({
      ok: true,
      sessionVersion: 3,
    });
  });

  test('only admins reset passwords, and not their own', async () => {
    const admin = await makeActor(['admin']);
    const approver = await makeActor(['approver']);
    await expect(resetPassword(approver, { userId: admin.id, reason: 'take over' })).rejects.toMatchObject({
      code: 'forbidden',
    });
    await expect(resetPassword(admin, { userId: admin.id, reason: 'shortcut' })).rejects.toMatchObject({
      code: 'conflict',
    });
    await expect(resetPassword(admin, { userId: 'not-a-uuid', reason: 'typo' })).rejects.toMatchObject({
      code: 'invalid',
    });
    await expect(
      resetPassword(admin, { userId: '00000000-0000-4000-8000-000000000000', reason: 'gone' }),
    ).rejects.toMatchObject({ code: 'not_found' });
  });
});
