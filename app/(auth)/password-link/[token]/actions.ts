'use server';

import { redirect } from 'next/navigation';
import {
  failedActionState,
  formFields,
  invalidFormState,
  type ActionState,
} from '@/lib/actions/validated-action';
import { setPasswordByLink } from '@/lib/auth/password-link';
import { requestAddress } from '@/lib/auth/request-address';
import { getSession } from '@/lib/auth/session';
import { setPasswordByLinkSchema } from '@/lib/validation/password-link';

/** Sets the new password through the link, ends this browser's session too, and sends the person to sign in with it. */
export async function setPasswordByLinkAction(
  _previous: ActionState,
  formData: FormData,
): Promise<ActionState> {
  const parsed = setPasswordByLinkSchema.safeParse(formFields(formData));
  if (!parsed.success) return invalidFormState(parsed.error);
  try {
    await setPasswordByLink(parsed.data, await requestAddress());
  } catch (error) {
    return failedActionState(error);
  }
  (await getSession()).destroy();
  redirect('/sign-in?password=set');
}
