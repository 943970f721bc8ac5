import { createServer } from 'node:net';
import { afterAll, beforeEach, describe, expect, test } from 'vitest';
import { db } from '@/lib/db';
import { hurryWaitingMail, requeueMail } from '@/lib/mail/admin';
import { deliverDueMail, retryDelayMs } from '@/lib/mail/deliver';
import { signPlateStep } from '@/lib/signoff/service';
import { AuditEvent, MailMessage, Plate } from '@/models';
import { resetDatabase } from '../support/database';
import { fakeSmtpSettings, waitForMessages } from '../support/fake-smtp';
import { PASSWORD, signoffCast, type SignoffCast } from '../support/signoff-scenario';

/** A local port with nothing listening on it: an SMTP server that is down. */
async function closedPort(): Promise<number> {
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const { port } = server.address() as { port: number };
  await new Promise((resolve) => server.close(resolve));
  return port;
}

describe('notifications: queued with the transition, delivered over SMTP to the fake server', () => {
  let cast: SignoffCast;
  beforeEach(async () => {
    await resetDatabase();
    cast = await signoffCast();
  });
  afterAll(() => db().close());

  const queued = (kind: string) =>
    MailMessage.findAll({ where: { plateId: cast.plateId, kind }, order: [['toAddress', 'ASC']] });
  const sign = (who: keyof SignoffCast, action: 'verify' | 'submit' | 'approve' | 'reject', comment = '') =>
    signPlateStep(cast[who] as SignoffCast['chemist'], cast.plateId, { action, password: PASSWORD, comment });

  test('each step queues mail for the next role, with a link to the plate, in the same transaction', async () => {
    expect((await queued('plate_imported')).map((m) => m.toAddress)).toEqual([cast.chemist.email]);
    expect((await sign('chemist', 'verify')).notified).toBe(1);
    const [verified] = await queued('plate_verified');
    expect(verified).toMatchObject({
      toAddress: cast.biologist.email,
      state: 'queued',
      attempts: 0,
      subject: 'Gatewell: plate NAV-P01 compound map verified: ready to review and submit',
    });
    expect(verified!.bodyText).toContain(
      `Open the plate: ${process.env.APP_URL ?? 'http://127.0.0.1:4310'}/plates/${cast.plateId}/history`,
    );
    await sign('biologist', 'submit');
    expect((await queued('plate_submitted')).map((m) => m.toAddress).sort()).toEqual(
      [cast.approver.email, cast.approver2.email].sort(),
    );
    await sign('approver', 'reject', 'Re-check well B03.');
    const [rejected] = await queued('plate_rejected');
    expect(rejected).toMatchObject({ toAddress: cast.biologist.email });
    expect(rejected!.bodyText).toContain('Comment: Re-check well B03.');
  });

  test('a refused signature queues nothing', async () => {
    await expect(sign('chemist', 'reject', 'not a chemist step')).rejects.toMatchObject({
      code: 'forbidden',
    });
    await expect(
      signPlateStep(cast.chemist, cast.plateId, { action: 'verify', password: 'wrong-password' }),
    ).rejects.toMatchObject({ code: 'invalid' });
    expect(await MailMessage.count({ where: { kind: 'plate_verified' } })).toBe(0);
  });

  test('the sender delivers through SMTP into the fake server and records the answer', async () => {
    await sign('chemist', 'verify');
    const report = await deliverDueMail({ smtp: fakeSmtpSettings() });
    expect(report).toEqual({ attempted: 2, sent: 2, retrying: 0, failed: 0 });
    const [kept] = await waitForMessages(
      (m) => m.envelope.to.includes(cast.biologist.email) && m.text.includes(cast.plateId),
    );
    expect(kept!.subject).toBe('Gatewell: plate NAV-P01 compound map verified: ready to review and submit');
    expect(kept!.text).toContain(`/plates/${cast.plateId}/history`);
    const [row] = await queued('plate_verified');
    expect(row).toMatchObject({
      state: 'sent',
      attempts: 1,
      lastError: null,
      smtpResponse: expect.stringMatching(/^250 Kept as /),
    });
    expect(kept!.headers['x-gatewell-outbox-id']).toBe(row!.id);
  });

  test('with the SMTP server down the transition stands, the mail waits with its error and goes out on a later attempt', async () => {
    const down = { ...fakeSmtpSettings(), port: await closedPort() };
    await sign('chemist', 'verify');
    const start = new Date();
    expect(await deliverDueMail({ smtp: down, now: start })).toMatchObject({
      attempted: 2,
      sent: 0,
      retrying: 2,
    });
    expect((await Plate.findByPk(cast.plateId))!.state).toBe('verified');
    const [waiting] = await queued('plate_verified');
    expect(waiting).toMatchObject({
      state: 'queued',
      attempts: 1,
      lastError: expect.stringMatching(/ECONNREFUSED|connect/i),
    });
    expect(waiting!.nextAttemptAt.getTime()).toBe(start.getTime() + retryDelayMs(1));
    expect((await deliverDueMail({ smtp: fakeSmtpSettings(), now: start })).attempted).toBe(0); // not before the backoff
    const later = new Date(start.getTime() + retryDelayMs(1) + 1000);
    expect(await deliverDueMail({ smtp: fakeSmtpSettings(), now: later })).toMatchObject({
      attempted: 2,
      sent: 2,
    });
    await waitForMessages(
      (m) => m.envelope.to.includes(cast.biologist.email) && m.text.includes(cast.plateId),
    );
    expect((await queued('plate_verified'))[0]).toMatchObject({
      state: 'sent',
      attempts: 2,
      lastError: null,
    });
  });

  test('after its last attempt a message is marked failed; an admin puts it back in the queue', async () => {
    const down = { ...fakeSmtpSettings(), port: await closedPort() };
    await MailMessage.update({ maxAttempts: 2 }, { where: {} });
    let now = new Date();
    for (let attempt = 1; attempt <= 2; attempt++) {
      await deliverDueMail({ smtp: down, now });
      now = new Date(now.getTime() + retryDelayMs(attempt) + 1000);
    }
    const [gaveUp] = await queued('plate_imported');
    expect(gaveUp).toMatchObject({ state: 'failed', attempts: 2 });
    await expect(requeueMail(cast.chemist, gaveUp!.id)).rejects.toMatchObject({ code: 'forbidden' });
    await requeueMail(cast.admin, gaveUp!.id);
    expect(await deliverDueMail({ smtp: fakeSmtpSettings() })).toMatchObject({ sent: 1 });
    await expect(requeueMail(cast.admin, gaveUp!.id)).rejects.toMatchObject({
      code: 'conflict',
      message: 'This message is sent; only a failed message can be sent again.',
    });
  });

  test('an admin brings the messages waiting for a retry forward, leaving one a sender holds to it', async () => {
    const down = { ...fakeSmtpSettings(), port: await closedPort() };
    await sign('chemist', 'verify');
    expect(await deliverDueMail({ smtp: down })).toMatchObject({ attempted: 2, retrying: 2 });
    const [imported] = await queued('plate_imported');
    const [verified] = await queued('plate_verified');
    // A sender is sending the import notice right now (its claim, as claimDue writes it).
    await db().query(
      "update mail_outbox set claimed_until = now() + interval '5 minutes', next_attempt_at = now() + interval '5 minutes' where id = :id",
      { replacements: { id: imported!.id } },
    );

    await expect(hurryWaitingMail(cast.chemist)).rejects.toMatchObject({ code: 'forbidden' });
    expect(await hurryWaitingMail(cast.admin)).toBe(1);
    expect(await deliverDueMail({ smtp: fakeSmtpSettings() })).toMatchObject({ attempted: 1, sent: 1 });
    expect(await MailMessage.findByPk(verified!.id)).toMatchObject({
      state: 'sent',
      attempts: 2,
      claimedUntil: null,
    });
    expect(await MailMessage.findByPk(imported!.id)).toMatchObject({ state: 'queued', attempts: 1 });
    const audits = await AuditEvent.findAll({ where: { action: 'hurry_mail' } });
    expect(audits.map((a) => [a.actorId, a.after])).toEqual([[cast.admin.id, { messages: [verified!.id] }]]);
    // Nothing else waits that no sender holds: nothing is brought forward, and nothing more is audited.
    expect(await hurryWaitingMail(cast.admin)).toBe(0);
    expect(await AuditEvent.count({ where: { action: 'hurry_mail' } })).toBe(1);
  });

  test('two senders at once deliver each message exactly once', async () => {
    await sign('chemist', 'verify');
    await sign('biologist', 'submit');
    const reports = await Promise.all([
      deliverDueMail({ smtp: fakeSmtpSettings() }),
      deliverDueMail({ smtp: fakeSmtpSettings() }),
    ]);
    const total = await MailMessage.count({ where: { plateId: cast.plateId } });
    expect(reports.reduce((sum, r) => sum + r.sent, 0)).toBe(total);
    const ids = (await MailMessage.findAll({ where: { plateId: cast.plateId } })).map((m) => m.id);
    const kept = await waitForMessages((m) => ids.includes(m.headers['x-gatewell-outbox-id'] ?? ''), total);
    expect(new Set(kept.map((m) => m.headers['x-gatewell-outbox-id'])).size).toBe(kept.length);
  });
});
