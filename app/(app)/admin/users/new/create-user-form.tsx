'use client';

import { AppLink } from '@/components/ui/app-link';
import { useState, type ChangeEvent } from 'react';
import { Field, FormMessage } from '@/components/forms/field';
import { useFormAction } from '@/components/forms/use-form-action';
import { OneTimePassword } from '@/components/users/one-time-password';
import { RoleCheckboxes } from '@/components/users/role-checkboxes';
import type { ActionState } from '@/lib/actions/validated-action';
import type { Role } from '@/models/user-role';

export type CreateUserState = ActionState & { userId?: string; userName?: string; initialPassword?: string | null };
type Action = (state: CreateUserState, formData: FormData) => Promise<CreateUserState>;

/** Name, e-mail, roles and an optional initial password; on success, the account and its one-time password. */
export function CreateUserForm({ action, minPasswordLength }: { action: Action; minPasswordLength: number }) {
  const { state, pending, formRef, onSubmit } = useFormAction(action);
  const [fields, setFields] = useState({ name: '', email: '', password: '' });
  const [roles, setRoles] = useState<Role[]>([]);
  const errors = state.fieldErrors ?? {};

  if (state.ok && state.userId) {
    return (
      <div className="space-y-4">
        <FormMessage ok message={state.message} />
        {state.initialPassword ? <OneTimePassword password={state.initialPassword} who={state.userName ?? 'the new user'} /> : (
          <p className="text-sm text-ink-700">They sign in with the password you set.</p>
        )}
        <div className="flex gap-3">
          <AppLink href={`/admin/users/${state.userId}`} className="gw-button">Open the account</AppLink>
          <AppLink href="/admin/users" className="gw-button-quiet">Back to users</AppLink>
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
      <Field label="E-mail" type="email" autoComplete="off" required {...bind('email')} hint="The person signs in with this address." />
      <RoleCheckboxes selected={roles} onChange={setRoles} errors={errors.roles} />
      <Field label="Initial password" type="password" autoComplete="new-password" {...bind('password')}
        hint={`Leave empty and Gatewell generates one to show you once. If you set one: at least ${minPasswordLength} characters.`} />
      <div className="flex items-center gap-3 pt-2">
        <button type="submit" className="gw-button" disabled={pending}>{pending ? 'Creating…' : 'Create account'}</button>
        <FormMessage ok={state.ok} message={state.message} />
      </div>
    </form>
  );
}
