import 'server-only';
import type { CompoundForecast, ConditionView, TransitionView } from '@/lib/validation/forecasts';
import type { Cell, ExportTable } from './document';

const round = (v: number | null, digits = 4): number | null =>
  v === null ? null : Number(v.toPrecision(digits));
const pct = (v: number | null): number | null => (v === null ? null : Number((v * 100).toFixed(2)));

const FLAG_WORDS: Record<string, string> = {
  'loss-of-firing': 'loss of firing',
  'depolarisation-block': 'depolarisation block',
  'firing-stops': 'firing stops during the step',
  'spontaneous-firing': 'fires at rest',
  'no-stable-rest': 'no stable rest',
};

export const FORECAST_COLUMNS = [
  'Compound',
  'Screen',
  'Neuron preset',
  'Condition',
  'Concentration (µM)',
  'Block mode',
  'Block (%)',
  'Rest (mV)',
  'Rheobase (µA/cm²)',
  'Rheobase change (%)',
  'Threshold (mV)',
  'Threshold change (mV)',
  'Reference drive (µA/cm²)',
  'Rate at reference drive (Hz)',
  'Rate change (%)',
  'Rheobase median (µA/cm²)',
  'Rheobase 2.5 % (µA/cm²)',
  'Rheobase 97.5 % (µA/cm²)',
  'Threshold median (mV)',
  'Threshold 2.5 % (mV)',
  'Threshold 97.5 % (mV)',
  'Rate median (Hz)',
  'Rate 2.5 % (Hz)',
  'Rate 97.5 % (Hz)',
  'Band draws',
  'Band notes',
  'Flags',
  'Potencies used',
  'Forecast input SHA-256',
] as const;

/** Median, 2.5 % and 97.5 % of rheobase, threshold and rate (empty without a band; a rheobase quantile beyond the search ceiling is written as such). */
function bandCells(c: ConditionView): Cell[] {
  const b = c.band;
  if (!b) return new Array<Cell>(9).fill(null);
  const rheo = (v: number | null) => (v === null ? 'no spike up to the ceiling' : round(v));
  return [
    rheo(b.rheobase_uA_cm2.median),
    rheo(b.rheobase_uA_cm2.low),
    rheo(b.rheobase_uA_cm2.high),
    round(b.threshold_mV.median),
    round(b.threshold_mV.low),
    round(b.threshold_mV.high),
    round(b.referenceRate_Hz.median),
    round(b.referenceRate_Hz.low),
    round(b.referenceRate_Hz.high),
  ];
}

/** The firing transition in words, for exports (firing-transition.ts). */
export function transitionText(t: TransitionView | null): string {
  if (!t) return 'Firing transition: not found for this stored forecast.';
  if (t.status !== 'found' || t.concentration_uM === null) return `Firing transition: none. ${t.note}`;
  const block = Object.entries(t.block ?? {})
    .map(([g, b]) => `${g} ${(b * 100).toFixed(1)} %`)
    .join(', ');
  const band = t.band ? ` (95 %: ${sigText(t.band.low)}–${sigText(t.band.high)} µM)` : '';
  return `Firing transition: stops firing repetitively at the reference drive from ${sigText(t.concentration_uM)} µM${band}, block ${block}.`;
}

const sigText = (v: number) => Number(v.toPrecision(3)).toString();

/** Words of the block-mode column: tonic block only, or state-dependent (modulated receptor). */
export const BLOCK_MODE_WORDS = {
  tonic: 'tonic only',
  stateDependent: 'state-dependent (Kr tonic IC50, Ki use-dependent IC50)',
} as const;

/**
 * Control and each exposure of one compound's forecast, tonic only and then, when it has one, with
 * state-dependent block; a compound without a forecast gets one row saying why.
 */
export function forecastRows(f: CompoundForecast): Cell[][] {
  const potencies = f.targets
    .map(
      (t) =>
        `${t.target} (${t.conductance}): ${t.note}${t.stateDependence ? ` ${t.stateDependence.note}` : ''}`,
    )
    .join(' ');
  const head: Cell[] = [f.compound, f.screen.name, f.preset];
  if (!f.forecast) {
    // One row saying why, its cells placed by column name (the reason under Flags).
    const cells = new Array<Cell>(FORECAST_COLUMNS.length).fill(null);
    const put = (column: (typeof FORECAST_COLUMNS)[number], value: Cell) => {
      cells[FORECAST_COLUMNS.indexOf(column)] = value;
    };
    head.forEach((value, i) => (cells[i] = value));
    put('Condition', 'No forecast');
    put('Flags', f.reason);
    put('Potencies used', potencies);
    return [cells];
  }
  return [
    ...modeRows(f.forecast, BLOCK_MODE_WORDS.tonic, head, potencies),
    ...(f.stateDependent ? modeRows(f.stateDependent, BLOCK_MODE_WORDS.stateDependent, head, potencies) : []),
  ];
}

/** Control and each exposure of one forecast, in one block mode. */
function modeRows(
  view: NonNullable<CompoundForecast['forecast']>,
  mode: string,
  head: Cell[],
  potencies: string,
): Cell[][] {
  const bandNotes = view.bands
    ? `${view.bands.method} ${view.bands.sources.map((s) => `${s.conductance}: ${s.note}`).join(' ')} ${transitionText(view.bands.transition)}`
    : 'No bands: stored before bands were computed.';
  const row = (name: string, c: ConditionView): Cell[] => [
    ...head,
    name,
    c.concentration_uM,
    mode,
    Object.entries(c.block)
      .filter(([, b]) => b > 0)
      .map(([g, b]) => `${g} ${(b * 100).toFixed(1)}`)
      .join('; ') || 'none',
    round(c.measures.rest_mV),
    round(c.measures.rheobase_uA_cm2),
    pct(c.shifts.rheobase_uA_cm2.relative),
    round(c.measures.threshold_mV),
    round(c.shifts.threshold_mV.delta, 3),
    round(view.referenceDrive_uA_cm2),
    round(c.measures.referenceRate_Hz),
    pct(c.shifts.referenceRate_Hz.relative),
    ...bandCells(c),
    c.band ? view.bands!.draws : null,
    c.band ? bandNotes : name === 'Control' ? 'Control: no block, no band.' : bandNotes,
    [
      ...c.measures.flags.map((x) => FLAG_WORDS[x] ?? x),
      ...(c.band?.nearTransition ? ['near a firing transition'] : []),
    ].join('; ') || 'none',
    potencies,
    view.inputSha256,
  ];
  return [
    row('Control', view.control),
    ...view.conditions.filter((c) => c.exposure).map((c) => row('Exposure', c)),
  ];
}

/** The forecast sheet of an export, the caution above it. */
export function forecastTable(forecasts: CompoundForecast[], caution: string): ExportTable {
  return {
    sheet: 'Forecast at exposures',
    key: 'forecast',
    columns: [...FORECAST_COLUMNS],
    rows: forecasts.flatMap(forecastRows),
    note: `Caution: ${caution}`,
  };
}
