'use client';

import { useActionState } from 'react';
import type { FormAction } from '@/lib/actions/validated-action';
import { BusyButton } from '@/components/ui/busy-button';

/** A one-button form for an outbox command, with its answer announced beside it. */
export function OutboxButton({
  action,
  label,
  busyLabel,
  fields = {},
  quiet = false,
}: {
  action: FormAction;
  label: string;
  busyLabel: string;
  fields?: Record<string, string>;
  quiet?: boolean;
}) {
  const [state, formAction, pending] = useActionState(action, {});
  return (
    <form action={formAction} className="inline-flex items-center gap-2">
      {Object.entries(fields).map(([name, value]) => (
        <input key={name} type="hidden" name={name} value={value} />
      ))}
      <BusyButton
        type="submit"
        className={quiet ? 'gw-button-quiet px-2.5 py-1 text-xs' : 'gw-button'}
        busy={pending}
        busyLabel={busyLabel}
      >
        {label}
      </BusyButton>
      <span
        role="status"
        aria-live="polite"
        className={`text-xs ${state.ok ? 'text-signal-pass' : 'text-signal-fail'}`}
      >
        {state.message}
      </span>
    </form>
  );
}
