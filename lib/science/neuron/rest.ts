import { simulate, type IntegratorOptions } from './integrate';
import { steadyStateAt, type CompiledModel } from './model';
import { fixedPoints, lowestStableFixedPoint } from './steady-state';
import type { MembraneState } from './types';

export interface RestResult {
  /** Resting potential: the lowest stable fixed point with no drive (null if there is none). */
  rest_mV: number | null;
  /** State to start protocols from: the resting state, or a state on the free-running oscillation. */
  start: MembraneState;
  /** No stable rest and the free-running membrane crosses 0 mV. */
  spontaneousFiring: boolean;
  /** No stable rest and no spike: a sub-threshold oscillation. */
  noStableRest: boolean;
}

/** How long the membrane runs free (no drive) when it has no stable rest, to tell firing from oscillation. */
export const FREE_RUN_MS = 1000;

/**
 * Resting state with no drive. The rest is found exactly (a fixed point of the equations, with its
 * linear stability) rather than by running the model until it settles, so it costs microseconds and
 * does not depend on the time step.
 */
export function findRest(
  model: CompiledModel,
  options: IntegratorOptions & { spikeLevel_mV?: number } = {},
): RestResult {
  const stable = lowestStableFixedPoint(model, 0);
  if (stable)
    return {
      rest_mV: stable.v_mV,
      start: steadyStateAt(model, stable.v_mV),
      spontaneousFiring: false,
      noStableRest: false,
    };
  // No stable rest: start just above the lowest fixed point and let the membrane run free.
  const points = fixedPoints(model, 0);
  const from = steadyStateAt(model, (points[0]?.v_mV ?? -65) + 1);
  const run = simulate(
    model,
    from,
    { current_uA_cm2: 0, duration_ms: FREE_RUN_MS, spikeLevel_mV: options.spikeLevel_mV },
    options,
  );
  const fired = run.spikeTimes_ms.some((t) => t >= FREE_RUN_MS / 2);
  return { rest_mV: null, start: run.end, spontaneousFiring: fired, noStableRest: !fired };
}
