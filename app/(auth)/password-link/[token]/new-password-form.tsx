'use client';

import { useActionState } from 'react';
import { Field, FormMessage } from '@/components/forms/field';
import type { ActionState } from '@/lib/actions/validated-action';
import { setPasswordByLinkAction } from './actions';
import { BusyButton } from '@/components/ui/busy-button';

/** The new password twice; the link's token rides along. Password fields are never filled back in. */
export function NewPasswordForm({
  token,
  email,
  minPasswordLength,
}: {
  token: string;
  email: string;
  minPasswordLength: number;
}) {
  const [state, action, pending] = useActionState<ActionState, FormData>(setPasswordByLinkAction, {});
  const errors = state.fieldErrors ?? {};
  return (
    <form action={action} className="space-y-1" noValidate>
      <input type="hidden" name="token" value={token} />
      {/* For password managers: the account the new password belongs to. */}
      <input type="email" name="username" autoComplete="username" value={email} readOnly hidden />
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
      <FormMessage ok={state.ok} message={state.message} />
      <BusyButton
        type="submit"
        className="gw-button w-full justify-center"
        busy={pending}
        busyLabel="Setting…"
      >
        Set new password
      </BusyButton>
    </form>
  );
}
