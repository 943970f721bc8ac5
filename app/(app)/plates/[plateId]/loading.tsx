// The plate's header and tabs come from the layout above, which answers 404 for a plate that does not
// exist before anything streams; this fallback stands in for the tab's body while it renders.
export default function PlateTabLoading() {
  return (
    <div role="status" aria-live="polite" className="space-y-3">
      <div className="h-7 w-48 animate-pulse rounded bg-ink-100" />
      <div className="h-40 animate-pulse rounded-lg bg-ink-100" />
      <span className="sr-only">Loading…</span>
    </div>
  );
}
