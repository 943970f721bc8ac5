// Gatewell forecast CLI: `npx tsx scripts/forecast.ts FILE.json` forecasts a blocked cell and prints JSON.
// Input (the forecast input file): {"preset": one of PRESET_NAMES (listed by the usage text), "block": {conductance: fraction 0–1},
//   "stepMs": rheobase step in ms (default 500), "drives_uA_cm2": [drives for firing rates]}
//   or, instead of "block", "potencies": {conductance: {"ic50", "hill", "inactivatedIc50"?}} with "concentrations": [...],
//   and optionally "uncertainty": {"seed", "draws" (default 200), "potencies": {conductance: {"covariance":
//   [[var log10 IC50, cov], [cov, var Hill]], "degreesOfFreedom", "wells": [{"concentration_uM", "block"}]}}} for 95 % bands.
// Output with "block": {"rest_mV", "rheobase_uA_cm2", "threshold_mV", "rates_Hz": {drive: Hz}, "flags": [...], "caution"} of the blocked cell.
// Output with "potencies": {"control": measures, "referenceDrive_uA_cm2", "conditions": [{"concentration", "block",
//   "inactivationShift_mV", "tonic": measures, "stateDependent": measures}], "bandSources", "firingTransition":
//   {"tonic", "stateDependent"}, "caution"}: tonic block only beside state-dependent block (modulated receptor, ΔV½ of
//   Na inactivation from ic50 = Kr and inactivatedIc50 = Ki; equal to tonic without inactivatedIc50). With "uncertainty",
//   each side's measures carry "bands": {measure: {median, low, high, missing}} and "nearTransition".
// Exit 0 with the forecast, 1 for input that cannot be read or is invalid, 2 for wrong usage.
import { readCliInput } from './cli-input';
import type { ConditionForecast, ForecastResult } from '../lib/science/forecast/assemble';
import type { Band } from '../lib/science/forecast/bands';
import { computeBlockModes } from '../lib/science/forecast/block-modes';
import { computeForecast } from '../lib/science/forecast/forecast';
import { forecastInputFileSchema } from '../lib/science/forecast/request-schema';
import { PRESET_NAMES, conductanceNames, getPreset } from '../lib/science/neuron/presets';

/** Every preset id with its blockable conductances, for the usage text. */
const USAGE_DETAIL = [
  'FILE.json: {"preset": ID, "block": {conductance: fraction 0–1}, "stepMs": ms, "drives_uA_cm2": [µA/cm², ...]}',
  '  or "potencies": {conductance: {"ic50", "hill", "inactivatedIc50"?}} and "concentrations": [...] instead of "block",',
  '  with optional "uncertainty": {"seed", "draws", "potencies": {conductance: {"covariance", "degreesOfFreedom", "wells"}}}',
  'presets (ID: blockable conductances):',
  ...PRESET_NAMES.map((name) => `  ${name}: ${conductanceNames(getPreset(name)).blockable.join(', ')}`),
].join('\n');

function main(argv: readonly string[]): number {
  const parsed = readCliInput('forecast', argv, forecastInputFileSchema, USAGE_DETAIL);
  if (!parsed.ok) return parsed.exitCode;
  const input = parsed.data;
  const drives = input.drives_uA_cm2 ?? [];
  const protocol = { stepMs: input.stepMs, drives_uA_cm2: drives };
  if (input.potencies && input.concentrations) {
    const both = computeBlockModes({
      preset: input.preset,
      potencies: input.potencies,
      concentrations: input.concentrations,
      protocol,
      trace: false,
      uncertainty: input.uncertainty,
    });
    const output = {
      control: measures(both.tonic.control),
      referenceDrive_uA_cm2: round(both.tonic.referenceDrive_uA_cm2, 4),
      conditions: both.tonic.conditions.map((tonic, i) => ({
        concentration: tonic.concentration,
        block: roundAll(tonic.block, 6),
        inactivationShift_mV: roundAll(both.inactivationShift_mV[i] ?? {}, 4),
        tonic: bandedMeasures(both.tonic, i),
        stateDependent: bandedMeasures(both.stateDependent, i),
      })),
      bandSources: both.tonic.bands
        ? { draws: both.tonic.bands.draws, seed: both.tonic.bands.seed, sources: both.tonic.bands.sources }
        : null,
      firingTransition: both.tonic.bands
        ? {
            tonic: both.tonic.bands.transition ?? null,
            stateDependent: both.stateDependent.bands?.transition ?? null,
          }
        : null,
      caution: both.tonic.caution,
    };
    process.stdout.write(`${JSON.stringify(output, null, 2)}\n`);
    return 0;
  }
  const result = computeForecast({
    preset: input.preset,
    block: input.block ?? {},
    protocol,
    trace: false,
  });
  const cell = result.conditions[0] ?? result.control;
  process.stdout.write(`${JSON.stringify({ ...measures(cell), caution: result.caution }, null, 2)}\n`);
  return 0;
}

function measures(cell: ConditionForecast) {
  const m = cell.measures;
  return {
    rest_mV: round(m.rest_mV, 4),
    rheobase_uA_cm2: round(m.rheobase_uA_cm2, 4),
    threshold_mV: round(m.threshold_mV, 3),
    rates_Hz: Object.fromEntries(cell.detail.fI.map((r) => [String(r.drive_uA_cm2), round(r.rate_Hz, 3)])),
    flags: m.flags,
  };
}

/** A condition's measures with its bands and near-transition mark (null and false without bands). */
function bandedMeasures(result: ForecastResult, i: number) {
  const b = result.bands?.conditions[i];
  const band = (x: Band, digits: number) => ({
    median: round(x.median, digits),
    low: round(x.low, digits),
    high: round(x.high, digits),
    missing: x.missing,
  });
  const cell = result.conditions[i]!;
  return {
    ...measures(cell),
    referenceRate_Hz: round(cell.measures.referenceRate_Hz, 3),
    bands: b
      ? {
          rheobase_uA_cm2: band(b.rheobase_uA_cm2, 4),
          threshold_mV: band(b.threshold_mV, 3),
          referenceRate_Hz: band(b.referenceRate_Hz, 3),
        }
      : null,
    nearTransition: b?.nearTransition ?? false,
  };
}

function roundAll(values: Record<string, number>, decimals: number): Record<string, number | null> {
  return Object.fromEntries(Object.entries(values).map(([k, v]) => [k, round(v, decimals)]));
}

function round(value: number | null, decimals: number): number | null {
  if (value === null) return null;
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}

process.exitCode = main(process.argv.slice(2));
