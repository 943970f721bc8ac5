'use server';

import { redirect } from 'next/navigation';
import { z } from 'zod';
import { currentActor } from '@/lib/auth/current-actor';
import { requestAddress } from '@/lib/auth/request-address';
import { getSession } from '@/lib/auth/session';
import { signIn } from '@/lib/auth/sign-in';
import { recordSignOut } from '@/lib/auth/sign-out';
import { DATABASE_UNAVAILABLE_MESSAGE, isDatabaseUnavailable } from '@/lib/database-unavailable';
import { safeNextPath, signInSchema } from '@/lib/validation/auth';

export interface SignInState {
  message?: string;
  fieldErrors?: { email?: string[]; password?: string[] };
  email?: string;
}

/** Signs a person in; on success a fresh session cookie replaces any earlier one. */
export async function signInAction(_previous: SignInState, formData: FormData): Promise<SignInState> {
  const parsed = signInSchema.safeParse(Object.fromEntries(formData));
  if (!parsed.success) {
    return {
      fieldErrors: z.flattenError(parsed.error).fieldErrors,
      email: String(formData.get('email') ?? ''),
    };
  }
  const { email, password, next } = parsed.data;
  let result: Awaited<ReturnType<typeof signIn>>;
  try {
    result = await signIn(email, password, await requestAddress());
  } catch (error) {
    if (!isDatabaseUnavailable(error)) throw error;
    console.error('database unavailable during sign-in', error);
    return { message: DATABASE_UNAVAILABLE_MESSAGE, email };
  }
  if (!result.ok) {
    const message =
      result.reason === 'throttled'
        ? 'Too many failed sign-ins. Wait 15 minutes, then try again.'
        : 'That e-mail and password do not match an active account.';
    return { message, email };
  }

  const session = await getSession();
  session.destroy();
  const now = Date.now();
  Object.assign(session, {
    userId: result.userId,
    sessionVersion: result.sessionVersion,
    issuedAt: now,
    lastSeenAt: now,
  });
  await session.save();
  // With a password an administrator set, the Account page comes first (the signed-in layout insists too).
  redirect(result.passwordChangeRequired ? '/account' : safeNextPath(next));
}

/**
 * Ends the session and records the sign-out. Sessions are sealed cookies, so sign-out also moves the
 * person's session_version on: a copy of the cookie taken earlier stops working too (as do the person's
 * sessions in other browsers).
 */
export async function signOutAction(): Promise<void> {
  const actor = await currentActor();
  const session = await getSession();
  session.destroy();
  if (actor) await recordSignOut(actor);
  redirect('/sign-in');
}
