'use client';

import { Field, SubmitRow } from '@/components/forms/field';
import { useFormAction } from '@/components/forms/use-form-action';
import { OneTimePassword } from '@/components/users/one-time-password';
import type { ActionState, FormAction } from '@/lib/actions/validated-action';

type ResetState = ActionState & { temporaryPassword?: string | null };

/** Sets a new password for someone who lost theirs; generated unless the admin types one. */
export function ResetPasswordForm({
  action,
  userId,
  userName,
  minPasswordLength,
}: {
  action: FormAction<ResetState>;
  userId: string;
  userName: string;
  minPasswordLength: number;
}) {
  const { state, pending, formRef, onSubmit } = useFormAction(action, { resetOnSuccess: true });
  const errors = state.fieldErrors ?? {};
  return (
    <form ref={formRef} onSubmit={onSubmit} className="space-y-2" noValidate>
      <input type="hidden" name="userId" value={userId} />
      <Field
        label="New password"
        name="password"
        id="reset-password"
        type="password"
        autoComplete="new-password"
        errors={errors.password}
        hint={`Leave empty to generate one. If you type one: at least ${minPasswordLength} characters.`}
      />
      <Field label="Reason for the new password" name="reason" id="reset-reason" errors={errors.reason} />
      <SubmitRow
        label="Set new password"
        pendingLabel="Setting…"
        pending={pending}
        state={state}
        className="flex flex-wrap items-center gap-3"
      />
      {state.ok && state.temporaryPassword ? (
        <OneTimePassword password={state.temporaryPassword} who={userName} />
      ) : null}
    </form>
  );
}
