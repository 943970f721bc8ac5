'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { validatedAction } from '@/lib/actions/validated-action';
import { INVITATION_LIFETIME_MS } from '@/lib/auth/password-link';
import { rolesFor } from '@/lib/domain/roles';
import { sendDueMailNow } from '@/lib/mail/sender-loop';
import { changeRoles } from '@/lib/users/change-roles';
import { createUser } from '@/lib/users/create';
import { resetPassword } from '@/lib/users/reset-password';
import { disableUser, enableUser } from '@/lib/users/status';
import {
  changeRolesSchema,
  createUserSchema,
  resetPasswordSchema,
  userStatusSchema,
} from '@/lib/validation/users';

function refresh(userId?: string) {
  revalidatePath('/admin/users');
  if (userId) revalidatePath(`/admin/users/${userId}`);
}

/**
 * Creates an account; with a link, the person is e-mailed one at once; else a generated initial password
 * comes back once, for the admin to hand over.
 */
export const createUserAction = validatedAction(
  createUserSchema,
  rolesFor('manageUsers'),
  async (input, actor) => {
    const { user, initialPassword, invited } = await createUser(actor, input);
    refresh();
    if (invited && process.env.GATEWELL_MAIL_SENDER !== 'off') void sendDueMailNow();
    const message = invited
      ? `Account created for ${user.name}. A link to choose their password is on its way to ${user.email}; it works once, within ${INVITATION_LIFETIME_MS / 86_400_000} days.`
      : `Account created for ${user.name}.`;
    return { ok: true, message, userId: user.id, userName: user.name, initialPassword, invited };
  },
);

/** Replaces a user's roles, with the reason kept in the audit trail. */
export const changeRolesAction = validatedAction(
  changeRolesSchema,
  rolesFor('manageUsers'),
  async (input, actor) => {
    const user = await changeRoles(actor, input);
    refresh(user.id);
    return { ok: true, message: `Roles saved: ${user.roles.join(', ') || 'none (read only)'}.` };
  },
);

/** Disables an account (ending its sessions) or enables it again, with the reason kept in the audit trail. */
export const setUserStatusAction = validatedAction(
  userStatusSchema.extend({ status: z.enum(['enabled', 'disabled'], 'Choose enabled or disabled.') }),
  rolesFor('manageUsers'),
  async ({ status, ...input }, actor) => {
    const user = status === 'disabled' ? await disableUser(actor, input) : await enableUser(actor, input);
    refresh(user.id);
    return {
      ok: true,
      message:
        status === 'disabled'
          ? `${user.name} is disabled and signed out everywhere.`
          : `${user.name} can sign in again.`,
    };
  },
);

/** Sets a new password for someone and ends their sessions; a generated one comes back once. */
export const resetPasswordAction = validatedAction(
  resetPasswordSchema,
  rolesFor('manageUsers'),
  async (input, actor) => {
    const { user, temporaryPassword } = await resetPassword(actor, input);
    refresh(user.id);
    return {
      ok: true,
      message: `New password set for ${user.name}; their sessions have ended.`,
      temporaryPassword,
    };
  },
);
