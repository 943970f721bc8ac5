import { z } from 'zod';
import { MAX_PASSWORD_LENGTH } from '@/lib/auth/password-policy';
import { signoffActionSchema } from '@/lib/domain/plate-states';

/**
 * What a person sends to sign one step: the step, the password again, a comment, the version they saw,
 * and, when the plate has QC warnings, their acknowledgement of them. There is no field for the signer:
 * a signature is always the signed-in person's own.
 */
export const signoffRequestSchema = z
  .object({
    action: signoffActionSchema,
    password: z
      .string('Enter your password to sign.')
      .min(1, 'Enter your password to sign.')
      .max(MAX_PASSWORD_LENGTH, 'That password is too long.'),
    comment: z.string().trim().max(2000, 'Keep the comment under 2000 characters.').default(''),
    expectedVersion: z.coerce
      .number('The form lost the plate version; reload the page.')
      .int()
      .positive('The form lost the plate version; reload the page.')
      .optional(),
    /** The signer ticked that they read the plate's QC warnings (a form sends the box's value, callers true). */
    acknowledgeQcWarnings: z
      .union([z.boolean(), z.literal('yes'), z.literal('on'), z.literal('')])
      .optional()
      .transform((value) => value === true || value === 'yes' || value === 'on'),
    /** The keys of the QC warnings the form showed (lib/signoff/qc-warnings.ts), space-separated. */
    qcWarningsShown: z.string().max(4000).optional(),
  })
  .superRefine((input, context) => {
    if (input.action === 'reject' && input.comment.length === 0) {
      context.addIssue({
        code: 'custom',
        path: ['comment'],
        message: 'Say why the plate is returned; the biologist reworks it from your comment.',
      });
    }
  });

export type SignoffRequest = z.input<typeof signoffRequestSchema>;
