// Gatewell forecast CLI: `npx tsx scripts/forecast.ts FILE.json` forecasts one block condition and prints JSON.
// Input (the forecast input file): {"preset": "hh-squid-1952" | "pospischil-rs-2008", "block": {conductance: fraction 0–1},
//   "stepMs": rheobase step in ms (default 500), "drives_uA_cm2": [drives for firing rates]}.
// Output: {"rest_mV", "rheobase_uA_cm2", "threshold_mV", "rates_Hz": {drive: Hz}, "flags": [...]} of the blocked cell.
// Exit 0 with the forecast, 1 for input that cannot be read or is invalid, 2 for wrong usage.
import { readFileSync } from 'node:fs';
import { computeForecast } from '../lib/science/forecast/forecast';
import { forecastInputFileSchema } from '../lib/science/forecast/request-schema';

function main(argv: readonly string[]): number {
  if (argv.length !== 1) {
    process.stderr.write('usage: npx tsx scripts/forecast.ts FILE.json\n');
    return 2;
  }
  const file = argv[0]!;
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    return fail(`cannot read ${file}: ${(error as NodeJS.ErrnoException).code ?? String(error)}`);
  }
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (error) {
    return fail(`${file} is not valid JSON: ${(error as Error).message}`);
  }
  const parsed = forecastInputFileSchema.safeParse(json);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((issue) => `  ${where(issue.path)}: ${issue.message}`);
    return fail(`invalid input in ${file}:\n${lines.join('\n')}`);
  }
  const input = parsed.data;
  const drives = input.drives_uA_cm2 ?? [];
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
  };
  process.stdout.write(`${JSON.stringify(output, null, 2)}\n`);
  return 0;
}

function round(value: number | null, decimals: number): number | null {
  if (value === null) return null;
  const f = 10 ** decimals;
  return Math.round(value * f) / f;
}

/** A zod issue path as the user wrote it, e.g. drives_uA_cm2[1], block.gNa, or (top level). */
function where(path: readonly PropertyKey[]): string {
  if (path.length === 0) return '(top level)';
  return path.map((key, i) => (typeof key === 'number' ? `[${key}]` : `${i > 0 ? '.' : ''}${String(key)}`)).join('');
}

function fail(message: string): number {
  process.stderr.write(`forecast: ${message}\n`);
  return 1;
}

process.exitCode = main(process.argv.slice(2));
