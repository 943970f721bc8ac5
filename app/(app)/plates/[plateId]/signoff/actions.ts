'use server';

import { revalidatePath } from 'next/cache';
import { after } from 'next/server';
import { z } from 'zod';
import { validatedAction } from '@/lib/actions/validated-action';
import { sendDueMailNow } from '@/lib/mail/sender-loop';
import { signPlateStep } from '@/lib/signoff/service';
import { STATE_WORDS } from '@/lib/signoff/refusals';
import { parseId } from '@/lib/validation/ids';
import { signoffRequestSchema } from '@/lib/validation/signoff';

/** Signs one sign-off step of a plate; the notifications it queued go out right after the answer. */
export const signPlateStepAction = validatedAction(signoffRequestSchema.and(z.object({ plateId: z.string() })), [], async (input, actor) => {
  const { plateId, ...request } = input;
  const result = await signPlateStep(actor, parseId(plateId, 'plate'), request);
  after(() => sendDueMailNow());
  revalidatePath(`/plates/${result.plateId}`, 'layout');
  revalidatePath('/');
  const notified = result.notified === 1 ? '1 person notified' : `${result.notified} people notified`;
  return { ok: true, message: `Signed. Plate ${result.label} is now ${STATE_WORDS[result.state]}; ${notified} by e-mail.` };
});
