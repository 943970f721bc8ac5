import type { PlateHeader } from '@/lib/plates/detail';

/**
 * Z′ per target against the screen's limit, with notes on run-down correction and normalisation, and the
 * QC rules not applied because the file carried no readout for them.
 */
export function QcSummary({ header }: { header: PlateHeader }) {
  if (!header.qcSummary.length) return null;
  // The same rules for every target (they read the wells' recording properties): shown once.
  const notApplied = [
    ...new Map(header.qcSummary.flatMap((t) => t.qcRulesNotApplied ?? []).map((r) => [r.rule, r])).values(),
  ];
  return (
    <section aria-labelledby="qc-heading" className="space-y-2">
      <h2 id="qc-heading" className="text-lg font-semibold">
        Plate QC
      </h2>
      {notApplied.length ? (
        <div
          aria-labelledby="qc-not-applied-heading"
          role="note"
          className="rounded-md border border-amber-200 bg-amber-50 p-3 text-sm"
        >
          <h3 id="qc-not-applied-heading" className="font-semibold text-signal-warn">
            QC rules not applied
          </h3>
          <ul className="mt-1 space-y-1 text-ink-700">
            {notApplied.map((r) => (
              <li key={r.rule}>{r.message}</li>
            ))}
          </ul>
        </div>
      ) : null}
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
        {header.qcSummary.map((t) => {
          const name = header.targets.find((x) => x.id === t.target)?.name ?? t.target;
          const z = t.zPrime;
          return (
            <div
              key={t.target}
              className={`gw-card border-l-4 p-4 ${z.passes ? 'border-l-signal-pass' : 'border-l-signal-fail'}`}
            >
              <p className="text-sm font-medium">{name}</p>
              <p className="mt-1 text-2xl font-semibold tabular-nums">
                Z′ {z.zPrime === null ? '—' : z.zPrime.toFixed(2)}
              </p>
              <p className={`text-sm font-medium ${z.passes ? 'text-signal-pass' : 'text-signal-fail'}`}>
                {z.passes ? 'Passes' : 'Fails'} the screen limit of {header.zPrimeMin}
                {z.band ? ` · ${z.band}` : ''}
              </p>
              {/* With a value, the lines above say what the message says; without one, it says why. */}
              {z.zPrime === null ? <p className="mt-1 text-xs text-ink-700">{z.message}</p> : null}
              <p className="mt-1 text-xs text-ink-500">
                {t.rundownCorrected
                  ? `Run-down corrected (vehicle ratio ${t.vehicleMeanRatio?.toFixed(3)})`
                  : 'No run-down correction'}
                {t.normalised ? ' · normalised to vehicle and reference' : ''}
              </p>
              {t.notes.map((n) => (
                <p key={n.code} className="mt-1 text-xs text-signal-warn">
                  {n.message}
                </p>
              ))}
            </div>
          );
        })}
      </div>
    </section>
  );
}
