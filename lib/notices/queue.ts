import 'server-only';
import type { Transaction } from 'sequelize';
import { DEFAULT_NOTICE_DELIVERY, type NoticeKind } from '@/lib/domain/notices';
import { queueMail, type OutgoingMail } from '@/lib/mail/outbox';
import { Notice, NoticeDeliveryChoice } from '@/models';

/** A message about a plate or a waiting import: kept in Gatewell for its recipient and, by choice, mailed. */
export interface NoticeToQueue extends OutgoingMail {
  kind: NoticeKind;
  notice: {
    /** One line: what happened to what. */
    title: string;
    /** A few sentences: who did it, what it waits for, the comment. */
    summary: string;
    /** Where the notice leads inside Gatewell: its plate, compound or waiting import. */
    linkPath: string;
  };
}

/**
 * Writes the notices in the caller's transaction (they exist exactly when the event commits) and queues
 * the e-mail of each recipient who has not chosen "in Gatewell only"; answers how many people were told.
 */
export async function queueNotices(notices: NoticeToQueue[], transaction: Transaction): Promise<number> {
  if (!notices.length) return 0;
  const recipients = [...new Set(notices.map((n) => n.recipientId))];
  const choices = await NoticeDeliveryChoice.findAll({
    attributes: ['userId', 'delivery'],
    where: { userId: recipients },
    raw: true,
    transaction,
  });
  const delivery = new Map(choices.map((c) => [c.userId, c.delivery]));
  await Notice.bulkCreate(
    notices.map((n) => ({
      recipientId: n.recipientId,
      kind: n.kind,
      title: n.notice.title,
      bodyText: n.notice.summary,
      linkPath: n.notice.linkPath,
      plateId: n.plateId,
      signoffEventId: n.signoffEventId,
    })),
    { transaction },
  );
  await queueMail(
    notices
      .filter((n) => (delivery.get(n.recipientId) ?? DEFAULT_NOTICE_DELIVERY) === 'mail_and_app')
      .map(({ notice: _notice, ...mail }) => mail),
    transaction,
  );
  return notices.length;
}
