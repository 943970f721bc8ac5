'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { validatedAction } from '@/lib/actions/validated-action';
import { rolesFor } from '@/lib/domain/roles';
import { hurryWaitingMail, requeueMail } from '@/lib/mail/admin';
import { sendDueMailNow } from '@/lib/mail/sender-loop';
import { parseId } from '@/lib/validation/ids';

/** Puts a failed message back in the queue and tries it at once. */
export const requeueMailAction = validatedAction(
  z.object({ messageId: z.string() }),
  rolesFor('manageMail'),
  async (input, actor) => {
    await requeueMail(actor, parseId(input.messageId, 'message'));
    await sendDueMailNow();
    revalidatePath('/admin/outbox');
    return { ok: true, message: 'Queued again and tried.' };
  },
);

/** Brings every waiting message forward and runs a delivery pass now, instead of waiting for retries. */
export const sendWaitingMailAction = validatedAction(
  z.object({}),
  rolesFor('manageMail'),
  async (_input, actor) => {
    const hurried = await hurryWaitingMail(actor);
    await sendDueMailNow();
    revalidatePath('/admin/outbox');
    const waited =
      hurried === 1 ? 'one message waiting for a retry' : `${hurried} messages waiting for a retry`;
    return {
      ok: true,
      message: hurried ? `Delivery pass finished; it tried ${waited} at once.` : 'Delivery pass finished.',
    };
  },
);
