import type { BandView, ConditionView, ForecastView } from '@/lib/validation/forecasts';
import { blockText, deltaText, flagText, relativeText, sig } from './forecast-format';
import { umText } from './series-colors';

function Cell({
  value,
  change,
  warn,
  band,
}: {
  value: string;
  change: string;
  warn?: boolean;
  band?: BandView | null;
}) {
  return (
    <td className="px-3 py-2 text-right tabular-nums">
      <span className="block">{value}</span>
      {change ? (
        <span className={`block text-xs ${warn ? 'text-signal-warn' : 'text-ink-500'}`}>{change}</span>
      ) : null}
      {band && band.low !== null ? (
        <span className="block text-xs whitespace-nowrap text-ink-500" title="2.5–97.5 % over the draws">
          95 %: {sig(band.low)} to {band.high === null ? 'no firing' : sig(band.high)}
        </span>
      ) : null}
    </td>
  );
}

function Row({ c, name }: { c: ConditionView; name: string }) {
  const s = c.shifts;
  const big = (v: number | null) => v !== null && Math.abs(v) >= 0.1;
  return (
    <tr>
      <th scope="row" className="px-3 py-2 text-left font-medium whitespace-nowrap">
        {name}
      </th>
      <td className="px-3 py-2 whitespace-nowrap text-ink-700">{blockText(c)}</td>
      <Cell value={sig(c.measures.rest_mV)} change={deltaText(s.rest_mV.delta, 'mV')} />
      <Cell
        value={c.measures.rheobase_uA_cm2 === null ? 'no firing' : sig(c.measures.rheobase_uA_cm2)}
        change={relativeText(s.rheobase_uA_cm2.relative)}
        warn={big(s.rheobase_uA_cm2.relative)}
        band={c.band?.rheobase_uA_cm2}
      />
      <Cell
        value={sig(c.measures.threshold_mV)}
        change={deltaText(s.threshold_mV.delta, 'mV')}
        band={c.band?.threshold_mV}
      />
      <Cell
        value={sig(c.measures.referenceRate_Hz)}
        change={relativeText(s.referenceRate_Hz.relative)}
        warn={big(s.referenceRate_Hz.relative)}
        band={c.band?.referenceRate_Hz}
      />
      <td
        className={`px-3 py-2 ${c.measures.flags.length ? 'font-medium text-signal-fail' : 'text-ink-500'}`}
      >
        {flagText(c.measures.flags)}
        {c.band?.nearTransition ? (
          <span
            className="mt-1 block text-xs font-medium whitespace-nowrap text-signal-warn"
            data-testid="near-transition"
            title="The firing transition's band covers this concentration, or the rate changes by more than half within its band"
          >
            Near a firing transition
          </span>
        ) : null}
      </td>
    </tr>
  );
}

/**
 * Rest, rheobase, threshold and rate at the reference drive, each beside control with its change
 * (relative for rheobase and rate, in mV for voltages); the sweep's other concentrations fold away.
 */
export function MeasuresTable({
  control,
  conditions,
  referenceDrive,
  protocol,
}: {
  control: ConditionView;
  conditions: ConditionView[];
  referenceDrive: number | null;
  protocol: ForecastView['protocol'];
}) {
  const drive = referenceDrive === null ? 'the reference drive' : `${sig(referenceDrive)} µA/cm²`;
  const head = (
    <thead className="text-left text-xs text-ink-700">
      <tr className="border-b border-ink-100">
        <th scope="col" className="px-3 py-2">
          Condition
        </th>
        <th scope="col" className="px-3 py-2">
          Block
        </th>
        <th scope="col" className="px-3 py-2 text-right">
          Rest (mV)
        </th>
        <th scope="col" className="px-3 py-2 text-right">
          Rheobase (µA/cm²)
        </th>
        <th scope="col" className="px-3 py-2 text-right">
          Threshold (mV)
        </th>
        <th scope="col" className="px-3 py-2 text-right">
          Rate at {drive} (Hz)
        </th>
        <th scope="col" className="px-3 py-2">
          Flags
        </th>
      </tr>
    </thead>
  );
  const sweep = conditions.filter((c) => !c.exposure);
  return (
    <div className="gw-card overflow-x-auto">
      <table className="min-w-full text-sm">
        <caption className="px-3 pt-3 text-left text-sm font-semibold text-ink-900">
          Excitability beside control at each exposure
        </caption>
        {head}
        <tbody className="divide-y divide-ink-100">
          <Row c={control} name="Control" />
          {conditions
            .filter((c) => c.exposure)
            .map((c) => (
              <Row key={c.concentration_uM} c={c} name={umText(c.concentration_uM)} />
            ))}
        </tbody>
      </table>
      <p className="px-3 pb-2 text-xs text-ink-500">
        Rheobase: the smallest {protocol.rheobaseStep_ms} ms step that gives a spike. Threshold: where dV/dt
        first exceeds {protocol.thresholdSlope_mV_ms} mV/ms. Rate: over the last half of a{' '}
        {protocol.rateStep_ms} ms step at {protocol.referenceDriveFactor} × the control rheobase; 0 Hz when
        the cell stops firing during the step. Changes are relative for rheobase and rate, in mV for voltages.
      </p>
      {sweep.length ? (
        <details className="border-t border-ink-100 px-3 py-2 text-sm">
          <summary className="cursor-pointer text-lagoon-700">
            Every concentration of the sweep ({conditions.length})
          </summary>
          <table className="mt-2 min-w-full text-sm">
            <caption className="sr-only">Excitability at every concentration of the sweep</caption>
            {head}
            <tbody className="divide-y divide-ink-100">
              {conditions.map((c) => (
                <Row
                  key={c.concentration_uM}
                  c={c}
                  name={`${umText(c.concentration_uM)}${c.exposure ? ' (exposure)' : ''}`}
                />
              ))}
            </tbody>
          </table>
        </details>
      ) : null}
    </div>
  );
}
