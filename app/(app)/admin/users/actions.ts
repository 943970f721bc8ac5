'use server';

import { revalidatePath } from 'next/cache';
import { z } from 'zod';
import { validatedAction } from '@/lib/actions/validated-action';
import { changeRoles } from '@/lib/users/change-roles';
import { createUser } from '@/lib/users/create';
import { resetPassword } from '@/lib/users/reset-password';
import { disableUser, enableUser } from '@/lib/users/status';
import { changeRolesSchema, createUserSchema, resetPasswordSchema, userStatusSchema } from '@/lib/validation/users';

function refresh(userId?: string) {
  revalidatePath('/admin/users');
  if (userId) revalidatePath(`/admin/users/${userId}`);
}

/** Creates an account; a generated initial password comes back once, for the admin to hand over. */
export const createUserAction = validatedAction(createUserSchema, ['admin'], async (input, actor) => {
  const { user, initialPassword } = await createUser(actor, input);
  refresh();
  return { ok: true, message: `Account created for ${user.name}.`, userId: user.id, userName: user.name, initialPassword };
});

/** Replaces a user's roles, with the reason kept in the audit trail. */
export const changeRolesAction = validatedAction(changeRolesSchema, ['admin'], async (input, actor) => {
  const user = await changeRoles(actor, input);
  refresh(user.id);
  return { ok: true, message: `Roles saved: ${user.roles.join(', ') || 'none (read only)'}.` };
});

/** Disables an account (ending its sessions) or enables it again, with the reason kept in the audit trail. */
export const setUserStatusAction = validatedAction(
  userStatusSchema.extend({ status: z.enum(['enabled', 'disabled'], 'Choose enabled or disabled.') }),
  ['admin'],
  async ({ status, ...input }, actor) => {
    const user = status === 'disabled' ? await disableUser(actor, input) : await enableUser(actor, input);
    refresh(user.id);
    return {
      ok: true,
      message: status === 'disabled' ? `${user.name} is disabled and signed out everywhere.` : `${user.name} can sign in again.`,
    };
  },
);

/** Sets a new password for someone and ends their sessions; a generated one comes back once. */
export const resetPasswordAction = validatedAction(resetPasswordSchema, ['admin'], async (input, actor) => {
  const { user, temporaryPassword } = await resetPassword(actor, input);
  refresh(user.id);
  return { ok: true, message: `New password set for ${user.name}; their sessions have ended.`, temporaryPassword };
});
