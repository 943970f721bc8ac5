import type { CompoundForecast, TransitionView } from '@/lib/validation/forecasts';
import { BlockModesTable } from './block-modes-table';
import { FiPlot } from './fi-plot';
import { MeasuresTable } from './measures-table';
import { PotencyTable } from './potency-table';
import { TargetMapping } from './target-mapping';
import { exposureColors, umText } from './series-colors';
import { SweepPlot } from './sweep-plot';
import { TracePlot } from './trace-plot';

const when = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });

/** The exposure whose traces are shown, as a radio group (arrow keys move between exposures). */
function ExposureChoice({
  name,
  exposures_uM,
  at,
  onAt,
  busy,
}: {
  name: string;
  exposures_uM: number[];
  at: number;
  onAt: (at: number) => void;
  busy: boolean;
}) {
  return (
    <fieldset className="flex flex-wrap items-center gap-x-4 gap-y-2 text-sm">
      <legend className="mb-1 w-full text-sm font-medium text-ink-800">Compound trace at</legend>
      {exposures_uM.map((c, i) => (
        <label key={c} className="inline-flex items-center gap-1.5">
          <input
            type="radio"
            name={name}
            checked={at === i}
            onChange={() => onAt(i)}
            className="accent-lagoon-700"
          />
          {umText(c)}
        </label>
      ))}
      <span role="status" aria-live="polite" className="text-xs text-ink-500">
        {busy ? 'Computing the traces…' : ''}
      </span>
    </fieldset>
  );
}

/** A compound's forecast: potencies, measures beside control, traces, f–I curves and the concentration sweep. */
export function ForecastDetail({
  data,
  at,
  onAt,
  busy,
  showPlate,
}: {
  data: CompoundForecast;
  at: number;
  onAt: (at: number) => void;
  busy: boolean;
  showPlate?: boolean;
}) {
  const f = data.forecast;
  const exposures = f ? f.conditions.filter((c) => c.exposure) : [];
  const colors = exposureColors(data.exposures_uM.length);
  return (
    <div className="space-y-5">
      <TargetMapping preset={data.preset} targets={data.targets} />
      <PotencyTable targets={data.targets} exposures_uM={data.exposures_uM} showPlate={showPlate} />
      {!f ? (
        <p className="gw-card border-dashed p-5 text-sm text-ink-700">{data.reason}</p>
      ) : (
        <>
          <p className="text-xs text-ink-500">
            {f.preset.title} ({f.preset.reference}).{' '}
            {f.reused ? 'Stored forecast' : 'Computed now and stored'}, {when.format(new Date(f.computedAt))}{' '}
            UTC · input{' '}
            <span className="font-mono" title={`SHA-256 of the input: ${f.inputSha256}`}>
              {f.inputSha256.slice(0, 12)}…
            </span>
          </p>
          {f.bands ? (
            <p className="text-xs text-ink-500" data-testid="forecast-band-note">
              Bands: 95 % over {f.bands.draws} draws (seed {f.bands.seed}). {f.bands.method}{' '}
              {f.bands.sources.map((s) => `${s.conductance}: ${s.note}`).join(' ')}
            </p>
          ) : (
            <p className="text-xs text-ink-500">
              No uncertainty bands: this forecast was stored before Gatewell computed them.
            </p>
          )}
          {f.bands ? <TransitionNote transition={f.bands.transition} /> : null}
          <MeasuresTable
            control={f.control}
            conditions={f.conditions}
            referenceDrive={f.referenceDrive_uA_cm2}
            protocol={f.protocol}
          />
          <BlockModesTable data={data} />
          <ExposureChoice
            name={`trace-at-${data.compoundId}`}
            exposures_uM={data.exposures_uM}
            at={at}
            onAt={onAt}
            busy={busy}
          />
          <div className="grid gap-4 md:grid-cols-2">
            <div className="md:col-span-2">
              {f.traces ? (
                <TracePlot traces={f.traces} compound={data.compound} color={colors[at] ?? colors.at(-1)!} />
              ) : (
                <p className="text-sm text-ink-700">No traces: the control cell has no reference drive.</p>
              )}
            </div>
            <FiPlot
              control={f.control}
              exposures={exposures}
              chosen_uM={f.traces?.concentration_uM ?? null}
            />
            <SweepPlot measure="rheobase" control={f.control} conditions={f.conditions} />
            <SweepPlot measure="rate" control={f.control} conditions={f.conditions} />
          </div>
        </>
      )}
    </div>
  );
}

const sig3 = (v: number) => Number(v.toPrecision(3)).toString();

/** Where the compound stops the cell firing repetitively at the reference drive, with its band. */
function TransitionNote({ transition: t }: { transition: TransitionView | null }) {
  return (
    <p className="text-sm text-ink-700" data-testid="forecast-transition">
      <span className="font-medium">Firing transition: </span>
      {!t
        ? 'not found for this stored forecast.'
        : t.status !== 'found' || t.concentration_uM === null
          ? `none. ${t.note}`
          : `stops firing repetitively at the reference drive from ${sig3(t.concentration_uM)} µM${
              t.band ? ` (95 %: ${sig3(t.band.low)}–${sig3(t.band.high)} µM)` : ''
            }, block ${Object.entries(t.block ?? {})
              .map(([g, b]) => `${g} ${(b * 100).toFixed(1)} %`)
              .join(
                ', ',
              )}. Exposures marked “near a firing transition” may flip between firing and silence within their uncertainty.`}
    </p>
  );
}
