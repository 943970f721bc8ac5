import type { BandView, CompoundForecast, ConditionView } from '@/lib/validation/forecasts';
import { relativeText, sig } from './forecast-format';
import { umText } from './series-colors';

function Value({ c, measure }: { c: ConditionView; measure: 'referenceRate_Hz' | 'rheobase_uA_cm2' }) {
  const value = c.measures[measure];
  const band: BandView | undefined = c.band?.[measure];
  return (
    <td className="px-3 py-2 text-right tabular-nums">
      <span className="block">
        {value === null ? (measure === 'rheobase_uA_cm2' ? 'no firing' : '—') : sig(value)}
      </span>
      <span className="block text-xs text-ink-500">{relativeText(c.shifts[measure].relative)}</span>
      {band && band.low !== null ? (
        <span className="block text-xs whitespace-nowrap text-ink-500" title="2.5–97.5 % over the draws">
          95 %: {sig(band.low)} to {band.high === null ? 'no firing' : sig(band.high)}
        </span>
      ) : null}
      {c.band?.nearTransition ? (
        <span className="block text-xs font-medium whitespace-nowrap text-signal-warn">
          Near a firing transition
        </span>
      ) : null}
    </td>
  );
}

/**
 * The forecast twice at each exposure: tonic block only, and state-dependent block (modulated receptor:
 * the tonic IC50 as the resting affinity Kr, the use-dependent IC50 as the inactivated affinity Ki).
 * Without a use-dependent fit that enters it, says why there is no second case.
 */
export function BlockModesTable({ data }: { data: CompoundForecast }) {
  const notes = data.targets.flatMap((t) =>
    t.stateDependence ? [`${t.target} (${t.conductance}): ${t.stateDependence.note}`] : [],
  );
  if (notes.length === 0) return null;
  const tonic = data.forecast;
  const state = data.stateDependent;
  return (
    <section aria-labelledby={`block-modes-${data.compoundId}`} className="space-y-2">
      <h3 id={`block-modes-${data.compoundId}`} className="text-sm font-semibold text-ink-900">
        Tonic and state-dependent block
      </h3>
      <p className="text-xs text-ink-500">
        Modulated-receptor steady state (Bean, Cohen &amp; Tsien 1983): a blocker that binds inactivated
        channels (Ki below Kr) shifts Na inactivation by ΔV½ = k·ln[(1 + D/Kr)/(1 + D/Ki)] and blocks more the
        more the cell depolarises and fires. {notes.join(' ')}
      </p>
      {!tonic || !state ? (
        <p className="text-sm text-ink-700" data-testid="block-modes-none">
          No state-dependent forecast: no used potency has a use-dependent IC50 that enters it.
        </p>
      ) : (
        <div className="gw-card overflow-x-auto">
          <table
            className="min-w-full text-sm"
            aria-label="Forecast with tonic and with state-dependent block"
          >
            <thead className="text-left text-xs text-ink-500">
              <tr>
                <th scope="col" className="px-3 py-2">
                  Exposure
                </th>
                <th scope="col" className="px-3 py-2 text-right">
                  Rate, tonic only (Hz)
                </th>
                <th scope="col" className="px-3 py-2 text-right">
                  Rate, state-dependent (Hz)
                </th>
                <th scope="col" className="px-3 py-2 text-right">
                  Rheobase, tonic only (µA/cm²)
                </th>
                <th scope="col" className="px-3 py-2 text-right">
                  Rheobase, state-dependent (µA/cm²)
                </th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ink-100">
              {[tonic.control, ...tonic.conditions.filter((c) => c.exposure)].map((c) => {
                const s =
                  c === tonic.control
                    ? state.control
                    : state.conditions.find((x) => x.concentration_uM === c.concentration_uM);
                if (!s) return null;
                return (
                  <tr key={c.concentration_uM} data-testid="block-modes-row">
                    <th scope="row" className="px-3 py-2 text-left font-medium whitespace-nowrap">
                      {c === tonic.control ? 'Control' : umText(c.concentration_uM)}
                    </th>
                    <Value c={c} measure="referenceRate_Hz" />
                    <Value c={s} measure="referenceRate_Hz" />
                    <Value c={c} measure="rheobase_uA_cm2" />
                    <Value c={s} measure="rheobase_uA_cm2" />
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
      {state?.bands ? (
        <p className="text-xs text-ink-500" data-testid="block-modes-transition">
          State-dependent firing transition:{' '}
          {state.bands.transition?.status === 'found' && state.bands.transition.concentration_uM !== null
            ? `stops firing repetitively from ${sig(state.bands.transition.concentration_uM)} µM.`
            : (state.bands.transition?.note ?? 'not found for this stored forecast.')}
        </p>
      ) : null}
    </section>
  );
}
