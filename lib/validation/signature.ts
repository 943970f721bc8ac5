import { z } from 'zod';
import { MAX_PASSWORD_LENGTH } from '@/lib/auth/password-policy';

/** What a person enters to sign a record electronically, plus what the caller says is being signed. */
export const signatureSchema = z.object({
  password: z
    .string('Enter your password to sign.')
    .min(1, 'Enter your password to sign.')
    .max(MAX_PASSWORD_LENGTH, 'That password is too long.'),
  meaning: z
    .string('State what your signature means.')
    .trim()
    .min(1, 'State what your signature means.')
    .max(200, 'Keep the meaning under 200 characters.'),
  comment: z.string().trim().max(2000, 'Keep the comment under 2000 characters.').default(''),
  entityType: z
    .string()
    .regex(/^[a-z][a-z0-9_]{0,63}$/, 'The signed record type must be a lower-case name such as "plate".'),
  entityId: z.uuid('The signed record must be named by its id.'),
  content: z.unknown().refine((value) => value !== undefined, 'There is nothing to sign.'),
});

export type SignatureInput = z.input<typeof signatureSchema>;
