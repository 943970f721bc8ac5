import { z } from 'zod';
import { NOTICE_DELIVERIES } from '@/lib/domain/notices';

/** One notice named by a form (mark seen, open). */
export const noticeIdSchema = z.object({
  noticeId: z.uuid('No such notice.'),
});

/** Mark every new notice seen, up to the newest the page showed (an ISO time). */
export const markAllNoticesSchema = z.object({
  upTo: z.iso.datetime({ offset: true, error: 'Open the Notices page again.' }).transform((v) => new Date(v)),
});

/** The choice on the Account page of how notices reach the person. */
export const noticeDeliverySchema = z.object({
  delivery: z.enum(NOTICE_DELIVERIES, 'Choose how you are told.'),
});

/** The page of the Notices page, from 1; anything unreadable is the first page. */
export const noticePageSchema = z
  .preprocess(
    (value) => (Array.isArray(value) ? value[0] : value),
    z.coerce.number().int().min(1).max(1_000_000),
  )
  .catch(1);
