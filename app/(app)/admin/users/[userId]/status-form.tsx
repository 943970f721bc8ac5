'use client';

import { Field, FormMessage } from '@/components/forms/field';
import { useFormAction } from '@/components/forms/use-form-action';
import type { FormAction } from '@/lib/actions/validated-action';
import { BusyButton } from '@/components/ui/busy-button';

/** Disables an enabled account (its sessions end at once) or enables a disabled one. */
export function StatusForm({
  action,
  userId,
  enabled,
}: {
  action: FormAction;
  userId: string;
  enabled: boolean;
}) {
  const { state, pending, formRef, onSubmit } = useFormAction(action, { resetOnSuccess: true });
  const errors = state.fieldErrors ?? {};
  return (
    <form ref={formRef} onSubmit={onSubmit} className="space-y-2" noValidate>
      <input type="hidden" name="userId" value={userId} />
      <input type="hidden" name="status" value={enabled ? 'disabled' : 'enabled'} />
      <p className="text-sm text-ink-700">
        {enabled
          ? 'A disabled account cannot sign in, and every open session of it ends at once. Its records and audit trail stay.'
          : 'This account is disabled. Enabling it lets the person sign in again; old sessions stay ended.'}
      </p>
      <Field
        label={enabled ? 'Reason for disabling' : 'Reason for enabling'}
        name="reason"
        id="status-reason"
        errors={errors.reason}
      />
      <div className="flex flex-wrap items-center gap-3">
        <BusyButton
          type="submit"
          busy={pending}
          busyLabel="Saving…"
          className={enabled ? 'gw-button bg-signal-fail hover:bg-red-800' : 'gw-button'}
        >
          {enabled ? 'Disable account' : 'Enable account'}
        </BusyButton>
        <FormMessage ok={state.ok} message={state.message} />
      </div>
    </form>
  );
}
