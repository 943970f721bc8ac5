import { FORECAST_CAUTION } from '@/lib/science/forecast/assemble';

/** The research-use caution, wherever forecasts are shown (DESIGN.md, Cautions). */
export function ForecastCaution({ preset }: { preset?: string }) {
  return (
    <aside
      role="note"
      aria-label="Caution"
      className="rounded-md border-l-4 border-signal-warn bg-amber-50 px-4 py-3 text-sm text-ink-900"
    >
      <p className="font-semibold">Research decision support, not a safety determination.</p>
      <p className="mt-0.5 text-ink-700">
        {FORECAST_CAUTION} The forecast runs a single-compartment neuron model
        {preset ? (
          <>
            {' '}
            (preset <span className="font-mono">{preset}</span>)
          </>
        ) : null}{' '}
        with simple pore block of each target’s fitted IC50 and Hill slope.
      </p>
    </aside>
  );
}
