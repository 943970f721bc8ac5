'use server';

import { revalidatePath } from 'next/cache';
import { after } from 'next/server';
import { z } from 'zod';
import { validatedAction } from '@/lib/actions/validated-action';
import { PLATE_STATE_PHRASE } from '@/lib/domain/plate-states';
import { sendDueMailNow } from '@/lib/mail/sender-loop';
import { signPlateStep } from '@/lib/signoff/service';
import { parseId } from '@/lib/validation/ids';
import { signoffRequestSchema } from '@/lib/validation/signoff';

/** Signs one sign-off step of a plate; the notifications it queued go out right after the answer. */
export const signPlateStepAction = validatedAction(
  signoffRequestSchema.and(z.object({ plateId: z.string() })),
  [],
  async (input, actor) => {
    const { plateId, ...request } = input;
    const result = await signPlateStep(actor, parseId(plateId, 'plate'), request);
    after(() => sendDueMailNow());
    revalidatePath(`/plates/${result.plateId}`, 'layout');
    revalidatePath('/');
    // The mail is queued with the signature and sent just after, with retries (the outbox shows where it stands).
    const notice =
      result.notified === 0
        ? 'nobody else needs a notice'
        : `a notice to ${result.notified === 1 ? '1 person' : `${result.notified} people`} is on its way by e-mail`;
    return {
      ok: true,
      message: `Signed. Plate ${result.label} is now ${PLATE_STATE_PHRASE[result.state]}; ${notice}.`,
    };
  },
);
