import { membraneStep, type MembraneStep } from './kernel';
import type { CompiledModel } from './model';
import type { MembraneState } from './types';

/**
 * Default time step (ms). The staggered exponential scheme below is second order; at 0.025 ms the
 * HH rates at 10 and 20 µA/cm² and the rheobase move by less than 0.05 % when dt is halved
 * (tests/unit/neuron-convergence.test.ts).
 */
export const DEFAULT_DT_MS = 0.025;

export interface RunProtocol {
  /** Constant injected current over the run (µA/cm², positive = depolarising), on top of the preset's holding current. */
  current_uA_cm2: number;
  duration_ms: number;
  /** Stop right after the first spike (rheobase search). @default false */
  stopAtFirstSpike?: boolean;
  /** dV/dt level (mV/ms) that marks the threshold of the first spike. @default 10 */
  thresholdSlope_mV_ms?: number;
  /** Upward crossing of this voltage is a spike. @default 0 */
  spikeLevel_mV?: number;
  /** Average V from this time to the end of the run. @default not averaged */
  meanFrom_ms?: number;
  /** Keep V at every step (t = 0, dt, 2dt, …). @default false */
  record?: boolean;
  /**
   * A stable fixed point of the model at this current: the run stops early, as settled, once V is
   * within 0.01 mV of it and every gate within 1e-4 (checked each millisecond). Only pass a point
   * known to be stable (isStable); used to cut short sub-threshold steps.
   */
  settleAt?: MembraneState;
  /**
   * Stop once the spike train is periodic: the mean intervals of PERIODIC_BLOCKS_AGREEING successive
   * blocks of PERIODIC_BLOCK spikes each within this many ms of the block before (and under
   * `periodicBelow_ms`). Only for a rate taken as the last block's mean interval (firingRate's
   * `stopEarly`). @default never
   */
  periodicWithin_ms?: number;
  /** Longest interval a periodic stop accepts (ms). @default Infinity */
  periodicBelow_ms?: number;
}

export interface RunResult {
  /** Spike times (ms from the run's start), linearly interpolated at the crossing. */
  spikeTimes_ms: number[];
  /**
   * Threshold of the first spike: V where dV/dt rose through the threshold slope on the way to it
   * (the last such crossing before the spike; interpolated between step midpoints). Null without a
   * spike, or when the step's onset alone drove dV/dt above the slope until the spike, where the
   * slope says nothing about the membrane.
   */
  firstSpikeThreshold_mV: number | null;
  meanV_mV: number | null;
  /** State at the end (gates are kept half a step behind V, so runs can be chained). */
  end: MembraneState;
  simulated_ms: number;
  /** Stopped early at the settleAt point. */
  settled: boolean;
  /** Stopped early on a periodic spike train (periodicWithin_ms). */
  periodic: boolean;
  trace: Float64Array | null;
}

const SETTLE_V_mV = 0.01;
const SETTLE_GATE = 1e-4;
const SETTLE_EVERY_ms = 1;
/** Spikes per block, and successive blocks whose mean intervals must agree, for a periodic stop. */
export const PERIODIC_BLOCK = 8;
export const PERIODIC_BLOCKS_AGREEING = 3;

export interface IntegratorOptions {
  dt_ms?: number;
  /** 'table': interpolated rate tables (fast); 'exact': rate functions at every step. @default 'table' */
  rates?: 'table' | 'exact';
}

/**
 * Integrate C dV/dt = I − Σ g·gates·(V − E) from `start` with a staggered exponential scheme
 * (Rush–Larsen type): gates advance from t−dt/2 to t+dt/2 exactly for V(t) held, then V advances
 * from t to t+dt exactly for the gates at t+dt/2 held. Both half-steps are midpoint rules, so the
 * scheme is second order, and unconditionally stable for the linear parts. `start` is not mutated.
 */
export function simulate(
  model: CompiledModel,
  start: MembraneState,
  protocol: RunProtocol,
  options: IntegratorOptions = {},
): RunResult {
  const dt = options.dt_ms ?? DEFAULT_DT_MS;
  if (!(dt > 0) || !(protocol.duration_ms >= 0))
    throw new Error('simulate: dt and duration must be positive');
  const step = stepFor(model, dt, options.rates ?? 'table');
  const x = Float64Array.from(start.gates);
  const current = protocol.current_uA_cm2 + model.holdingCurrent_uA_cm2;
  const steps = Math.round(protocol.duration_ms / dt);
  const slope = protocol.thresholdSlope_mV_ms ?? 10;
  const level = protocol.spikeLevel_mV ?? 0;
  const stopAtSpike = protocol.stopAtFirstSpike ?? false;
  const meanFrom = protocol.meanFrom_ms === undefined ? -1 : Math.round(protocol.meanFrom_ms / dt);
  const trace = protocol.record ? new Float64Array(steps + 1) : null;
  const settle = protocol.settleAt;
  const settleEvery = Math.max(1, Math.round(SETTLE_EVERY_ms / dt));
  const spikes: number[] = [];
  let nextCheck = settle ? settleEvery : -1;
  let settled = false;
  const periodicWithin = protocol.periodicWithin_ms ?? -1;
  const periodicBelow = protocol.periodicBelow_ms ?? Number.POSITIVE_INFINITY;
  let periodic = false;
  let agreeing = 0;
  let previousMean = Number.NaN;
  let v = start.v_mV;
  let threshold: number | null = null;
  // No threshold at the step's onset: the first slope sample only seeds the search.
  let slopePrev = Number.POSITIVE_INFINITY;
  let vMidPrev = v;
  let sum = 0;
  let summed = 0;
  let n = 0;
  if (trace) trace[0] = v;
  for (; n < steps; n++) {
    const vNew = step(x, v, current);
    if (spikes.length === 0) {
      const s = (vNew - v) / dt;
      const vMid = 0.5 * (v + vNew);
      if (slopePrev < slope && s >= slope)
        threshold = vMidPrev + ((vMid - vMidPrev) * (slope - slopePrev)) / (s - slopePrev);
      slopePrev = s;
      vMidPrev = vMid;
    }
    if (v < level && vNew >= level) {
      spikes.push((n + (level - v) / (vNew - v)) * dt);
      const k = spikes.length;
      // Mean intervals of successive blocks of PERIODIC_BLOCK spikes (one spike time's interpolation
      // error, about 1e-3 ms, is spread over the block).
      if (periodicWithin >= 0 && k > PERIODIC_BLOCK && (k - 1) % PERIODIC_BLOCK === 0) {
        const mean = (spikes[k - 1]! - spikes[k - 1 - PERIODIC_BLOCK]!) / PERIODIC_BLOCK;
        agreeing = Math.abs(mean - previousMean) <= periodicWithin && mean < periodicBelow ? agreeing + 1 : 0;
        previousMean = mean;
        if (agreeing >= PERIODIC_BLOCKS_AGREEING) {
          periodic = true;
          v = vNew;
          if (trace) trace[n + 1] = v;
          n++;
          break;
        }
      }
    }
    v = vNew;
    if (trace) trace[n + 1] = v;
    if (meanFrom >= 0 && n + 1 > meanFrom) {
      sum += v;
      summed++;
    }
    if (!(v > -1e4 && v < 1e4))
      throw new Error(`simulate: V left the physical range (${v} mV) at t = ${(n + 1) * dt} ms`);
    if (stopAtSpike && spikes.length > 0) {
      n++;
      break;
    }
    if (n + 1 === nextCheck && settle) {
      nextCheck += settleEvery;
      if (isNear(v, x, settle)) {
        settled = true;
        n++;
        break;
      }
    }
  }
  return {
    spikeTimes_ms: spikes,
    firstSpikeThreshold_mV: spikes.length > 0 ? threshold : null,
    meanV_mV: summed > 0 ? sum / summed : null,
    end: { v_mV: v, gates: x },
    simulated_ms: n * dt,
    settled,
    periodic,
    trace: trace ? trace.subarray(0, n + 1) : null,
  };
}

/** Step functions are built once per compiled model, time step and rate mode. */
const steps = new WeakMap<CompiledModel, Map<string, MembraneStep>>();

function stepFor(model: CompiledModel, dt: number, rates: 'table' | 'exact'): MembraneStep {
  let byKey = steps.get(model);
  if (!byKey) steps.set(model, (byKey = new Map()));
  const key = `${dt}|${rates}`;
  let step = byKey.get(key);
  if (!step) byKey.set(key, (step = membraneStep(model, dt, rates)));
  return step;
}

function isNear(v: number, x: Float64Array, target: MembraneState): boolean {
  if (Math.abs(v - target.v_mV) > SETTLE_V_mV) return false;
  for (let j = 0; j < x.length; j++) if (Math.abs(x[j]! - target.gates[j]!) > SETTLE_GATE) return false;
  return true;
}
