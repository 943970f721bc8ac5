'use client';

import { startTransition, useActionState, useEffect, useRef, type FormEvent } from 'react';
import type { ActionState } from '@/lib/actions/validated-action';

type Action<State> = (state: Awaited<State>, formData: FormData) => Promise<State>;

/**
 * Runs a form's server action without React's automatic reset, so that a refused form keeps what was
 * typed and ticked (a reset would untick controlled checkboxes behind React's back). With
 * `resetOnSuccess` the fields are cleared once the action succeeds.
 */
export function useFormAction<State extends ActionState>(
  action: Action<State>,
  { resetOnSuccess = false } = {},
) {
  const [state, formAction, pending] = useActionState<State, FormData>(action, {} as Awaited<State>);
  const formRef = useRef<HTMLFormElement>(null);
  useEffect(() => {
    if (resetOnSuccess && state.ok) formRef.current?.reset();
  }, [state, resetOnSuccess]);
  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const data = new FormData(event.currentTarget);
    startTransition(() => formAction(data));
  };
  return { state, pending, formRef, onSubmit };
}
