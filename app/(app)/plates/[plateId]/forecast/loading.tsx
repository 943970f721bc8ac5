export default function ForecastLoading() {
  return (
    <div role="status" aria-live="polite" className="space-y-3">
      <div className="h-6 w-56 animate-pulse rounded bg-ink-100" />
      <div className="h-16 animate-pulse rounded-lg bg-ink-100" />
      <div className="grid gap-4 lg:grid-cols-[13rem_1fr]">
        <div className="h-64 animate-pulse rounded-lg bg-ink-100" />
        <div className="h-64 animate-pulse rounded-lg bg-ink-100" />
      </div>
      <span className="sr-only">Loading the forecast…</span>
    </div>
  );
}
