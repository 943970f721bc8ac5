import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { loadActor } from '@/lib/auth/current-actor';
import { signIn } from '@/lib/auth/sign-in';
import { db } from '@/lib/db';
import { refuseUntilOwnPassword } from '@/lib/auth/own-password';
import { changeOwnPassword } from '@/lib/users/change-password';
import { changeRoles } from '@/lib/users/change-roles';
import { resetPassword } from '@/lib/users/reset-password';
import { createUser } from '@/lib/users/create';
import { getUser, listUsers } from '@/lib/users/list';
import { disableUser, enableUser } from '@/lib/users/status';
import { AuditEvent, User } from '@/models';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { holdLocks } from '../support/lock-holder';

const reason = 'test of user administration';

describe('user administration against the real database', () => {
  beforeEach(async () => {
    await resetDatabase();
  });
  afterAll(async () => {
    await db().close();
  });

  test('an admin creates a user with a generated password shown once; the audit keeps no secret', async () => {
    const admin = await makeActor(['admin']);
    const created = await createUser(admin, {
      name: 'Nia Newcomer',
      email: ' Nia@Example.org ',
      roles: ['chemist', 'approver'],
    });
    expect(created.user).toMatchObject({
      email: 'nia@example.org',
      roles: ['approver', 'chemist'],
      disabledAt: null,
    });
    expect(created.initialPassword).toMatch(/^[A-Za-z0-9_-]{16}$/);
    await expect(signIn('nia@example.org', created.initialPassword!, '10.1.0.1')).resolves.toMatchObject({
      ok: true,
    });

    const event = await AuditEvent.findOne({
      where: { action: 'create', entityId: created.user.id },
      raw: true,
    });
    expect(event).toMatchObject({ actorId: admin.id, entityType: 'user' });
    const trail = JSON.stringify(event);
    expect(trail).not.toContain(created.initialPassword);
    expect(trail).not.toContain('argon2');
  });

  test('a password set by the admin is not echoed, and a taken e-mail is refused on its field', async () => {
    const admin = await makeActor(['admin']);
    const created = await createUser(admin, {
      name: 'Set Pass',
      email: 'set@example.org',
      roles: [],
      password: 'chosen-by-admin',
    });
    expect(created.initialPassword).toBeNull();
    await expect(
      createUser(admin, { name: 'Again', email: 'SET@example.org', roles: [] }),
    ).rejects.toMatchObject({
      code: 'conflict',
      details: { fieldErrors: { email: ['An account with this e-mail address exists already.'] } },
    });
    await expect(
      createUser(admin, { name: 'Short', email: 'short@example.org', roles: [], password: 'short' }),
    ).rejects.toMatchObject({
      code: 'invalid',
      details: { fieldErrors: { password: ['Use at least 10 characters.'] } },
    });
    expect(await User.count({ where: { email: 'short@example.org' } })).toBe(0);
  });

  test.each([['chemist'], ['biologist'], ['approver']] as const)(
    'a %s may not list, create, change or disable users',
    async (role) => {
      const someone = await makeActor([role]);
      const other = await makeActor(['biologist']);
      await expect(listUsers(someone)).rejects.toMatchObject({ code: 'forbidden' });
      await expect(getUser(someone, other.id)).rejects.toMatchObject({ code: 'forbidden' });
      await expect(
        createUser(someone, { name: 'X', email: 'x@example.org', roles: ['admin'] }),
      ).rejects.toMatchObject({ code: 'forbidden' });
      await expect(
        changeRoles(someone, { userId: someone.id, roles: ['admin'], reason }),
      ).rejects.toMatchObject({ code: 'forbidden' });
      await expect(disableUser(someone, { userId: other.id, reason })).rejects.toMatchObject({
        code: 'forbidden',
      });
      expect(await AuditEvent.count()).toBe(0);
    },
  );

  test('a role change is audited with before, after and reason', async () => {
    const admin = await makeActor(['admin']);
    const bea = await makeActor(['biologist']);
    const changed = await changeRoles(admin, {
      userId: bea.id,
      roles: ['biologist', 'approver'],
      reason: 'covers approvals in March',
    });
    expect(changed.roles).toEqual(['approver', 'biologist']);
    expect((await loadActor(bea.id, '10.1.0.1'))?.roles).toEqual(['approver', 'biologist']);
    const event = await AuditEvent.findOne({ where: { action: 'change_roles' }, raw: true });
    expect(event).toMatchObject({
      reason: 'covers approvals in March',
      before: { roles: ['biologist'] },
      after: { roles: ['approver', 'biologist'] },
    });
    await expect(
      changeRoles(admin, { userId: bea.id, roles: ['approver', 'biologist'], reason }),
    ).rejects.toMatchObject({ code: 'invalid' });
  });

  test('the last enabled admin keeps the admin role and cannot be disabled', async () => {
    const admin = await makeActor(['admin']);
    await expect(changeRoles(admin, { userId: admin.id, roles: ['approver'], reason })).rejects.toMatchObject(
      {
        code: 'conflict',
        message: expect.stringContaining('last enabled admin'),
      },
    );
    // A disabled admin does not count as the other admin.
    const second = await makeActor(['admin']);
    await disableUser(admin, { userId: second.id, reason });
    await expect(changeRoles(admin, { userId: admin.id, roles: [], reason })).rejects.toMatchObject({
      code: 'conflict',
    });

    await enableUser(admin, { userId: second.id, reason });
    const withoutAdmin = await changeRoles(admin, { userId: admin.id, roles: ['approver'], reason });
    expect(withoutAdmin.roles).toEqual(['approver']);
    const secondActor = (await loadActor(second.id, '127.0.0.1'))!;
    await expect(
      changeRoles(secondActor, { userId: second.id, roles: ['chemist'], reason }),
    ).rejects.toMatchObject({ code: 'conflict' });
    await expect(disableUser(secondActor, { userId: second.id, reason })).rejects.toMatchObject({
      code: 'conflict',
    });
  });

  // The race is forced: a transaction of the test holds both users' rows (the row each change locks), both
  // changes start and PostgreSQL shows both waiting, and only then are the rows let go. Without the admin-set
  // lock (lib/users/queries.ts) both would then count two admins, both would commit, and none would be left.
  test('two admins taking the admin role from each other at once leave one admin', async () => {
    const ada = await makeActor(['admin']);
    const abe = await makeActor(['admin']);
    const holder = await holdLocks([
      { sql: 'select id from users where id = any($1::uuid[]) for update', params: [[ada.id, abe.id]] },
    ]);
    let results: PromiseSettledResult<unknown>[];
    try {
      const racing = Promise.allSettled([
        changeRoles(ada, { userId: abe.id, roles: [], reason }),
        changeRoles(abe, { userId: ada.id, roles: [], reason }),
      ]);
      const waiters = await holder.waiters(2);
      // One change holds the admin-set lock and waits for its user's row; the other waits for that lock.
      expect(waiters).toHaveLength(2);
      const first = waiters.find((w) => w.blockedBy.includes(holder.pid));
      const second = waiters.find((w) => w !== first);
      expect(first?.blockedBy).toEqual([holder.pid]);
      expect(second).toMatchObject({ waitEvent: 'advisory', blockedBy: [first!.pid] });
      await holder.release();
      results = await racing;
    } finally {
      await holder.release();
    }
    expect(results.map((r) => r.status).sort()).toEqual(['fulfilled', 'rejected']);
    expect((results.find((r) => r.status === 'rejected') as PromiseRejectedResult).reason).toMatchObject({
      code: 'conflict',
    });
    const [row] = await db().query(`select count(*)::int as n from user_roles where role = 'admin'`, {
      plain: false,
      raw: true,
    });
    expect(row).toEqual([{ n: 1 }]);
  });

  test('a disabled user cannot sign in and their open sessions end; enabling does not revive them', async () => {
    const admin = await makeActor(['admin']);
    const bea = await makeActor(['biologist'], 'bea@example.org', 'bea-password-1');
    const before = (await User.findByPk(bea.id))!.sessionVersion;
    const disabled = await disableUser(admin, { userId: bea.id, reason: 'left the team' });
    expect(disabled.disabledAt).not.toBeNull();
    expect(await loadActor(bea.id, '127.0.0.1')).toBeNull();
    await expect(signIn('bea@example.org', 'bea-password-1', '10.1.0.2')).resolves.toEqual({
      ok: false,
      reason: 'invalid',
    });
    await expect(disableUser(admin, { userId: bea.id, reason })).rejects.toMatchObject({ code: 'conflict' });

    await enableUser(admin, { userId: bea.id, reason: 'came back' });
    const again = await loadActor(bea.id, '127.0.0.1');
    expect(again?.sessionVersion).toBe(before + 1);
    const events = await AuditEvent.findAll({
      where: { entityId: bea.id },
      order: [['id', 'ASC']],
      raw: true,
    });
    expect(events.map((e) => [e.action, e.reason])).toEqual([
      ['disable', 'left the team'],
      ['enable', 'came back'],
    ]);
    expect(events[0]).toMatchObject({ before: { enabled: true }, after: { enabled: false } });
  });

  test('an admin cannot disable themselves', async () => {
    const admin = await makeActor(['admin']);
    await makeActor(['admin']);
    await expect(disableUser(admin, { userId: admin.id, reason })).rejects.toMatchObject({
      code: 'conflict',
    });
  });

  test('a password an admin set must be replaced by its owner before anything else; a reset asks again', async () => {
    const admin = await makeActor(['admin']);
    const created = await createUser(admin, {
      name: 'First Time',
      email: 'first@example.org',
      roles: ['biologist'],
      password: 'chosen-by-admin',
    });
    const fresh = (await loadActor(created.user.id, '127.0.0.1'))!;
    expect(fresh.passwordChangeRequired).toBe(true);
    expect(() => refuseUntilOwnPassword(fresh)).toThrow(/choose your own on the Account page/);

    await changeOwnPassword(fresh, {
      currentPassword: 'chosen-by-admin',
      newPassword: 'my-own-password-1',
      confirmPassword: 'my-own-password-1',
    });
    const own = (await loadActor(created.user.id, '127.0.0.1'))!;
    expect(own.passwordChangeRequired).toBe(false);
    expect(() => refuseUntilOwnPassword(own)).not.toThrow();

    await resetPassword(admin, { userId: created.user.id, reason });
    expect((await loadActor(created.user.id, '127.0.0.1'))!.passwordChangeRequired).toBe(true);
    // People whose accounts predate this rule, like the demo users, are not asked.
    expect((await loadActor(admin.id, '127.0.0.1'))!.passwordChangeRequired).toBe(false);
  });
});
