'use client';

export default function ForecastError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="gw-card max-w-xl p-6">
      <h2 className="text-lg font-semibold">The forecast tab could not be shown</h2>
      <p className="mt-2 text-sm text-ink-700">
        Something failed on the server; nothing was changed. Try again; if it keeps failing, give your administrator this
        reference: <span className="font-mono">{error.digest ?? 'none'}</span>.
      </p>
      <button type="button" onClick={reset} className="gw-button mt-4">Try again</button>
    </div>
  );
}
