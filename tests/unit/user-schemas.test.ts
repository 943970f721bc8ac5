import { describe, expect, test } from 'vitest';
import { z } from 'zod';
import { ROLES } from '@/lib/domain/roles';
import { ROLE_CHOICES } from '@/components/users/role-choices';
import { changeRolesSchema, createUserSchema, resetPasswordSchema } from '@/lib/validation/users';

const errorsOf = (schema: z.ZodType, input: unknown) => {
  const parsed = schema.safeParse(input);
  return parsed.success ? {} : z.flattenError(parsed.error).fieldErrors;
};

describe('user administration forms', () => {
  test('checkbox roles arrive as nothing, one value or several, and come out sorted without repeats', () => {
    const base = { name: 'Nia', email: ' Nia@Example.org ' };
    // Without a choice of how the person gets in, a one-time password (as before invitations by link).
    expect(createUserSchema.parse(base)).toEqual({
      name: 'Nia',
      email: 'nia@example.org',
      roles: [],
      access: 'password',
    });
    expect(createUserSchema.parse({ ...base, access: 'link', password: '' })).toEqual({
      name: 'Nia',
      email: 'nia@example.org',
      roles: [],
      access: 'link',
    });
    expect(createUserSchema.parse({ ...base, roles: 'chemist' }).roles).toEqual(['chemist']);
    expect(
      createUserSchema.parse({ ...base, roles: ['admin', 'chemist', 'admin'], password: '' }).roles,
    ).toEqual(['admin', 'chemist']);
  });

  test.each([
    [createUserSchema, {}, { name: ['Enter the person’s name.'], email: ['Enter an e-mail address.'] }],
    [
      createUserSchema,
      { name: ' ', email: 'nia', roles: ['owner'] },
      {
        name: ['Enter the person’s name.'],
        email: ['Enter a valid e-mail address.'],
        roles: ['Choose roles from the list.'],
      },
    ],
    [
      createUserSchema,
      { name: 'Nia', email: 'nia@example.org', password: 'short' },
      { password: ['Use at least 10 characters.'] },
    ],
    [
      createUserSchema,
      { name: 'Nia', email: 'nia@example.org', access: 'invite' },
      { access: ['Choose how the person gets in.'] },
    ],
    [
      changeRolesSchema,
      { userId: 'x', roles: [], reason: 'no' },
      {
        userId: ['This user does not exist.'],
        reason: ['Say why (at least 3 characters); the audit trail keeps the reason.'],
      },
    ],
    [
      resetPasswordSchema,
      { userId: '00000000-0000-4000-8000-000000000000', reason: 'x'.repeat(501) },
      { reason: ['Keep the reason under 500 characters.'] },
    ],
  ])('refuses %#: %o with messages by field', (schema, input, expected) => {
    expect(errorsOf(schema, input)).toEqual(expected);
  });

  test('every role is offered in the forms with its duty', () => {
    expect(ROLE_CHOICES.map((choice) => choice.role).sort()).toEqual([...ROLES].sort());
  });
});
