// Gatewell forecast benchmark:
//   node --conditions=react-server --import tsx scripts/bench-forecast.ts [repeats]
// prints figures; it checks nothing and times no test (the condition lets the worker pool, server code
// in lib/compute, load outside Next). For each preset: one rheobase bisection from rest, one 1 s voltage
// trace, and a whole forecast (control + 4 concentrations: rheobase, threshold, rate at 2× control
// rheobase) in this thread and on the worker pool (cache emptied before each run). Median and range
// over repeats, after one warm-up run (rate tables built, code compiled). Then the uncertainty bands on the
// pool: one compound with bands (200 draws × 5 concentrations), and every compound of a 384-well plate
// (32 compounds × 10 wells, 5 concentrations each, invented potencies) with bands, each once; targets
// < 1 s and < 5 s, with the threads used, the model runs the bands took, the process's CPU time and the
// load average printed (the machine may be shared). `--bands` prints only the band figures;
// `--preset ID[,ID]` only those presets.
import { computeForecast } from '../lib/science/forecast/forecast';
import { loadavg } from 'node:os';
import {
  clearForecastCache,
  closeForecastPool,
  forecastPoolThreads,
  runForecast,
} from '../lib/compute/forecast-pool';
import { compileModel } from '../lib/science/neuron/model';
import { getPreset, PRESET_NAMES } from '../lib/science/neuron/presets';
import { findRest } from '../lib/science/neuron/rest';
import { findRheobase } from '../lib/science/neuron/rheobase';
import { voltageTrace } from '../lib/science/neuron/voltage-trace';

/**
 * The sodium and the second conductance an invented compound blocks: Nav1.7 beside Nav1.8 in the DRG
 * cell, else sodium beside the M-type (Pospischil) or delayed-rectifier K.
 */
function targetsOf(preset: string): [string, string] {
  if (preset === 'xie-drg-2024') return ['gNav17', 'gNav18'];
  return ['gNa', preset === 'pospischil-rs-2008' ? 'gM' : 'gK'];
}

/** An invented compound blocking sodium (IC50 1 µM, Hill 1) and, weaker, a second conductance. */
function request(preset: string) {
  const [na, k] = targetsOf(preset);
  return {
    preset,
    potencies: { [na]: { ic50: 1, hill: 1 }, [k]: { ic50: 10, hill: 1.2 } },
    concentrations: [0.1, 0.3, 1, 3],
    concentrationUnit: 'µM',
    trace: false as const,
  };
}

async function time(repeats: number, work: () => unknown): Promise<string> {
  await work();
  const ms: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    await work();
    ms.push(performance.now() - t0);
  }
  ms.sort((a, b) => a - b);
  const median = ms[Math.floor(ms.length / 2)]!;
  return `${median.toFixed(1).padStart(7)} ms  (${ms[0]!.toFixed(1)}–${ms[ms.length - 1]!.toFixed(1)})`;
}

async function main(repeats: number): Promise<void> {
  console.log(`forecast benchmark, median (min–max) of ${repeats} runs`);
  for (const name of bandsOnly ? [] : presets) {
    const model = compileModel(getPreset(name));
    const rest = findRest(model).start;
    const rheobase = findRheobase(model, rest);
    console.log(
      `\n${name}: rheobase ${rheobase.rheobase_uA_cm2?.toFixed(4)} µA/cm² in ${rheobase.steps} steps`,
    );
    console.log(`  rheobase bisection          ${await time(repeats, () => findRheobase(model, rest))}`);
    const drive = 2 * (rheobase.rheobase_uA_cm2 ?? 1);
    console.log(
      `  1 s voltage trace           ${await time(repeats, () => voltageTrace(model, { drive_uA_cm2: drive, duration_ms: 1000 }))}`,
    );
    console.log(`  whole forecast, in thread   ${await time(repeats, () => computeForecast(request(name)))}`);
    const pooled = async () => {
      clearForecastCache();
      await runForecast(request(name));
    };
    console.log(`  whole forecast, pool        ${await time(repeats, pooled)}`);
  }
  await bandFigures();
  await closeForecastPool();
}

/** A fit's covariance of (log10 IC50, Hill slope) of the size a clean 8-point curve gives (invented for the bench). */
const COVARIANCE = [
  [0.0004, 0.0001],
  [0.0001, 0.004],
];

function bandRequest(preset: string, ic50: number, seed: number) {
  const [na, k] = targetsOf(preset);
  return {
    preset,
    potencies: { [na]: { ic50, hill: 1 }, [k]: { ic50: 10 * ic50, hill: 1.2 } },
    concentrations: [0.1, 0.3, 1, 3, 10].map((c) => c * ic50),
    concentrationUnit: 'µM',
    trace: false as const,
    uncertainty: {
      seed,
      draws: 200,
      potencies: { [na]: { covariance: COVARIANCE, degreesOfFreedom: 22 }, [k]: { covariance: COVARIANCE } },
    },
  };
}

/** CPU seconds of this process (every thread) since `from`. */
function cpuSeconds(from: NodeJS.CpuUsage): string {
  const u = process.cpuUsage(from);
  return ((u.user + u.system) / 1e6).toFixed(1);
}

/** Model runs the bands took beside the point forecasts, and how each measure's band was found. */
function runsOf(results: Awaited<ReturnType<typeof runForecast>>[]): string {
  const ways = new Map<string, number>();
  let runs = 0;
  for (const r of results)
    for (const c of r.bands?.conditions ?? []) {
      runs += c?.runs ?? 0;
      for (const w of Object.values(c?.ways ?? {})) ways.set(w, (ways.get(w) ?? 0) + 1);
    }
  return `${runs} (${[...ways].map(([w, k]) => `${w} ${k}`).join(', ')})`;
}

async function bandFigures(): Promise<void> {
  const load = () =>
    loadavg()
      .map((l) => l.toFixed(2))
      .join(' ');
  console.log(`
bands on the pool: ${forecastPoolThreads()} worker thread(s); load average ${load()}`);
  for (const name of presets) {
    clearForecastCache();
    await runForecast(bandRequest(name, 1, 0)); // warm-up: threads started, code compiled
    clearForecastCache();
    const cpu0 = process.cpuUsage();
    const t0 = performance.now();
    const single = await runForecast(bandRequest(name, 1, 1));
    const one = performance.now() - t0;
    const cpuOne = cpuSeconds(cpu0);
    console.log(
      `  ${name}: one compound, 200 draws × 5 concentrations   ${one.toFixed(0).padStart(7)} ms (target < 1000); ${runsOf([single])} band runs; CPU ${cpuOne} s`,
    );
    clearForecastCache();
    const cpu1 = process.cpuUsage();
    const t1 = performance.now();
    // 384 wells: 32 compounds of 10 wells; potencies spread over two decades.
    const all = await Promise.all(
      Array.from({ length: 32 }, (_, i) => runForecast(bandRequest(name, 0.1 * 10 ** (i / 16), 100 + i))),
    );
    const plate = performance.now() - t1;
    console.log(
      `  ${name}: 384-well plate, 32 compounds with bands     ${plate.toFixed(0).padStart(7)} ms (target < 5000); ${runsOf(all)} band runs; CPU ${cpuSeconds(cpu1)} s; load average ${load()}`,
    );
  }
  console.log(`  load average after: ${load()}`);
}

const args = process.argv.slice(2);
const bandsOnly = args.includes('--bands');
const presetArg = args.indexOf('--preset');
const presets: string[] = presetArg >= 0 ? (args[presetArg + 1] ?? '').split(',') : [...PRESET_NAMES];
const repeats = Number(
  args.find((a, i) => a !== '--bands' && a !== '--preset' && (presetArg < 0 || i !== presetArg + 1)) ?? 9,
);
if (
  !Number.isInteger(repeats) ||
  repeats < 1 ||
  presets.some((p) => !(PRESET_NAMES as readonly string[]).includes(p))
) {
  process.stderr.write('usage: scripts/bench-forecast.ts [repeats ≥ 1] [--bands] [--preset ID[,ID]]\n');
  process.exitCode = 2;
} else {
  main(repeats).catch((error: unknown) => {
    process.stderr.write(`bench-forecast: ${String(error)}\n`);
    process.exitCode = 1;
  });
}
