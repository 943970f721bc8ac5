import type { ButtonHTMLAttributes, ReactNode } from 'react';

/**
 * A button that starts work: while `busy` it is disabled, says what it is doing (`busyLabel`) beside a
 * spinner, and is marked aria-busy, until the work ends.
 */
export function BusyButton({
  busy,
  busyLabel,
  children,
  disabled,
  className = 'gw-button',
  ...button
}: ButtonHTMLAttributes<HTMLButtonElement> & { busy: boolean; busyLabel: string; children: ReactNode }) {
  return (
    <button
      type="button"
      {...button}
      className={`${className} inline-flex items-center gap-2`}
      disabled={busy || disabled}
      aria-busy={busy || undefined}
    >
      {busy ? (
        <span
          aria-hidden="true"
          className="size-3 animate-spin rounded-full border-2 border-current border-t-transparent"
        />
      ) : null}
      {busy ? busyLabel : children}
    </button>
  );
}
