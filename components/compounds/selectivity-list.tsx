import type { SelectivityRatio } from '@/lib/compounds/selectivity';

/** IC50 ratios between the compound's targets, bounds where an IC50 lies above the tested range. */
export function SelectivityList({
  ratios,
  targetCount,
}: {
  ratios: SelectivityRatio[];
  targetCount: number;
}) {
  if (ratios.length === 0) {
    return (
      <p className="gw-card border-dashed p-5 text-sm text-ink-700">
        {targetCount < 2
          ? 'Selectivity needs a potency on at least two targets. Import a plate of another screen (for example the counter-screen) that holds this compound.'
          : 'No two targets have a potency to compare: fits that did not converge or had too few concentrations give no ratio.'}
      </p>
    );
  }
  return (
    <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
      {ratios.map((r) => (
        <li key={r.text} className="gw-card p-4">
          <p className="text-sm text-ink-500">
            IC50 {r.numerator} ÷ IC50 {r.denominator}
          </p>
          <p className="mt-1 text-xl font-semibold tabular-nums">
            {r.relation === 'undetermined'
              ? 'Not determined'
              : `${r.relation === '>' ? '> ' : ''}${Number(r.ratio!.toPrecision(3))}`}
          </p>
          <p className="mt-1 text-sm text-ink-700">
            {r.meaning.charAt(0).toUpperCase() + r.meaning.slice(1)}.
          </p>
          <p className={`mt-1 text-xs ${r.approved ? 'text-signal-pass' : 'text-signal-warn'}`}>
            {r.approved
              ? 'Both potencies from approved plates'
              : 'Uses a potency from a plate not yet approved'}
          </p>
        </li>
      ))}
    </ul>
  );
}
