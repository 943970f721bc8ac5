'use client';

import { useActionState } from 'react';
import { Field, SubmitRow } from '@/components/forms/field';
import type { FormAction } from '@/lib/actions/validated-action';

/** Current password, new password twice. Password fields are never filled back in after a failure. */
export function ChangePasswordForm({
  action,
  minPasswordLength,
}: {
  action: FormAction;
  minPasswordLength: number;
}) {
  const [state, formAction, pending] = useActionState(action, {});
  const errors = state.fieldErrors ?? {};
  return (
    <form action={formAction} className="max-w-md space-y-1" noValidate>
      <Field
        label="Current password"
        name="currentPassword"
        type="password"
        autoComplete="current-password"
        required
        errors={errors.currentPassword}
      />
      <Field
        label="New password"
        name="newPassword"
        type="password"
        autoComplete="new-password"
        required
        errors={errors.newPassword}
        hint={`At least ${minPasswordLength} characters. A phrase of several words is easier to remember.`}
      />
      <Field
        label="New password again"
        name="confirmPassword"
        type="password"
        autoComplete="new-password"
        required
        errors={errors.confirmPassword}
      />
      <SubmitRow
        label="Change password"
        pendingLabel="Changing…"
        pending={pending}
        state={state}
        className="flex flex-wrap items-center gap-3 pt-2"
      />
    </form>
  );
}
