import 'server-only';
import type { CompoundForecast, ConditionView } from '@/lib/validation/forecasts';
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
  'Block (%)',
  'Rest (mV)',
  'Rheobase (µA/cm²)',
  'Rheobase change (%)',
  'Threshold (mV)',
  'Threshold change (mV)',
  'Reference drive (µA/cm²)',
  'Rate at reference drive (Hz)',
  'Rate change (%)',
  'Flags',
  'Potencies used',
  'Forecast input SHA-256',
];

/** Control and each exposure of one compound's forecast; a compound without a forecast gets one row saying why. */
export function forecastRows(f: CompoundForecast): Cell[][] {
  const potencies = f.targets.map((t) => `${t.target} (${t.conductance}): ${t.note}`).join(' ');
  const head: Cell[] = [f.compound, f.screen.name, f.preset];
  const view = f.forecast;
  if (!view)
    return [
      [
        ...head,
        'No forecast',
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        null,
        f.reason,
        potencies,
        null,
      ],
    ];
  const row = (name: string, c: ConditionView): Cell[] => [
    ...head,
    name,
    c.concentration_uM,
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
    c.measures.flags.map((x) => FLAG_WORDS[x] ?? x).join('; ') || 'none',
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
    columns: FORECAST_COLUMNS,
    rows: forecasts.flatMap(forecastRows),
    note: `Caution: ${caution}`,
  };
}
