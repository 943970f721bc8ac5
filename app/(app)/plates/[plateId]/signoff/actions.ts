'use server';

import { revalidatePath } from 'next/cache';
import { after } from 'next/server';
import { z } from 'zod';
import { validatedAction } from '@/lib/actions/validated-action';
import { requireCapability } from '@/lib/auth/roles';
import { PLATE_STATE_PHRASE, PLATE_TRANSITIONS, SIGNOFF_ACTIONS } from '@/lib/domain/plate-states';
import { rolesFor } from '@/lib/domain/roles';
import { sendDueMailNow } from '@/lib/mail/sender-loop';
import { signPlateStep } from '@/lib/signoff/service';
import { parseId } from '@/lib/validation/ids';
import { signoffRequestSchema } from '@/lib/validation/signoff';

/** Whoever may sign some step of sign-off; anyone else is refused before the form is read. */
const SIGNING_ROLES = [
  ...new Set(SIGNOFF_ACTIONS.flatMap((action) => rolesFor(PLATE_TRANSITIONS[action].capability))),
];

/**
 * Signs one sign-off step of a plate; the notifications it queued go out right after the answer. The
 * action checks the step's role itself, before the service checks it again.
 */
export const signPlateStepAction = validatedAction(
  signoffRequestSchema.and(z.object({ plateId: z.string() })),
  SIGNING_ROLES,
  async (input, actor) => {
    const { plateId, ...request } = input;
    requireCapability(actor, PLATE_TRANSITIONS[request.action].capability);
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
