import 'server-only';
import { Op } from 'sequelize';
import { recordAudit } from '@/lib/audit/record';
import type { Actor } from '@/lib/auth/roles';
import { db } from '@/lib/db';
import {
  DEFAULT_NOTICE_DELIVERY,
  NOTICES_PER_PAGE,
  type NoticeDelivery,
  type NoticeItem,
} from '@/lib/domain/notices';
import { env } from '@/lib/env';
import { AppError } from '@/lib/errors';
import { Notice, NoticeDeliveryChoice } from '@/models';

/**
 * A person's notices in Gatewell: the bell's count, the Notices page, marking them seen, and the choice
 * of how they are told. Each person reads and marks only their own: another's notice is refused as not
 * found, with nothing written.
 */

export interface NoticePage {
  items: NoticeItem[];
  total: number;
  unseen: number;
  page: number;
  pages: number;
  /** The zone the page shows times in (GATEWELL_TIME_ZONE). */
  timeZone: string;
  /** When the newest notice came (what "mark all seen" marks up to); null with none. */
  newestAt: string | null;
}

/** How many of the actor's notices are still new (the bell in the header). */
export async function unseenNoticeCount(actor: Actor): Promise<number> {
  db();
  return Notice.count({ where: { recipientId: actor.id, seenAt: { [Op.is]: null } } });
}

/** One page of the actor's notices, newest first; a page past the last shows the last. */
export async function listNotices(actor: Actor, page = 1): Promise<NoticePage> {
  db();
  const [total, unseen, newest] = await Promise.all([
    Notice.count({ where: { recipientId: actor.id } }),
    unseenNoticeCount(actor),
    Notice.max<Date | null, Notice>('createdAt', { where: { recipientId: actor.id } }),
  ]);
  const pages = Math.max(1, Math.ceil(total / NOTICES_PER_PAGE));
  const current = Math.min(Math.max(1, Math.trunc(page)), pages);
  const rows = await Notice.findAll({
    where: { recipientId: actor.id },
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: NOTICES_PER_PAGE,
    offset: (current - 1) * NOTICES_PER_PAGE,
    raw: true,
  });
  return {
    items: rows.map((n) => ({
      id: n.id,
      kind: n.kind,
      title: n.title,
      summary: n.bodyText,
      linkPath: n.linkPath,
      createdAt: new Date(n.createdAt).toISOString(),
      seen: n.seenAt !== null,
    })),
    total,
    unseen,
    page: current,
    pages,
    timeZone: env().GATEWELL_TIME_ZONE,
    newestAt: newest ? new Date(newest).toISOString() : null,
  };
}

const notYours = () => new AppError('not_found', 'There is no such notice of yours.');

/** Marks one of the actor's notices seen (again is no change); answers where it leads. */
export async function markNoticeSeen(actor: Actor, noticeId: string): Promise<{ linkPath: string }> {
  return db().transaction(async (transaction) => {
    const notice = await Notice.findOne({
      where: { id: noticeId, recipientId: actor.id },
      lock: transaction.LOCK.UPDATE,
      transaction,
    });
    if (!notice) throw notYours();
    if (notice.seenAt === null) await notice.update({ seenAt: new Date() }, { transaction });
    return { linkPath: notice.linkPath };
  });
}

/**
 * Marks the actor's new notices seen, those that came up to `upTo` (the newest the person's page showed:
 * one that came after it stays new); answers how many were new.
 */
export async function markAllNoticesSeen(actor: Actor, upTo: Date): Promise<number> {
  // Times are kept to the microsecond, the page's to the millisecond: the whole millisecond counts.
  const before = new Date(upTo.getTime() + 1);
  const [count] = await db().transaction((transaction) =>
    Notice.update(
      { seenAt: new Date() },
      {
        where: { recipientId: actor.id, seenAt: { [Op.is]: null }, createdAt: { [Op.lt]: before } },
        transaction,
      },
    ),
  );
  return count;
}

/** How the actor has chosen to be told (the default when they never chose). */
export async function noticeDeliveryOf(actor: Actor): Promise<NoticeDelivery> {
  db();
  const row = await NoticeDeliveryChoice.findByPk(actor.id, { raw: true });
  return row?.delivery ?? DEFAULT_NOTICE_DELIVERY;
}

/** Sets how the actor is told, with its audit event; the same choice again changes nothing. */
export async function setNoticeDelivery(actor: Actor, delivery: NoticeDelivery): Promise<boolean> {
  return db().transaction(async (transaction) => {
    const row = await NoticeDeliveryChoice.findByPk(actor.id, { lock: transaction.LOCK.UPDATE, transaction });
    const before = row?.delivery ?? DEFAULT_NOTICE_DELIVERY;
    if (before === delivery) return false;
    await NoticeDeliveryChoice.upsert({ userId: actor.id, delivery, updatedAt: new Date() }, { transaction });
    await recordAudit(
      {
        actorId: actor.id,
        action: 'update',
        entityType: 'user',
        entityId: actor.id,
        before: { noticeDelivery: before },
        after: { noticeDelivery: delivery },
        address: actor.address,
      },
      transaction,
    );
    return true;
  });
}
