import { z } from 'zod';

export const signInSchema = z.object({
  email: z
    .string()
    .trim()
    .min(1, 'Enter your e-mail address.')
    .max(254)
    .pipe(z.email('Enter a valid e-mail address.')),
  password: z.string().min(1, 'Enter your password.').max(1024, 'That password is too long.'),
  next: z.string().optional(),
});

export type SignInInput = z.infer<typeof signInSchema>;

/** Only same-site paths may be a destination after sign-in. */
export function safeNextPath(next: string | undefined): string {
  if (!next || !next.startsWith('/') || next.startsWith('//') || next.startsWith('/\\')) return '/';
  return next;
}
