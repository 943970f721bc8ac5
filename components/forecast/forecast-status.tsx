import type { ReactNode } from 'react';

/** A forecast that could not be computed, with a retry. */
export function ForecastFailed({ message, onRetry }: { message: string; onRetry: () => void }) {
  return (
    <div role="alert" className="gw-card border-l-4 border-l-signal-fail p-4 text-sm">
      The forecast could not be computed: {message}{' '}
      <button type="button" className="gw-button-quiet ml-2" onClick={onRetry}>
        Try again
      </button>
    </div>
  );
}

/** A forecast being computed: what is under way, announced politely, with a progress bar. */
export function ForecastComputing({ children }: { children: ReactNode }) {
  return (
    <div role="status" aria-live="polite" className="gw-card p-5 text-sm text-ink-700">
      <p>{children}</p>
      <div className="mt-3 h-1.5 overflow-hidden rounded bg-ink-100">
        <div className="h-full w-1/3 animate-pulse rounded bg-lagoon-500" />
      </div>
    </div>
  );
}
