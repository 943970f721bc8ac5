'use client';

import { useActionState } from 'react';
import { signInAction, type SignInState } from './actions';
import { BusyButton } from '@/components/ui/busy-button';

function FieldError({ id, messages }: { id: string; messages: string[] | undefined }) {
  return (
    <p id={id} className="mt-1 min-h-5 text-sm text-signal-fail" aria-live="polite">
      {messages?.join(' ')}
    </p>
  );
}

export function SignInForm({ next }: { next: string }) {
  const [state, action, pending] = useActionState<SignInState, FormData>(signInAction, {});
  return (
    <form action={action} className="space-y-2" noValidate>
      <input type="hidden" name="next" value={next} />
      <div>
        <label htmlFor="email" className="gw-label">
          E-mail
        </label>
        <input
          id="email"
          name="email"
          type="email"
          autoComplete="username"
          required
          defaultValue={state.email}
          aria-describedby="email-error"
          className="gw-input mt-1"
        />
        <FieldError id="email-error" messages={state.fieldErrors?.email} />
      </div>
      <div>
        <label htmlFor="password" className="gw-label">
          Password
        </label>
        <input
          id="password"
          name="password"
          type="password"
          autoComplete="current-password"
          required
          aria-describedby="password-error"
          className="gw-input mt-1"
        />
        <FieldError id="password-error" messages={state.fieldErrors?.password} />
      </div>
      <p role="alert" aria-live="assertive" className="min-h-5 text-sm font-medium text-signal-fail">
        {state.message}
      </p>
      <BusyButton
        type="submit"
        className="gw-button w-full justify-center"
        busy={pending}
        busyLabel="Signing in…"
      >
        Sign in
      </BusyButton>
    </form>
  );
}
