import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import {
  INVITATION_LIFETIME_MS,
  LINK_LIFETIME_MS,
  MAX_LINKS_PER_EMAIL,
  MAX_REQUESTS_PER_ADDRESS,
  passwordLinkState,
  requestPasswordLink,
  setPasswordByLink,
} from '@/lib/auth/password-link';
import type { Actor } from '@/lib/auth/roles';
import { signIn } from '@/lib/auth/sign-in';
import { db } from '@/lib/db';
import { deliverDueMail } from '@/lib/mail/deliver';
import { requeueMail } from '@/lib/mail/admin';
import { createUser } from '@/lib/users/create';
import { resetPassword } from '@/lib/users/reset-password';
import { disableUser } from '@/lib/users/status';
import { AuditEvent, MailMessage, User } from '@/models';
import { LINK_MAIL_KINDS } from '@/lib/domain/mail';
import { makeActor } from '../support/actors';
import { resetDatabase } from '../support/database';
import { fakeSmtpSettings, waitForMessages } from '../support/fake-smtp';

const NEW_PASSWORD = 'a new phrase of words';
// Each test asks from an address of its own, so the per-address limit of one test does not reach the next.
let address: string;
let person: Actor;

/** The token of the newest link mail queued for an address (the outbox's copy, before it is sent). */
async function tokenMailedTo(email: string): Promise<string> {
  const mail = await MailMessage.findOne({
    where: { toAddress: email, kind: [...LINK_MAIL_KINDS] },
    order: [['createdAt', 'DESC']],
  });
  const match = /\/password-link\/([A-Za-z0-9_-]{43})\b/.exec(mail?.bodyText ?? '');
  if (!match) throw new Error(`no password link mailed to ${email}`);
  return match[1]!;
}

const linkMails = (email: string) =>
  MailMessage.count({ where: { toAddress: email, kind: 'password_link' } });

describe('a password link by e-mail', () => {
  beforeEach(async () => {
    await resetDatabase();
    person = await makeActor(['biologist']);
    address = `10.9.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250)}`;
  });
  afterAll(() => db().close());

  test('is mailed for an active account, works once within its time, sets the password and ends every session', async () => {
    const before = (await User.findByPk(person.id))!;
    expect(await requestPasswordLink({ email: `  ${person.email.toUpperCase()} ` }, address)).toEqual({
      ok: true,
    });
    const token = await tokenMailedTo(person.email);
    expect(await passwordLinkState(token)).toEqual({ usable: true, email: person.email });

    // Only the token's SHA-256 is stored.
    const [stored] = await db().query(
      `select encode(token_sha256, 'hex') as hash, expires_at - requested_at as lifetime from password_links where user_id = :id`,
      { replacements: { id: person.id } },
    );
    expect(JSON.stringify(stored)).not.toContain(token);

    await setPasswordByLink({ token, newPassword: NEW_PASSWORD, confirmPassword: NEW_PASSWORD }, address);
    const after = (await User.findByPk(person.id))!;
    expect(after.sessionVersion).toBe(before.sessionVersion + 1);
    expect(after.passwordChangeRequired).toBe(false);
    expect(await signIn(person.email, NEW_PASSWORD, address)).toMatchObject({ ok: true });
    expect(await signIn(person.email, 'test-password-123', address)).toMatchObject({ ok: false });

    // Spent: the page says so and a second use changes nothing.
    expect(await passwordLinkState(token)).toEqual({
      usable: false,
      why: expect.stringContaining('used already'),
    });
    await expect(
      setPasswordByLink(
        { token, newPassword: 'yet another phrase', confirmPassword: 'yet another phrase' },
        address,
      ),
    ).rejects.toThrow('used already');
    expect(await signIn(person.email, NEW_PASSWORD, address)).toMatchObject({ ok: true });

    const actions = (
      await AuditEvent.findAll({ where: { entityId: person.id }, order: [['id', 'ASC']] })
    ).map((e) => e.action);
    expect(actions).toEqual(expect.arrayContaining(['password_link_requested', 'set_password_by_link']));
  });

  test('an unknown or disabled address gets the same answer, no mail and no token; the request is kept and audited', async () => {
    const admin = await makeActor(['admin']);
    await disableUser(admin, { userId: person.id, reason: 'left the team' });
    expect(await requestPasswordLink({ email: 'nobody-here@example.org' }, address)).toEqual({ ok: true });
    expect(await requestPasswordLink({ email: person.email }, address)).toEqual({ ok: true });
    expect(await MailMessage.count({ where: { kind: 'password_link' } })).toBe(0);
    const [rows] = await db().query(
      `select email, user_id, token_sha256 from password_links order by requested_at`,
    );
    expect(rows).toEqual([
      { email: 'nobody-here@example.org', user_id: null, token_sha256: null },
      { email: person.email, user_id: null, token_sha256: null },
    ]);
    const why = (
      await AuditEvent.findAll({ where: { action: 'password_link_requested' }, order: [['id', 'ASC']] })
    ).map((e) => (e.after as { why: string }).why);
    expect(why).toEqual(['no such account', 'account disabled']);
  });

  test('a newer link replaces the one before; a password set another way voids an open link', async () => {
    await requestPasswordLink({ email: person.email }, address);
    const first = await tokenMailedTo(person.email);
    await requestPasswordLink({ email: person.email }, address);
    const second = await tokenMailedTo(person.email);
    expect(second).not.toBe(first);
    expect(await passwordLinkState(first)).toEqual({
      usable: false,
      why: expect.stringContaining('run out'),
    });
    expect(await passwordLinkState(second)).toMatchObject({ usable: true });

    const admin = await makeActor(['admin']);
    await resetPassword(admin, {
      userId: person.id,
      password: 'an admin set this one',
      reason: 'asked by phone',
    });
    expect(await passwordLinkState(second)).toEqual({
      usable: false,
      why: expect.stringContaining('has changed since'),
    });
    await expect(
      setPasswordByLink({ token: second, newPassword: NEW_PASSWORD, confirmPassword: NEW_PASSWORD }, address),
    ).rejects.toThrow('has changed since');
  });

  test(`a link runs out after ${LINK_LIFETIME_MS / 60_000} minutes`, async () => {
    await requestPasswordLink({ email: person.email }, address);
    const token = await tokenMailedTo(person.email);
    await db().query(
      `update password_links set requested_at = requested_at - interval '31 minutes', expires_at = expires_at - interval '31 minutes' where user_id = :id`,
      { replacements: { id: person.id } },
    );
    expect(await passwordLinkState(token)).toEqual({
      usable: false,
      why: expect.stringContaining('run out'),
    });
    await expect(
      setPasswordByLink({ token, newPassword: NEW_PASSWORD, confirmPassword: NEW_PASSWORD }, address),
    ).rejects.toThrow('run out');
  });

  test('bad input is refused by field and changes nothing; a made-up token is no link', async () => {
    await requestPasswordLink({ email: person.email }, address);
    const token = await tokenMailedTo(person.email);
    await expect(
      setPasswordByLink({ token, newPassword: 'short', confirmPassword: 'short' }, address),
    ).rejects.toMatchObject({
      details: { fieldErrors: { newPassword: [expect.stringContaining('at least 10')] } },
    });
    await expect(
      setPasswordByLink(
        { token, newPassword: NEW_PASSWORD, confirmPassword: 'different words here' },
        address,
      ),
    ).rejects.toMatchObject({
      details: { fieldErrors: { confirmPassword: ['The two new passwords differ.'] } },
    });
    await expect(requestPasswordLink({ email: 'not an address' }, address)).rejects.toMatchObject({
      details: { fieldErrors: { email: ['Enter a valid e-mail address.'] } },
    });
    expect(await passwordLinkState(token)).toMatchObject({ usable: true });
    expect(await passwordLinkState('A'.repeat(43))).toEqual({
      usable: false,
      why: expect.stringContaining('not one Gatewell sent'),
    });
    expect(await passwordLinkState('../../etc')).toEqual({
      usable: false,
      why: expect.stringContaining('not one Gatewell sent'),
    });
  });

  test(`at most ${MAX_LINKS_PER_EMAIL} links to one address in the window, silently; past ${MAX_REQUESTS_PER_ADDRESS} requests from one client address, it is told to wait`, async () => {
    for (let i = 0; i < MAX_LINKS_PER_EMAIL + 2; i++)
      expect(await requestPasswordLink({ email: person.email }, address)).toEqual({ ok: true });
    expect(await linkMails(person.email)).toBe(MAX_LINKS_PER_EMAIL);
    for (let i = MAX_LINKS_PER_EMAIL + 2; i < MAX_REQUESTS_PER_ADDRESS; i++)
      await requestPasswordLink({ email: `someone-${i}@example.org` }, address);
    expect(await requestPasswordLink({ email: 'one-more@example.org' }, address)).toEqual({
      ok: false,
      reason: 'throttled',
    });
    expect(await AuditEvent.count({ where: { action: 'password_link_throttled' } })).toBe(1);
    // Another client address is not held up.
    expect(await requestPasswordLink({ email: 'one-more@example.org' }, '10.250.0.1')).toEqual({ ok: true });
  });

  test("an admin creates an account by invitation: a link for 3 days, no one-time password, and the owner's own password from the first sign-in", async () => {
    const admin = await makeActor(['admin']);
    const email = 'invited-person@example.org';
    const created = await createUser(admin, {
      name: 'Ines Invited',
      email,
      roles: ['chemist'],
      access: 'link',
    });
    expect(created).toMatchObject({ initialPassword: null, invited: true });
    const mail = (await MailMessage.findOne({ where: { toAddress: email } }))!;
    expect(mail.kind).toBe('account_invitation');
    expect(mail.subject).toBe('Gatewell: your account, and a link to choose your password');
    expect(mail.bodyText).toContain(`${admin.name} made a Gatewell account for you: ${email}, as chemist.`);
    expect(mail.bodyText).toContain('within 3 days');
    const [[link]] = await db().query(
      `select extract(epoch from expires_at - requested_at) * 1000 as lifetime from password_links where email = :email`,
      { replacements: { email } },
    );
    expect(Number((link as { lifetime: string }).lifetime)).toBe(INVITATION_LIFETIME_MS);
    const createEvent = (await AuditEvent.findOne({
      where: { action: 'create', entityId: created.user.id },
    }))!;
    expect(createEvent.after).toMatchObject({ initialPassword: 'link by e-mail' });

    const token = await tokenMailedTo(email);
    expect(await passwordLinkState(token)).toEqual({ usable: true, email });
    await setPasswordByLink({ token, newPassword: NEW_PASSWORD, confirmPassword: NEW_PASSWORD }, address);
    expect(await signIn(email, NEW_PASSWORD, address)).toMatchObject({
      ok: true,
      passwordChangeRequired: false,
    });

    // A password and a link at once is refused on the field.
    await expect(
      createUser(admin, {
        name: 'Both Ways',
        email: 'both@example.org',
        roles: [],
        access: 'link',
        password: 'a password too long enough',
      }),
    ).rejects.toMatchObject({
      details: { fieldErrors: { password: [expect.stringContaining('Leave the password empty')] } },
    });
    expect(await User.count({ where: { email: 'both@example.org' } })).toBe(0);
  });

  test('the mail goes out through SMTP with the link; the outbox keeps the message without it, and does not send it again', async () => {
    await requestPasswordLink({ email: person.email }, address);
    const token = await tokenMailedTo(person.email);
    expect(await deliverDueMail({ smtp: fakeSmtpSettings() })).toMatchObject({ sent: 1 });
    const [kept] = await waitForMessages(
      (m) => m.envelope.to.includes(person.email) && m.text.includes(token),
    );
    expect(kept!.subject).toBe('Gatewell: choose a new password');
    expect(kept!.text).toContain(`/password-link/${token}`);
    const copy = (await MailMessage.findOne({ where: { toAddress: person.email, kind: 'password_link' } }))!;
    expect(copy.state).toBe('sent');
    expect(copy.bodyText).not.toContain(token);
    expect(copy.bodyText).toContain('/password-link/(removed once sent)');

    await copy.update({ state: 'failed', sentAt: null });
    await expect(requeueMail(await makeActor(['admin']), copy.id)).rejects.toThrow('asks for a new one');
  });
});
