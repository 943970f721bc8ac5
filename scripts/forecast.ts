// Gatewell forecast CLI: `npx tsx scripts/forecast.ts FILE.json` forecasts and prints JSON.
// Input (the forecast input file): {"preset": one of PRESET_NAMES (listed by the usage text), "block": {conductance: fraction 0–1},
//   "stepMs": rheobase step in ms (default 500), "drives_uA_cm2": [drives for firing rates]}; or, instead of block,
//   "potencies": {conductance: {"ic50", "hill"}}, "concentrations": [...] and optionally
//   "uncertainty": {"seed", "draws" (default 200), "potencies": {conductance: {"covariance": [[var log10 IC50, cov], [cov, var Hill]],
//   "degreesOfFreedom", "wells": [{"concentration_uM", "block"}]}}} for 95 % bands.
// Output, block: {"rest_mV", "rheobase_uA_cm2", "threshold_mV", "rates_Hz": {drive: Hz}, "flags": [...], "caution"} of the blocked cell.
// Output, potencies: {"control": {...}, "conditions": [{"concentration", "block", measures, "bands": {measure: {median, low, high, missing}},
//   "nearTransition"}], "bandSources", "firingTransition": {status, concentration, block, band, note} (with bands), "caution"}. Exit 0 with the forecast, 1 for input that cannot be read or is invalid, 2 for wrong usage.
import { readCliInput } from './cli-input';
import type { ConditionForecast } from '../lib/science/forecast/assemble';
import type { Band } from '../lib/science/forecast/bands';
import { computeForecast } from '../lib/science/forecast/forecast';
import { forecastInputFileSchema } from '../lib/science/forecast/request-schema';
import { PRESET_NAMES, conductanceNames, getPreset } from '../lib/science/neuron/presets';

/** Every preset id with its blockable conductances, for the usage text. */
const USAGE_DETAIL = [
  'FILE.json: {"preset": ID, "block": {conductance: fraction 0–1}, "stepMs": ms, "drives_uA_cm2": [µA/cm², ...]}',
  'presets (ID: blockable conductances):',
  ...PRESET_NAMES.map((name) => `  ${name}: ${conductanceNames(getPreset(name)).blockable.join(', ')}`),
].join('\n');

function main(argv: readonly string[]): number {
  const parsed = readCliInput('forecast', argv, forecastInputFileSchema, USAGE_DETAIL);
  if (!parsed.ok) return parsed.exitCode;
  const input = parsed.data;
  const drives = input.drives_uA_cm2 ?? [];
  if (input.potencies && input.concentrations) {
    const result = computeForecast({
      preset: input.preset,
      potencies: input.potencies,
      concentrations: input.concentrations,
      protocol: { stepMs: input.stepMs, drives_uA_cm2: drives },
      trace: false,
      uncertainty: input.uncertainty,
    });
    const measures = (c: ConditionForecast) => ({
      rest_mV: round(c.measures.rest_mV, 4),
      rheobase_uA_cm2: round(c.measures.rheobase_uA_cm2, 4),
      threshold_mV: round(c.measures.threshold_mV, 3),
      referenceRate_Hz: round(c.measures.referenceRate_Hz, 3),
      flags: c.measures.flags,
    });
    const band = (b: Band, digits: number) => ({
      median: round(b.median, digits),
      low: round(b.low, digits),
      high: round(b.high, digits),
      missing: b.missing,
    });
    const output = {
      control: measures(result.control),
      referenceDrive_uA_cm2: round(result.referenceDrive_uA_cm2, 4),
      conditions: result.conditions.map((c, i) => {
        const b = result.bands?.conditions[i];
        return {
          concentration: c.concentration,
          block: Object.fromEntries(Object.entries(c.block).map(([k, v]) => [k, round(v, 4)])),
          ...measures(c),
          bands: b
            ? {
                rheobase_uA_cm2: band(b.rheobase_uA_cm2, 4),
                threshold_mV: band(b.threshold_mV, 3),
                referenceRate_Hz: band(b.referenceRate_Hz, 3),
              }
            : null,
          nearTransition: b?.nearTransition ?? false,
        };
      }),
      bandSources: result.bands
        ? { draws: result.bands.draws, seed: result.bands.seed, sources: result.bands.sources }
        : null,
      firingTransition: result.bands?.transition ?? null,
      caution: result.caution,
    };
    process.stdout.write(`${JSON.stringify(output, null, 2)}\n`);
    return 0;
  }
  const result = computeForecast({
    preset: input.preset,
    block: input.block ?? {},
    protocol: { stepMs: input.stepMs, drives_uA_cm2: drives },
    trace: false,
  });
  const cell = result.conditions[0] ?? result.control;
  const m = cell.measures;
  const output = {
    rest_mV: round(m.rest_mV, 4),
    rheobase_uA_cm2: round(m.rheobase_uA_cm2, 4),
    threshold_mV: round(m.threshold_mV, 3),
    rates_Hz: Object.fromEntries(cell.detail.fI.map((r) => [String(r.drive_uA_cm2), round(r.rate_Hz, 3)])),
    flags: m.flags,
    caution: result.caution,
  };
  process.stdout.write(`${JSON.stringify(output, null, 2)}\n`);
  return 0;
}

function round(value: number | null, decimals: number): number | null {
  if (value === null) return null;
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}

process.exitCode = main(process.argv.slice(2));
