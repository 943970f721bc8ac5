'use client';

export default function CompoundProfileError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <div role="alert" className="gw-card max-w-xl p-6">
      <h1 className="text-xl font-semibold">The compound profile could not be shown</h1>
      <p className="mt-2 text-sm text-ink-700">
        Something failed on the server; nothing was changed. Try again; if it keeps failing, give your administrator this
        reference: <span className="font-mono">{error.digest ?? 'none'}</span>.
      </p>
      <button type="button" onClick={reset} className="gw-button mt-4">Try again</button>
    </div>
  );
}
