export default function CompoundProfileLoading() {
  return (
    <div role="status" aria-live="polite" className="space-y-3">
      <div className="h-7 w-56 animate-pulse rounded bg-ink-100" />
      <div className="h-32 animate-pulse rounded-lg bg-ink-100" />
      <div className="h-24 animate-pulse rounded-lg bg-ink-100" />
      <span className="sr-only">Loading the compound profile…</span>
    </div>
  );
}
