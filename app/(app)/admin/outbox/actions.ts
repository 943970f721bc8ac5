'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { validatedAction } from '@/lib/actions/validated-action';
import { requeueMail } from '@/lib/mail/admin';
import { sendDueMailNow } from '@/lib/mail/sender-loop';
import { parseId } from '@/lib/validation/ids';

/** Puts a failed message back in the queue and tries it at once. */
export const requeueMailAction = validatedAction(z.object({ messageId: z.string() }), ['admin'], async (input, actor) => {
  await requeueMail(actor, parseId(input.messageId, 'message'));
  await sendDueMailNow();
  revalidatePath('/admin/outbox');
  return { ok: true, message: 'Queued again and tried.' };
});

/** Runs a delivery pass now instead of waiting for the sender's next round. */
export const sendDueMailAction = validatedAction(z.object({}), ['admin'], async () => {
  await sendDueMailNow();
  revalidatePath('/admin/outbox');
  return { ok: true, message: 'Delivery pass finished.' };
});
