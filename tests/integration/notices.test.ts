import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { queueWaitingNotices } from '@/lib/compounds/import-notices';
import { db } from '@/lib/db';
import { deliverDueMail } from '@/lib/mail/deliver';
import {
  listNotices,
  markAllNoticesSeen,
  markNoticeSeen,
  noticeDeliveryOf,
  setNoticeDelivery,
  unseenNoticeCount,
} from '@/lib/notices/service';
import { signPlateStep } from '@/lib/signoff/service';
import { AuditEvent, MailMessage, Notice, Plate, SignoffEvent } from '@/models';
import { asSchemaOwner, resetDatabase } from '../support/database';
import { fakeSmtpSettings, keptMessages, waitForMessages } from '../support/fake-smtp';
import { PASSWORD, signoffCast, type SignoffCast } from '../support/signoff-scenario';

// Notices in Gatewell: written in the event's own transaction, kept whatever the person chose, mailed only
// to those who did not choose "in Gatewell only", marked seen by their own reader and nobody else.
// One plate goes through the steps in order, so the tests of this file run in order.

let cast: SignoffCast;
beforeAll(async () => {
  await resetDatabase();
  cast = await signoffCast();
});
afterAll(() => db().close());

const noticesOf = (who: { id: string }) =>
  Notice.findAll({ where: { recipientId: who.id }, order: [['createdAt', 'ASC']], raw: true });

describe('notices in Gatewell', () => {
  test('the import told the chemist in Gatewell, linking to the plate', async () => {
    const [notice] = await noticesOf(cast.chemist);
    expect(notice).toMatchObject({
      kind: 'plate_imported',
      plateId: cast.plateId,
      title: 'Plate NAV-P01 imported: compound map to verify',
      linkPath: `/plates/${cast.plateId}/history`,
      seenAt: null,
    });
    expect(await unseenNoticeCount(cast.chemist)).toBe(1);
  });

  test('a sign-off rolled back at commit leaves no notice and no mail; the same step committed leaves both', async () => {
    // A check the database runs at commit, after the step wrote its notices, refuses the step.
    await asSchemaOwner(async (client) => {
      await client.query(`
        create function gatewell_test_refuse_verify() returns trigger language plpgsql as $$
        begin
          if new.to_state = 'verified' then raise exception 'refused at commit by the test'; end if;
          return new;
        end $$;
        create constraint trigger gatewell_test_refuse_verify after insert on signoff_events
          deferrable initially deferred for each row execute function gatewell_test_refuse_verify();`);
    });
    try {
      await expect(
        signPlateStep(cast.chemist, cast.plateId, { action: 'verify', password: PASSWORD }),
      ).rejects.toThrow();
    } finally {
      await asSchemaOwner((client) =>
        client.query(`drop trigger gatewell_test_refuse_verify on signoff_events;
                      drop function gatewell_test_refuse_verify();`),
      );
    }
    expect(await Notice.count({ where: { kind: 'plate_verified' } })).toBe(0);
    expect(await MailMessage.count({ where: { kind: 'plate_verified' } })).toBe(0);
    expect(await SignoffEvent.count({ where: { plateId: cast.plateId } })).toBe(0);
    expect((await Plate.findByPk(cast.plateId))!.state).toBe('imported');

    // A refused signature (wrong password) writes no notice either.
    await expect(
      signPlateStep(cast.chemist, cast.plateId, { action: 'verify', password: 'not-the-password' }),
    ).rejects.toMatchObject({ code: 'invalid' });
    expect(await Notice.count({ where: { kind: 'plate_verified' } })).toBe(0);

    // Without the check the same step commits, with the biologist's notice and e-mail.
    expect(
      (await signPlateStep(cast.chemist, cast.plateId, { action: 'verify', password: PASSWORD })).notified,
    ).toBe(1);
    expect((await noticesOf(cast.biologist)).map((n) => n.kind)).toEqual(['plate_verified']);
    expect(
      await MailMessage.count({ where: { kind: 'plate_verified', recipientId: cast.biologist.id } }),
    ).toBe(1);
  });

  test('"in Gatewell only": the notice is kept, and no e-mail reaches the SMTP server', async () => {
    expect(await noticeDeliveryOf(cast.approver)).toBe('mail_and_app');
    expect(await setNoticeDelivery(cast.approver, 'app_only')).toBe(true);
    expect(await setNoticeDelivery(cast.approver, 'app_only')).toBe(false); // the same choice again
    expect(await noticeDeliveryOf(cast.approver)).toBe('app_only');
    const audits = await AuditEvent.findAll({ where: { entityType: 'user', entityId: cast.approver.id } });
    expect(audits.map((a) => [a.before, a.after])).toEqual([
      [{ noticeDelivery: 'mail_and_app' }, { noticeDelivery: 'app_only' }],
    ]);

    // Submitted for approval: both approvers are told; only approver2 (the default) by e-mail.
    expect(
      (await signPlateStep(cast.biologist, cast.plateId, { action: 'submit', password: PASSWORD })).notified,
    ).toBe(2);
    for (const approver of [cast.approver, cast.approver2])
      expect((await noticesOf(approver)).map((n) => [n.kind, n.linkPath])).toEqual([
        ['plate_submitted', `/plates/${cast.plateId}/history`],
      ]);
    expect(
      (await MailMessage.findAll({ where: { kind: 'plate_submitted' }, raw: true })).map((m) => m.toAddress),
    ).toEqual([cast.approver2.email]);

    const report = await deliverDueMail({ smtp: fakeSmtpSettings() });
    expect(report.failed).toBe(0);
    await waitForMessages((m) => m.envelope.to.includes(cast.approver2.email));
    expect(keptMessages().filter((m) => m.envelope.to.includes(cast.approver.email))).toEqual([]);
  });

  test('marking seen lowers the count; marking all clears it', async () => {
    expect(await unseenNoticeCount(cast.approver)).toBe(1);
    const [notice] = (await listNotices(cast.approver)).items;
    expect(notice).toMatchObject({ title: 'Plate NAV-P01 submitted for approval', seen: false });
    expect(await markNoticeSeen(cast.approver, notice!.id)).toEqual({
      linkPath: `/plates/${cast.plateId}/history`,
    });
    expect(await unseenNoticeCount(cast.approver)).toBe(0);
    expect((await listNotices(cast.approver)).items[0]).toMatchObject({ seen: true });
    await markNoticeSeen(cast.approver, notice!.id); // again: no change, no error
    expect(await unseenNoticeCount(cast.approver)).toBe(0);

    expect(await unseenNoticeCount(cast.approver2)).toBe(1);
    // Up to a moment before the notice came: it stays new.
    const [notice2] = await noticesOf(cast.approver2);
    expect(await markAllNoticesSeen(cast.approver2, new Date(notice2!.createdAt.getTime() - 1))).toBe(0);
    expect(await unseenNoticeCount(cast.approver2)).toBe(1);
    expect(await markAllNoticesSeen(cast.approver2, new Date())).toBe(1);
    expect(await unseenNoticeCount(cast.approver2)).toBe(0);
    expect(await markAllNoticesSeen(cast.approver2, new Date())).toBe(0);
  });

  test("a person sees only their own notices; marking another's is refused with nothing written", async () => {
    const own = (await noticesOf(cast.approver)).map((n) => n.id).sort();
    const listed = (await listNotices(cast.approver)).items.map((n) => n.id).sort();
    expect(listed).toEqual(own);
    expect((await listNotices(cast.approver)).total).toBe(1);

    const [chemists] = await noticesOf(cast.chemist);
    await expect(markNoticeSeen(cast.approver, chemists!.id)).rejects.toMatchObject({ code: 'not_found' });
    await expect(markNoticeSeen(cast.approver, randomUUID())).rejects.toMatchObject({ code: 'not_found' });
    // Marking all of one's own leaves everyone else's new.
    await markAllNoticesSeen(cast.approver, new Date());
    expect((await Notice.findByPk(chemists!.id, { raw: true }))!.seenAt).toBeNull();
    expect(await unseenNoticeCount(cast.chemist)).toBe(1);
    expect(await unseenNoticeCount(cast.biologist)).toBe(1);
  });

  test('an import waiting for compounds tells each registrar in Gatewell, linking to that waiting import', async () => {
    const draftId = randomUUID();
    await db().transaction((transaction) =>
      queueWaitingNotices(
        cast.biologist,
        { id: draftId, filename: 'plate.csv', screenName: 'Nav screen', waitingFor: ['GW-0901', 'GW-0902'] },
        transaction,
      ),
    );
    const notices = await Notice.findAll({ where: { kind: 'import_waiting_for_compounds' }, raw: true });
    // Who may register compounds: chemists and admins (DESIGN.md roles; lib/domain/roles.ts).
    expect(notices.map((n) => n.recipientId).sort()).toEqual([cast.admin.id, cast.chemist.id].sort());
    for (const notice of notices) {
      expect(notice.linkPath).toBe(`/compounds#waiting-import-${draftId}`);
      expect(notice.title).toBe('An import waits for 2 compounds to be registered');
      expect(notice.bodyText).toContain('GW-0901, GW-0902');
    }
  });
});
