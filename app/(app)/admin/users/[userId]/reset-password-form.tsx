'use client';

import { Field, FormMessage } from '@/components/forms/field';
import { useFormAction } from '@/components/forms/use-form-action';
import { OneTimePassword } from '@/components/users/one-time-password';
import type { ActionState } from '@/lib/actions/validated-action';

type ResetState = ActionState & { temporaryPassword?: string | null };
type Action = (state: ResetState, formData: FormData) => Promise<ResetState>;

/** Sets a new password for someone who lost theirs; generated unless the admin types one. */
export function ResetPasswordForm({ action, userId, userName, minPasswordLength }: {
  action: Action;
  userId: string;
  userName: string;
  minPasswordLength: number;
}) {
  const { state, pending, formRef, onSubmit } = useFormAction(action, { resetOnSuccess: true });
  const errors = state.fieldErrors ?? {};
  return (
    <form ref={formRef} onSubmit={onSubmit} className="space-y-2" noValidate>
      <input type="hidden" name="userId" value={userId} />
      <Field label="New password" name="password" id="reset-password" type="password" autoComplete="new-password" errors={errors.password}
        hint={`Leave empty to generate one. If you type one: at least ${minPasswordLength} characters.`} />
      <Field label="Reason for the new password" name="reason" id="reset-reason" errors={errors.reason} />
      <div className="flex flex-wrap items-center gap-3">
        <button type="submit" className="gw-button" disabled={pending}>{pending ? 'Setting…' : 'Set new password'}</button>
        <FormMessage ok={state.ok} message={state.message} />
      </div>
      {state.ok && state.temporaryPassword ? <OneTimePassword password={state.temporaryPassword} who={userName} /> : null}
    </form>
  );
}
