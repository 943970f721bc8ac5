import type { InputHTMLAttributes } from 'react';
import { BusyButton } from '@/components/ui/busy-button';

/** A labelled input with its error messages in an aria-live region beside it. */
export function Field({
  label,
  name,
  errors,
  hint,
  ...input
}: InputHTMLAttributes<HTMLInputElement> & {
  label: string;
  name: string;
  errors?: string[] | undefined;
  hint?: string;
}) {
  const id = input.id ?? `field-${name}`;
  return (
    <div>
      <label htmlFor={id} className="gw-label">
        {label}
      </label>
      {hint ? (
        <p id={`${id}-hint`} className="text-xs text-ink-500">
          {hint}
        </p>
      ) : null}
      <input
        id={id}
        name={name}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={`${hint ? `${id}-hint ` : ''}${id}-error`}
        className="gw-input mt-1"
        {...input}
      />
      <p id={`${id}-error`} aria-live="polite" className="mt-1 min-h-4 text-xs text-signal-fail">
        {errors?.join(' ')}
      </p>
    </div>
  );
}

/** The whole-form message of an action: success in green, failure in red, announced politely. */
export function FormMessage({ ok, message }: { ok?: boolean | undefined; message?: string | undefined }) {
  return (
    <p
      role="status"
      aria-live="polite"
      className={`min-h-5 text-sm font-medium ${ok ? 'text-signal-pass' : 'text-signal-fail'}`}
    >
      {message}
    </p>
  );
}

/** A form's submit button, saying `pendingLabel` while the action runs, with the action's message beside it. */
export function SubmitRow({
  label,
  pendingLabel,
  pending,
  state,
  className,
}: {
  label: string;
  pendingLabel: string;
  pending: boolean;
  state: { ok?: boolean | undefined; message?: string | undefined };
  /** The row's layout classes. */
  className: string;
}) {
  return (
    <div className={className}>
      <BusyButton type="submit" busy={pending} busyLabel={pendingLabel}>
        {label}
      </BusyButton>
      <FormMessage ok={state.ok} message={state.message} />
    </div>
  );
}
