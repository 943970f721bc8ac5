// Gatewell forecast CLI: `npx tsx scripts/forecast.ts FILE.json` forecasts a blocked cell and prints JSON.
// Input (the forecast input file): {"preset": one of PRESET_NAMES (listed by the usage text), "block": {conductance: fraction 0–1},
//   "stepMs": rheobase step in ms (default 500), "drives_uA_cm2": [drives for firing rates]}
//   or, instead of "block", "potencies": {conductance: {"ic50", "hill", "inactivatedIc50"?}} with "concentrations": [...].
// Output with "block": {"rest_mV", "rheobase_uA_cm2", "threshold_mV", "rates_Hz": {drive: Hz}, "flags": [...]} of the blocked cell.
// Output with "potencies": {"control": measures, "conditions": [{"concentration", "block", "inactivationShift_mV",
//   "tonic": measures, "stateDependent": measures}]}: tonic block only beside state-dependent block (modulated
//   receptor, ΔV½ of Na inactivation from ic50 = Kr and inactivatedIc50 = Ki; equal to tonic without inactivatedIc50).
// Exit 0 with the forecast, 1 for input that cannot be read or is invalid, 2 for wrong usage.
import { readCliInput } from './cli-input';
import type { ConditionForecast } from '../lib/science/forecast/assemble';
import { computeBlockModes } from '../lib/science/forecast/block-modes';
import { computeForecast } from '../lib/science/forecast/forecast';
import { forecastInputFileSchema } from '../lib/science/forecast/request-schema';
import { PRESET_NAMES, conductanceNames, getPreset } from '../lib/science/neuron/presets';

/** Every preset id with its blockable conductances, for the usage text. */
const USAGE_DETAIL = [
  'FILE.json: {"preset": ID, "block": {conductance: fraction 0–1}, "stepMs": ms, "drives_uA_cm2": [µA/cm², ...]}',
  '  or "potencies": {conductance: {"ic50", "hill", "inactivatedIc50"?}} and "concentrations": [...] instead of "block"',
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
    });
    const output = {
      control: measures(both.tonic.control),
      conditions: both.tonic.conditions.map((tonic, i) => ({
        concentration: tonic.concentration,
        block: roundAll(tonic.block, 6),
        inactivationShift_mV: roundAll(both.inactivationShift_mV[i] ?? {}, 4),
        tonic: measures(tonic),
        stateDependent: measures(both.stateDependent.conditions[i]!),
      })),
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
  process.stdout.write(`${JSON.stringify(measures(cell), null, 2)}\n`);
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

function roundAll(values: Record<string, number>, decimals: number): Record<string, number | null> {
  return Object.fromEntries(Object.entries(values).map(([k, v]) => [k, round(v, decimals)]));
}

function round(value: number | null, decimals: number): number | null {
  if (value === null) return null;
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}

process.exitCode = main(process.argv.slice(2));
