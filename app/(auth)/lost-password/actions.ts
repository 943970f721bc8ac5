'use server';

import {
  failedActionState,
  formFields,
  invalidFormState,
  type ActionState,
} from '@/lib/actions/validated-action';
import { requestPasswordLink, LINK_LIFETIME_MS, LINK_WINDOW_MS } from '@/lib/auth/password-link';
import { requestAddress } from '@/lib/auth/request-address';
import { sendDueMailNow } from '@/lib/mail/sender-loop';
import { passwordLinkRequestSchema } from '@/lib/validation/password-link';

export type LinkRequestState = ActionState & { email?: string };

/**
 * Asks for a link to choose a new password. The answer is the same whether or not the address belongs
 * to an account; the mail goes out at once where this server sends mail.
 */
export async function requestPasswordLinkAction(
  _previous: LinkRequestState,
  formData: FormData,
): Promise<LinkRequestState> {
  const fields = formFields(formData);
  const email = typeof fields.email === 'string' ? fields.email : '';
  const parsed = passwordLinkRequestSchema.safeParse(fields);
  if (!parsed.success) return { ...invalidFormState(parsed.error), email };
  try {
    const result = await requestPasswordLink(parsed.data, await requestAddress());
    if (!result.ok)
      return {
        message: `Too many requests from this network. Wait ${LINK_WINDOW_MS / 60_000} minutes, then try again.`,
        email,
      };
  } catch (error) {
    return { ...failedActionState(error), email };
  }
  if (process.env.GATEWELL_MAIL_SENDER !== 'off') void sendDueMailNow();
  return {
    ok: true,
    email: parsed.data.email,
    message: `If ${parsed.data.email} belongs to an active Gatewell account, a link to choose a new password is on its way there. It works once, within ${LINK_LIFETIME_MS / 60_000} minutes.`,
  };
}
