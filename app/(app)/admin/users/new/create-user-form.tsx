'use client';

import { AppLink } from '@/components/ui/app-link';
import { useState, type ChangeEvent } from 'react';
import { Field, FormMessage, SubmitRow } from '@/components/forms/field';
import { useFormAction } from '@/components/forms/use-form-action';
import { OneTimePassword } from '@/components/users/one-time-password';
import { RoleCheckboxes } from '@/components/users/role-checkboxes';
import type { ActionState, FormAction } from '@/lib/actions/validated-action';
import type { Role } from '@/lib/domain/roles';

export type CreateUserState = ActionState & {
  userId?: string;
  userName?: string;
  initialPassword?: string | null;
  invited?: boolean;
};

/**
 * Name, e-mail, roles, and how the person gets in: a link by e-mail, or an initial password (set here or
 * generated); on success, the account and, for a password, the one-time password.
 */
export function CreateUserForm({
  action,
  minPasswordLength,
  invitationDays,
}: {
  action: FormAction<CreateUserState>;
  minPasswordLength: number;
  invitationDays: number;
}) {
  const { state, pending, formRef, onSubmit } = useFormAction(action);
  const [fields, setFields] = useState({ name: '', email: '', password: '' });
  const [roles, setRoles] = useState<Role[]>([]);
  const [access, setAccess] = useState<'link' | 'password'>('link');
  const errors = state.fieldErrors ?? {};

  if (state.ok && state.userId) {
    return (
      <div className="space-y-4">
        <FormMessage ok message={state.message} />
        {state.initialPassword ? (
          <OneTimePassword password={state.initialPassword} who={state.userName ?? 'the new user'} />
        ) : state.invited ? (
          <p className="text-sm text-ink-700">
            They choose their password through the link, then sign in; nobody else learns it.
          </p>
        ) : (
          <p className="text-sm text-ink-700">They sign in with the password you set.</p>
        )}
        <div className="flex gap-3">
          <AppLink href={`/admin/users/${state.userId}`} className="gw-button">
            Open the account
          </AppLink>
          <AppLink href="/admin/users" className="gw-button-quiet">
            Back to users
          </AppLink>
        </div>
      </div>
    );
  }

  const bind = (name: keyof typeof fields) => ({
    name,
    value: fields[name],
    errors: errors[name],
    onChange: (event: ChangeEvent<HTMLInputElement>) => setFields({ ...fields, [name]: event.target.value }),
  });
  return (
    <form ref={formRef} onSubmit={onSubmit} className="max-w-xl space-y-2" noValidate>
      <Field label="Name" autoComplete="off" required {...bind('name')} />
      <Field
        label="E-mail"
        type="email"
        autoComplete="off"
        required
        {...bind('email')}
        hint="The person signs in with this address."
      />
      <RoleCheckboxes selected={roles} onChange={setRoles} errors={errors.roles} />
      <fieldset aria-describedby="access-error">
        <legend className="gw-label">How they get in</legend>
        <div className="mt-2 space-y-2 text-sm">
          <label className="flex items-start gap-2">
            <input
              type="radio"
              name="access"
              value="link"
              checked={access === 'link'}
              onChange={() => setAccess('link')}
              className="mt-0.5 size-4 accent-lagoon-700"
            />
            <span>
              <span className="font-medium">E-mail them a link</span>{' '}
              <span className="text-ink-500">
                — they choose their own password (the link works once, within {invitationDays} days)
              </span>
            </span>
          </label>
          <label className="flex items-start gap-2">
            <input
              type="radio"
              name="access"
              value="password"
              checked={access === 'password'}
              onChange={() => setAccess('password')}
              className="mt-0.5 size-4 accent-lagoon-700"
            />
            <span>
              <span className="font-medium">Give them a one-time password</span>{' '}
              <span className="text-ink-500">
                — you hand it over; they choose their own at the first sign-in
              </span>
            </span>
          </label>
        </div>
        <p id="access-error" aria-live="polite" className="mt-1 min-h-4 text-xs text-signal-fail">
          {errors.access?.join(' ')}
        </p>
      </fieldset>
      {access === 'password' ? (
        <Field
          label="Initial password"
          type="password"
          autoComplete="new-password"
          {...bind('password')}
          hint={`Leave empty and Gatewell generates one to show you once. If you set one: at least ${minPasswordLength} characters.`}
        />
      ) : null}
      <SubmitRow
        label="Create account"
        pendingLabel="Creating…"
        pending={pending}
        state={state}
        className="flex items-center gap-3 pt-2"
      />
    </form>
  );
}
