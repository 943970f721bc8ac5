'use server';

import { revalidatePath } from 'next/cache';
import { redirect } from 'next/navigation';
import { validatedAction } from '@/lib/actions/validated-action';
import { markAllNoticesSeen, markNoticeSeen } from '@/lib/notices/service';
import { markAllNoticesSchema, noticeIdSchema } from '@/lib/validation/notices';

/** Opens one of the person's notices: marks it seen and goes where it leads (its plate or import). */
export const openNoticeAction = validatedAction(noticeIdSchema, [], async ({ noticeId }, actor) => {
  const { linkPath } = await markNoticeSeen(actor, noticeId);
  // The bell's count is in the signed-in layout: render it again with the answer.
  revalidatePath('/', 'layout');
  redirect(linkPath);
});

/** Marks one of the person's notices seen, staying on the list. */
export const markNoticeSeenAction = validatedAction(noticeIdSchema, [], async ({ noticeId }, actor) => {
  await markNoticeSeen(actor, noticeId);
  revalidatePath('/', 'layout');
  return { ok: true, message: 'Marked seen.' };
});

/** Marks every new notice of the person seen, up to the newest their page showed. */
export const markAllNoticesSeenAction = validatedAction(markAllNoticesSchema, [], async ({ upTo }, actor) => {
  const count = await markAllNoticesSeen(actor, upTo);
  revalidatePath('/', 'layout');
  return { ok: true, message: count ? `${count} marked seen.` : 'Nothing was new.' };
});
