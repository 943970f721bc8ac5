import { z } from 'zod';
import { MAX_PASSWORD_LENGTH, MIN_PASSWORD_LENGTH } from '@/lib/auth/password-policy';
import { roleSchema } from '@/lib/domain/roles';

const emptyToUndefined = (value: unknown) => (value === '' || value === null ? undefined : value);

/** A new password as every form and service checks it. */
export const newPasswordField = z
  .string('Enter a password.')
  .min(MIN_PASSWORD_LENGTH, `Use at least ${MIN_PASSWORD_LENGTH} characters.`)
  .max(MAX_PASSWORD_LENGTH, 'That password is too long.');

/** An initial or reset password set by an admin; left empty, Gatewell generates one. */
const optionalPassword = z.preprocess(emptyToUndefined, newPasswordField.optional());

export const emailField = z
  .string('Enter an e-mail address.')
  .trim()
  .toLowerCase()
  .min(1, 'Enter an e-mail address.')
  .max(254, 'E-mail addresses are at most 254 characters.')
  .pipe(z.email('Enter a valid e-mail address.'));

/** Roles from checkboxes: absent means none, one value or several. Duplicates collapse. */
export const roleList = z.preprocess(
  (value) => (value === undefined || value === '' ? [] : Array.isArray(value) ? value : [value]),
  z.array(roleSchema).transform((roles) => [...new Set(roles)].sort()),
);

const reasonField = z
  .string('Say why; the audit trail keeps the reason.')
  .trim()
  .min(3, 'Say why (at least 3 characters); the audit trail keeps the reason.')
  .max(500, 'Keep the reason under 500 characters.');

const userIdField = z.uuid('This user does not exist.');

/** How a new account's owner first gets in: a link by e-mail to choose their password, or a one-time password the admin hands over. */
export const ACCOUNT_ACCESS = ['password', 'link'] as const;

export const createUserSchema = z
  .object({
    name: z
      .string('Enter the person’s name.')
      .trim()
      .min(1, 'Enter the person’s name.')
      .max(200, 'Names are at most 200 characters.'),
    email: emailField,
    roles: roleList,
    access: z.preprocess(
      emptyToUndefined,
      z.enum(ACCOUNT_ACCESS, 'Choose how the person gets in.').default('password'),
    ),
    password: optionalPassword,
  })
  .refine((input) => !(input.access === 'link' && input.password), {
    path: ['password'],
    message: 'Leave the password empty: the person chooses their own through the e-mailed link.',
  });

export const changeRolesSchema = z.object({ userId: userIdField, roles: roleList, reason: reasonField });

export const userStatusSchema = z.object({ userId: userIdField, reason: reasonField });

export const resetPasswordSchema = z.object({
  userId: userIdField,
  password: optionalPassword,
  reason: reasonField,
});

export const changePasswordSchema = z
  .object({
    currentPassword: z
      .string('Enter your current password.')
      .min(1, 'Enter your current password.')
      .max(MAX_PASSWORD_LENGTH),
    newPassword: newPasswordField,
    confirmPassword: z.string('Repeat the new password.'),
  })
  .refine((input) => input.newPassword === input.confirmPassword, {
    path: ['confirmPassword'],
    message: 'The two new passwords differ.',
  })
  .refine((input) => input.newPassword !== input.currentPassword, {
    path: ['newPassword'],
    message: 'Choose a password different from the current one.',
  });

export type CreateUserInput = z.input<typeof createUserSchema>;
export type ChangeRolesInput = z.input<typeof changeRolesSchema>;
export type UserStatusInput = z.input<typeof userStatusSchema>;
export type ResetPasswordInput = z.input<typeof resetPasswordSchema>;
export type ChangePasswordInput = z.input<typeof changePasswordSchema>;
