import { PERIODIC_BLOCK, simulate, type IntegratorOptions } from './integrate';
import { steadyStateAt, type CompiledModel } from './model';
import { stableFixedPointAbove } from './steady-state';
import type { MembraneState } from './types';

export interface FiringRateOptions extends IntegratorOptions {
  /** Step length (ms); the rate is taken over its second half. @default 1000 */
  step_ms?: number;
  spikeLevel_mV?: number;
  /**
   * For the rate alone (the bands' runs): stop the step early where its rate is already settled —
   * at a stable fixed point of the drive (no spike can follow: the rate is that of the spikes so far),
   * or once the spike train is periodic (the mean intervals of three successive blocks of eight spikes
   * each within PERIODIC_WITHIN_ms of the block before; the rate is then 1 / the last block's mean). The rate agrees with the whole step's within
   * 0.01 Hz (tests/unit/neuron-rate-early-stop.test.ts); spikes, lateSpikes and lateMeanV_mV then count
   * only the simulated part. @default false
   */
  stopEarly?: boolean;
}

/** ISI agreement (ms) at which stopEarly takes a spike train as periodic (our choice, no source). */
export const PERIODIC_WITHIN_ms = 5e-4;

export interface FiringRate {
  drive_uA_cm2: number;
  /** 1 / mean inter-spike interval over the last half of the step (Hz); 0 with fewer than 3 spikes there. */
  rate_Hz: number;
  spikes: number;
  lateSpikes: number;
  /** Mean V over the last half of the step (mV). */
  lateMeanV_mV: number;
}

/** Steady firing rate for a step of `drive` from `start`. */
export function firingRate(
  model: CompiledModel,
  start: MembraneState,
  drive_uA_cm2: number,
  options: FiringRateOptions = {},
): FiringRate {
  const stepMs = options.step_ms ?? 1000;
  const half = stepMs / 2;
  const target = options.stopEarly ? stableFixedPointAbove(model, drive_uA_cm2, start.v_mV) : null;
  const run = simulate(
    model,
    start,
    {
      current_uA_cm2: drive_uA_cm2,
      duration_ms: stepMs,
      meanFrom_ms: half,
      spikeLevel_mV: options.spikeLevel_mV,
      settleAt: target ? steadyStateAt(model, target.v_mV) : undefined,
      // At least three spikes in the last half: intervals under a third of it.
      periodicWithin_ms: options.stopEarly ? PERIODIC_WITHIN_ms : undefined,
      periodicBelow_ms: half / 3,
    },
    { dt_ms: options.dt_ms, rates: options.rates },
  );
  const times = run.spikeTimes_ms;
  if (run.periodic) {
    const n = times.length;
    return {
      drive_uA_cm2,
      rate_Hz: (1000 * PERIODIC_BLOCK) / (times[n - 1]! - times[n - 1 - PERIODIC_BLOCK]!),
      spikes: n,
      lateSpikes: times.filter((t) => t >= half).length,
      lateMeanV_mV: run.meanV_mV ?? run.end.v_mV,
    };
  }
  const late = times.filter((t) => t >= half);
  const first = late[0];
  const last = late[late.length - 1];
  // Mean of consecutive intervals telescopes to (last − first)/(count − 1).
  const rate =
    late.length >= 3 && first !== undefined && last !== undefined
      ? (1000 * (late.length - 1)) / (last - first)
      : 0;
  return {
    drive_uA_cm2,
    rate_Hz: rate,
    spikes: run.spikeTimes_ms.length,
    lateSpikes: late.length,
    lateMeanV_mV: run.meanV_mV ?? run.end.v_mV,
  };
}
