'use server';

import { validatedAction } from '@/lib/actions/validated-action';
import { getSession } from '@/lib/auth/session';
import { changeOwnPassword } from '@/lib/users/change-password';
import { changePasswordSchema } from '@/lib/validation/users';

/** Changes the signed-in person's password; this session stays, every other one ends. */
export const changePasswordAction = validatedAction(
  changePasswordSchema,
  [],
  async (input, actor) => {
    const { sessionVersion } = await changeOwnPassword(actor, input);
    const session = await getSession();
    session.sessionVersion = sessionVersion;
    session.lastSeenAt = Date.now();
    await session.save();
    return { ok: true, message: 'Password changed. Your other sessions have ended.' };
  },
  { beforeOwnPassword: true },
);
