import 'server-only';
import { createHash } from 'node:crypto';
import { availableParallelism } from 'node:os';
import path from 'node:path';
import { Piscina } from 'piscina';
import { assembleForecast, type ForecastResult } from '@/lib/science/forecast/assemble';
import { conditionTasks, controlTask, planForecast, traceTasks } from '@/lib/science/forecast/plan';
import { parseForecastRequest } from '@/lib/science/forecast/request-schema';
import type { BandCellResult, BandTask } from '@/lib/science/forecast/band-cell';
import { planBands } from '@/lib/science/forecast/bands';
import type { FiringTransition } from '@/lib/science/forecast/firing-transition';
import type { MeasureTask, TraceTask } from '@/lib/science/forecast/tasks';
import type { VoltageTrace } from '@/lib/science/neuron/downsample';
import type { Excitability } from '@/lib/science/neuron/excitability';
import { LruCache } from './lru-cache';

/**
 * The worker file, resolved from the repository root (the app and scripts run from there): the
 * TypeScript source, never a bundled copy, so that the app's build, tsx scripts and Vitest all start
 * the same file.
 */
export const FORECAST_WORKER_FILE = path.join(process.cwd(), 'lib', 'compute', 'forecast-worker.ts');

/** Results kept per preset + scaled conductances + protocol (one entry per condition or trace). */
export const FORECAST_CACHE_ENTRIES = 500;

interface PoolState {
  pool: Piscina | null;
  cache: LruCache<Excitability | VoltageTrace>;
  /** Tasks under way, so that simultaneous identical requests share one computation. */
  running: Map<string, Promise<Excitability | VoltageTrace>>;
  tasksRun: number;
}

// Kept on globalThis so that development reloads of this module reuse one pool.
const STATE_KEY = Symbol.for('gatewell.forecast.pool');
const state: PoolState = ((globalThis as Record<symbol, unknown>)[STATE_KEY] as PoolState | undefined) ?? {
  pool: null,
  cache: new LruCache(FORECAST_CACHE_ENTRIES),
  running: new Map(),
  tasksRun: 0,
};
(globalThis as Record<symbol, unknown>)[STATE_KEY] = state;

/** Worker threads of the pool: one per core, at most 4. */
export function forecastPoolThreads(): number {
  return Math.max(1, Math.min(4, availableParallelism()));
}

function pool(): Piscina {
  // One thread per core (at most 4), all kept warm: a forecast is a burst of parallel tasks.
  const threads = forecastPoolThreads();
  state.pool ??= new Piscina({
    filename: FORECAST_WORKER_FILE,
    // The worker is TypeScript; tsx compiles it on load inside each thread.
    execArgv: ['--import', 'tsx'],
    minThreads: threads,
    maxThreads: threads,
    idleTimeout: 60_000,
  });
  return state.pool;
}

/**
 * Cache key: preset (name and content), scaled conductances, inactivation shifts (state-dependent
 * block) and the whole protocol of the task.
 */
function cacheKey(task: MeasureTask | TraceTask): string {
  const scaled = task.preset.conductances.map((c) => [
    c.name,
    c.g_mS_cm2 * (task.scale[c.name] ?? 1),
    task.inactivationShift?.[c.name] ?? 0,
  ]);
  const presetHash = createHash('sha1').update(JSON.stringify(task.preset)).digest('hex');
  return `${task.kind}|${task.preset.name}|${presetHash}|${JSON.stringify(scaled)}|${JSON.stringify(task.request)}`;
}

async function run<T extends Excitability | VoltageTrace>(task: MeasureTask | TraceTask): Promise<T> {
  const key = cacheKey(task);
  const hit = state.cache.get(key);
  if (hit) return structuredClone(hit) as T;
  let running = state.running.get(key);
  if (!running) {
    state.tasksRun++;
    running = (pool().run(task) as Promise<T>).then(
      (result) => {
        state.cache.set(key, result);
        state.running.delete(key);
        return result;
      },
      (error: unknown) => {
        state.running.delete(key);
        throw error;
      },
    );
    state.running.set(key, running);
  }
  // Callers get their own copy: the cached value is never handed out.
  return structuredClone(await running) as T;
}

/**
 * A band task on the threads. Not cached: its draws are continuous, so results would rarely repeat and
 * would push the conditions out of the cache.
 */
async function runBand(task: BandTask): Promise<BandCellResult> {
  state.tasksRun++;
  return (await pool().run(task)) as BandCellResult;
}

/**
 * Excitability forecast on worker threads: the control first (its rheobase sets the reference
 * drive and the search start), then every condition, both traces and, when asked for, the bands' draws
 * (in chunks spread over the threads), all in parallel. Same result as computeForecast. Throws ForecastRequestError on an invalid request.
 */
export async function runForecast(input: unknown): Promise<ForecastResult> {
  const plan = planForecast(parseForecastRequest(input));
  const control = await run<Excitability>(controlTask(plan));
  const t = traceTasks(plan, control);
  const bandWork = planBands(plan, control);
  const conditionRuns = conditionTasks(plan, control).map((task) => run<Excitability>(task));
  // Each banded concentration's task starts once its point measurement is in (it reuses it).
  const bandRuns = bandWork
    ? bandWork.conditions.map(
        async (i) => [i, await runBand(bandWork.task(i, await conditionRuns[i]!))] as const,
      )
    : [];
  const transitionRun = bandWork
    ? Promise.all(conditionRuns).then(async (measured) => {
        state.tasksRun++;
        return (await pool().run(bandWork.transitionTask(control, measured))) as FiringTransition;
      })
    : Promise.resolve(null);
  const [conditions, controlTrace, conditionTrace, bandResults, transition] = await Promise.all([
    Promise.all(conditionRuns),
    t ? run<VoltageTrace>(t.control) : Promise.resolve(null),
    t?.condition ? run<VoltageTrace>(t.condition) : Promise.resolve(null),
    bandWork ? Promise.all(bandRuns) : Promise.resolve(null),
    transitionRun,
  ]);
  const traces =
    t && controlTrace
      ? { drive_uA_cm2: t.drive_uA_cm2, control: controlTrace, condition: conditionTrace }
      : null;
  const bands = bandWork && bandResults ? bandWork.assemble(new Map(bandResults), transition) : null;
  return assembleForecast(plan, control, conditions, traces, bands);
}

/** Stop the worker threads (scripts and tests call this so the process can exit). */
export async function closeForecastPool(): Promise<void> {
  const p = state.pool;
  state.pool = null;
  if (p) await p.destroy();
}

/** Empty the result cache. */
export function clearForecastCache(): void {
  state.cache.clear();
}

/** Cached results and tasks sent to the threads so far (for tests and diagnostics). */
export function forecastPoolStats(): { cachedResults: number; tasksRun: number } {
  return { cachedResults: state.cache.size, tasksRun: state.tasksRun };
}
