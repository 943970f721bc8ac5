'use client';

/** What a route's error boundary shows: what failed, that nothing changed, a reference, and a retry that fetches the route again. */
export function RouteError({
  what,
  error,
  retry,
  heading = 'h1',
}: {
  what: string;
  error: Error & { digest?: string };
  retry: () => void;
  heading?: 'h1' | 'h2';
}) {
  const Heading = heading;
  return (
    <div role="alert" className="gw-card max-w-xl p-6">
      <Heading className="text-xl font-semibold">{what} could not be shown</Heading>
      <p className="mt-2 text-sm text-ink-700">
        Something failed on the server; nothing was changed. Try again; if it keeps failing, give your
        administrator this reference: <span className="font-mono">{error.digest ?? 'none'}</span>.
      </p>
      <button type="button" onClick={retry} className="gw-button mt-4">
        Try again
      </button>
    </div>
  );
}
