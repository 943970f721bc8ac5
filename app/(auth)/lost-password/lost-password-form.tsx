'use client';

import { useActionState } from 'react';
import { Field, FormMessage } from '@/components/forms/field';
import { requestPasswordLinkAction, type LinkRequestState } from './actions';
import { BusyButton } from '@/components/ui/busy-button';

/** One e-mail field; after sending, the form says what happens next, the same for every address. */
export function LostPasswordForm() {
  const [state, action, pending] = useActionState<LinkRequestState, FormData>(requestPasswordLinkAction, {});
  return (
    <form action={action} className="space-y-2" noValidate>
      <Field
        label="E-mail"
        name="email"
        type="email"
        autoComplete="username"
        required
        defaultValue={state.email}
        errors={state.fieldErrors?.email}
      />
      <FormMessage ok={state.ok} message={state.message} />
      <BusyButton
        type="submit"
        className="gw-button w-full justify-center"
        busy={pending}
        busyLabel="Sending…"
      >
        Send me a link
      </BusyButton>
    </form>
  );
}
