import 'server-only';
import { AppError } from '@/lib/errors';
import type { Actor } from './roles';

export const OWN_PASSWORD_FIRST =
  'An administrator set your password, so it is good for one sign-in only: choose your own on the Account page before you go on.';

/** Refuses every request of someone whose password an administrator set, until they choose their own. */
export function refuseUntilOwnPassword(actor: Actor): void {
  if (actor.passwordChangeRequired) throw new AppError('forbidden', OWN_PASSWORD_FIRST);
}
