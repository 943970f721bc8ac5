import { simulate, type IntegratorOptions } from './integrate';
import type { CompiledModel } from './model';
import type { MembraneState } from './types';

export interface FiringRateOptions extends IntegratorOptions {
  /** Step length (ms); the rate is taken over its second half. @default 1000 */
  step_ms?: number;
  spikeLevel_mV?: number;
}

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
  const run = simulate(
    model,
    start,
    {
      current_uA_cm2: drive_uA_cm2,
      duration_ms: stepMs,
      meanFrom_ms: half,
      spikeLevel_mV: options.spikeLevel_mV,
    },
    options,
  );
  const late = run.spikeTimes_ms.filter((t) => t >= half);
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
