/** A generated password, shown to the admin this once so that they can hand it over in person. */
export function OneTimePassword({ password, who }: { password: string; who: string }) {
  return (
    <div role="status" className="rounded-md border border-amber-300 bg-amber-50 p-4 text-sm">
      <p className="font-medium text-ink-950">Password for {who}</p>
      <p className="mt-2">
        <code
          data-testid="one-time-password"
          className="select-all rounded bg-white px-2 py-1 font-mono text-base tracking-wide"
        >
          {password}
        </code>
      </p>
      <p className="mt-2 text-ink-700">
        Give it to them now in person or by phone. Gatewell keeps only its hash and will not show it again.
      </p>
    </div>
  );
}
