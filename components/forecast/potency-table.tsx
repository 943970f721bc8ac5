import { AppLink } from '@/components/ui/app-link';
import type { TargetPotency } from '@/lib/validation/forecasts';
import { percent, sig } from './forecast-format';
import { umText } from './series-colors';

const STATE_TEXT: Record<string, string> = {
  approved: 'approved',
  imported: 'not yet approved',
  verified: 'not yet approved',
  submitted: 'not yet approved',
  rejected: 'returned, not approved',
};

/** Each target's potency as the forecast uses it, the block at every exposure, and what was done with it. */
export function PotencyTable({
  targets,
  exposures_uM,
  showPlate,
}: {
  targets: TargetPotency[];
  exposures_uM: number[];
  showPlate?: boolean;
}) {
  return (
    <div className="gw-card overflow-x-auto">
      <table className="min-w-full text-sm">
        <caption className="px-4 pt-3 text-left text-sm font-semibold text-ink-900">
          Block of each target at the exposures
        </caption>
        <thead className="text-left text-xs text-ink-700">
          <tr className="border-b border-ink-100">
            <th scope="col" className="px-4 py-2">
              Target
            </th>
            <th scope="col" className="px-4 py-2 text-right">
              IC50
            </th>
            <th scope="col" className="px-4 py-2 text-right">
              Hill slope
            </th>
            {exposures_uM.map((c) => (
              <th key={c} scope="col" className="px-4 py-2 text-right">
                Block at {umText(c)}
              </th>
            ))}
            <th scope="col" className="px-4 py-2">
              How the forecast uses it
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100">
          {targets.map((t) => (
            <tr key={t.targetId}>
              <th scope="row" className="px-4 py-2 text-left font-medium">
                {t.target} <span className="font-mono text-xs text-ink-500">{t.conductance}</span>
              </th>
              <td className="px-4 py-2 text-right tabular-nums">
                {t.ic50_uM !== null
                  ? `${sig(t.ic50_uM)} µM`
                  : t.ic50LowerBound_uM !== null
                    ? `> ${sig(t.ic50LowerBound_uM)} µM`
                    : '—'}
              </td>
              <td className="px-4 py-2 text-right tabular-nums">{sig(t.hill)}</td>
              {t.blockAtExposures.map((b, i) => (
                <td key={exposures_uM[i]} className="px-4 py-2 text-right tabular-nums">
                  {t.use === 'used' ? percent(b) : 'none'}
                </td>
              ))}
              <td className={`px-4 py-2 ${t.use === 'used' ? 'text-ink-800' : 'text-signal-warn'}`}>
                {t.note}
                {showPlate && t.plate ? (
                  <span className="block text-xs text-ink-500">
                    From plate{' '}
                    <AppLink className="underline" href={`/plates/${t.plate.id}/fits`}>
                      {t.plate.label}
                    </AppLink>{' '}
                    ({STATE_TEXT[t.plate.state] ?? t.plate.state})
                  </span>
                ) : null}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
