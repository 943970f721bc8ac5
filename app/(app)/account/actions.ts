'use server';

import { validatedAction } from '@/lib/actions/validated-action';
import { getSession } from '@/lib/auth/session';
import { NOTICE_DELIVERY_LABELS } from '@/lib/domain/notices';
import { setNoticeDelivery } from '@/lib/notices/service';
import { changeOwnPassword } from '@/lib/users/change-password';
import { noticeDeliverySchema } from '@/lib/validation/notices';
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

const sentenceCase = (label: string) => label[0]!.toLowerCase() + label.slice(1);

/** Sets how the signed-in person is told of plates and imports: by e-mail and in Gatewell, or in Gatewell only. */
export const setNoticeDeliveryAction = validatedAction(
  noticeDeliverySchema,
  [],
  async ({ delivery }, actor) => {
    const changed = await setNoticeDelivery(actor, delivery);
    return {
      ok: true,
      message: changed
        ? `Saved: ${sentenceCase(NOTICE_DELIVERY_LABELS[delivery])}.`
        : `No change: already ${sentenceCase(NOTICE_DELIVERY_LABELS[delivery])}.`,
    };
  },
);
