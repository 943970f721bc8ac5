import type { UseDependence } from '@/lib/compounds/profile-fits';
import { READOUT_RATIO_MEANING, readoutText } from '@/lib/domain/fits';

const sig = (v: number | null) => (v === null ? '—' : Number(v.toPrecision(3)).toString());

function ic50Text(f: UseDependence['tonic']): string {
  if (f.status === 'fitted') return `${sig(f.ic50_uM)} µM`;
  if (f.ic50LowerBound_uM !== null) return `> ${sig(f.ic50LowerBound_uM)} µM`;
  return 'no IC50';
}

/**
 * Per target whose standing plate read block at two moments: the tonic and the use-dependent IC50 and
 * their ratio (tonic ÷ use-dependent; above 1 the compound blocks more as the channel is used).
 */
export function UseDependenceList({ pairs }: { pairs: UseDependence[] }) {
  return (
    <div className="space-y-3">
      <p className="max-w-3xl text-sm text-ink-700">{READOUT_RATIO_MEANING}</p>
      <ul className="grid gap-3 sm:grid-cols-2 xl:grid-cols-3">
        {pairs.map((p) => (
          <li key={p.tonic.fitId} className="gw-card p-4" data-testid="use-dependence">
            <p className="text-sm text-ink-500">
              {p.tonic.target}: IC50 {readoutText('tonic', p.tonic.readoutName)} ÷ IC50{' '}
              {readoutText('use_dependent', p.useDependent.readoutName)}
            </p>
            <p className="mt-1 text-xl font-semibold tabular-nums">
              {p.ratio === null ? 'Not determined' : sig(p.ratio)}
            </p>
            <p className="mt-1 text-sm text-ink-700">
              {ic50Text(p.tonic)} ÷ {ic50Text(p.useDependent)} on plate {p.tonic.plateLabel}
            </p>
            <p className={`mt-1 text-xs ${p.tonic.approved ? 'text-signal-pass' : 'text-signal-warn'}`}>
              {p.tonic.approved ? 'From an approved plate' : 'From a plate not yet approved'}
            </p>
          </li>
        ))}
      </ul>
    </div>
  );
}
