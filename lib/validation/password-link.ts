import { z } from 'zod';
import { emailField, newPasswordField } from './users';

/** "Lost your password?": the address to send a link to. */
export const passwordLinkRequestSchema = z.object({ email: emailField });

/** The page a link opens: its token and the new password, twice. */
export const setPasswordByLinkSchema = z
  .object({
    token: z.string('This link is incomplete.').regex(/^[A-Za-z0-9_-]{43}$/, 'This link is incomplete.'),
    newPassword: newPasswordField,
    confirmPassword: z.string('Repeat the new password.'),
  })
  .refine((input) => input.newPassword === input.confirmPassword, {
    path: ['confirmPassword'],
    message: 'The two new passwords differ.',
  });

export type SetPasswordByLinkInput = z.input<typeof setPasswordByLinkSchema>;
