import { AppLink } from '@/components/ui/app-link';
import { StateBadge } from '@/components/ui/state-badge';
import type { ProfileFit } from '@/lib/compounds/profile-fits';
import { readoutText } from '@/lib/domain/fits';

const STATUS_TEXT: Record<ProfileFit['status'], string> = {
  fitted: 'Fitted',
  above_range: 'Above tested range',
  inactive: 'Inactive',
  insufficient: 'Too few concentrations',
  not_converged: 'Did not converge',
};

const sig = (v: number | null) => (v === null ? '—' : Number(v.toPrecision(3)).toString());

function ic50Text(f: ProfileFit): string {
  if (f.status === 'fitted') return `${sig(f.ic50_uM)} µM (${sig(f.ic50CiLow_uM)}–${sig(f.ic50CiHigh_uM)})`;
  if (f.ic50LowerBound_uM !== null) return `> ${sig(f.ic50LowerBound_uM)} µM`;
  return '—';
}

/** Every fit of the compound: plate and state (approved or not yet), target, IC50 with 95 % CI, Hill slope, status. */
export function ProfileFitsTable({ fits, standing }: { fits: ProfileFit[]; standing: Set<string> }) {
  return (
    <div className="gw-card overflow-x-auto">
      <table className="min-w-full text-sm">
        <caption className="sr-only">Fits of the compound across plates and screens</caption>
        <thead className="text-left text-xs text-ink-700">
          <tr className="border-b border-ink-100 bg-ink-100/60">
            {[
              'Plate',
              'Screen',
              'State',
              'Target',
              'IC50 (95 % CI)',
              'Hill slope',
              'R²',
              'Wells',
              'Status',
              'In the profile',
            ].map((h) => (
              <th
                key={h}
                scope="col"
                className={`px-3 py-2.5 font-semibold ${['IC50 (95 % CI)', 'Hill slope', 'R²', 'Wells'].includes(h) ? 'text-right' : ''}`}
              >
                {h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody className="divide-y divide-ink-100">
          {fits.map((f) => (
            <tr key={f.fitId} className={f.approved ? '' : 'bg-paper/60'}>
              <th scope="row" className="px-3 py-2 text-left font-mono font-medium whitespace-nowrap">
                <AppLink className="text-lagoon-700 underline" href={`/plates/${f.plateId}/fits`}>
                  {f.plateLabel}
                </AppLink>
              </th>
              <td className="px-3 py-2">{f.screenName}</td>
              <td className="px-3 py-2 whitespace-nowrap">
                <StateBadge state={f.plateState} />
                {f.approved ? null : (
                  <span className="ml-1.5 text-xs text-signal-warn">not yet approved</span>
                )}
              </td>
              <td className="px-3 py-2">
                {f.target} <span className="font-mono text-xs text-ink-500">{f.conductance}</span>
                {f.readoutName !== null || f.readout !== 'tonic' ? (
                  <span className="block text-xs text-ink-500">
                    {readoutText(f.readout, f.readoutName)} block
                  </span>
                ) : null}
              </td>
              <td className="px-3 py-2 text-right tabular-nums whitespace-nowrap">{ic50Text(f)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{sig(f.hill)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{sig(f.r2)}</td>
              <td className="px-3 py-2 text-right tabular-nums">{f.n}</td>
              <td className="px-3 py-2" title={f.message}>
                {STATUS_TEXT[f.status]}
              </td>
              <td className="px-3 py-2 text-xs">
                {standing.has(f.fitId) ? (
                  <span className="font-semibold text-lagoon-700">Stands for {f.target}</span>
                ) : (
                  <span className="text-ink-500">—</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
