import { firingRate, type FiringRate } from './firing-rate';
import { DEFAULT_DT_MS, simulate } from './integrate';
import type { CompiledModel } from './model';
import type { MembraneState } from './types';
import { findRest } from './rest';
import { findRheobase } from './rheobase';

/**
 * Flags on one condition:
 * - 'spontaneous-firing': no stable rest with no drive, and the free-running membrane spikes;
 * - 'no-stable-rest': no stable rest, but no spike either (a sub-threshold oscillation);
 * - 'loss-of-firing': no step up to the ceiling gives a spike, or no spike at the reference drive;
 * - 'depolarisation-block': at some measured drive the cell spiked, then stopped (fewer than 3 spikes
 *   in the last half) while sitting above its own spike threshold (or −40 mV if that is unknown);
 * - 'firing-stops': at the reference drive the cell spiked at the start of the step, then fell silent
 *   below that level (no spike in the last half, where the rate is taken): its rate there is 0 although
 *   it still fires, the tonic-to-phasic change of a cell losing its sodium current.
 */
export type ExcitabilityFlag =
  'spontaneous-firing' | 'no-stable-rest' | 'loss-of-firing' | 'depolarisation-block' | 'firing-stops';

export interface ExcitabilityProtocol {
  /** @default DEFAULT_DT_MS (0.025 ms) */
  dt_ms: number;
  rates: 'table' | 'exact';
  /** Rheobase step length (ms). @default 500 */
  rheobaseStep_ms: number;
  /** Bisection stops when the bracket is within this fraction of the rheobase. @default 1e-3 */
  rheobaseRelTolerance: number;
  /** @default 200 µA/cm² */
  rheobaseCeiling_uA_cm2: number;
  /** Firing-rate step length (ms); the rate is taken over its last half. @default 1000 */
  rateStep_ms: number;
  /** dV/dt marking spike threshold (mV/ms); common practice 10–20. @default 10 */
  thresholdSlope_mV_ms: number;
  /**
   * The threshold is read from the first spike of a step at this multiple of the rheobase. Exactly
   * at the rheobase the trajectory grazes the firing boundary and the voltage where dV/dt reaches
   * the slope depends on how close the bisection came (about 1 mV in Hodgkin–Huxley); 5 % above it,
   * like the first spiking sweep of a stepped protocol, it is well defined. Our choice, no source.
   * @default 1.05
   */
  thresholdStepFactor: number;
}

export const DEFAULT_EXCITABILITY_PROTOCOL: ExcitabilityProtocol = {
  dt_ms: DEFAULT_DT_MS,
  rates: 'table',
  rheobaseStep_ms: 500,
  rheobaseRelTolerance: 1e-3,
  rheobaseCeiling_uA_cm2: 200,
  rateStep_ms: 1000,
  thresholdSlope_mV_ms: 10,
  thresholdStepFactor: 1.05,
};

/** Voltage above which a silent cell counts as depolarisation-blocked when its threshold is unknown. */
const FALLBACK_BLOCK_LEVEL_mV = -40;

export interface ExcitabilityRequest {
  protocol?: Partial<ExcitabilityProtocol>;
  /** Drives (µA/cm²) for the f–I curve. */
  drives_uA_cm2?: number[];
  /** Absolute reference drive (for a blocked condition: a multiple of the control rheobase). */
  referenceDrive_uA_cm2?: number;
  /** Reference drive as a multiple of this condition's own rheobase (for the control). */
  referenceDriveFactor?: number;
  /**
   * Add an evenly spaced f–I curve relative to this condition's own rheobase (for the control):
   * drives k/points × upToFactor × rheobase, k = 1…points.
   */
  fiCurve?: FiCurve;
  /** Where the rheobase search starts (the control rheobase, for a blocked condition). @default 1 */
  rheobaseGuess_uA_cm2?: number;
}

export interface FiCurve {
  points: number;
  upToFactor: number;
}

/** Drives of an f–I curve relative to a rheobase (µA/cm²). */
export function fiCurveDrives(curve: FiCurve, rheobase_uA_cm2: number): number[] {
  return Array.from(
    { length: curve.points },
    (_, i) => ((i + 1) / curve.points) * curve.upToFactor * rheobase_uA_cm2,
  );
}

export interface Excitability {
  rest_mV: number | null;
  rheobase_uA_cm2: number | null;
  rheobaseBracket_uA_cm2: [number, number] | null;
  /** Threshold of the first spike at thresholdStepFactor × rheobase. */
  threshold_mV: number | null;
  /** Latency of the first spike at the rheobase (ms from step onset). */
  firstSpikeLatency_ms: number | null;
  referenceDrive_uA_cm2: number | null;
  reference: FiringRate | null;
  /** Rates at every requested drive, ascending. */
  fI: FiringRate[];
  flags: ExcitabilityFlag[];
}

/** Threshold (mV) of the first spike of a step from rest, or null. */
function thresholdAt(
  model: CompiledModel,
  rest: MembraneState,
  current: number,
  p: ExcitabilityProtocol,
): number | null {
  const run = simulate(
    model,
    rest,
    {
      current_uA_cm2: current,
      duration_ms: p.rheobaseStep_ms,
      stopAtFirstSpike: true,
      thresholdSlope_mV_ms: p.thresholdSlope_mV_ms,
    },
    { dt_ms: p.dt_ms, rates: p.rates },
  );
  return run.firstSpikeThreshold_mV;
}

/** Rest, rheobase, threshold, rates and flags of one (possibly blocked) model. */
export function measureExcitability(model: CompiledModel, request: ExcitabilityRequest = {}): Excitability {
  const p = { ...DEFAULT_EXCITABILITY_PROTOCOL, ...request.protocol };
  const integrator = { dt_ms: p.dt_ms, rates: p.rates };
  const flags = new Set<ExcitabilityFlag>();
  const rest = findRest(model, integrator);
  if (rest.spontaneousFiring) flags.add('spontaneous-firing');
  if (rest.noStableRest) flags.add('no-stable-rest');
  const rheo =
    rest.rest_mV === null
      ? null
      : findRheobase(model, rest.start, {
          ...integrator,
          step_ms: p.rheobaseStep_ms,
          relTolerance: p.rheobaseRelTolerance,
          ceiling_uA_cm2: p.rheobaseCeiling_uA_cm2,
          guess_uA_cm2: request.rheobaseGuess_uA_cm2,
          thresholdSlope_mV_ms: p.thresholdSlope_mV_ms,
        });
  if (rheo && rheo.rheobase_uA_cm2 === null) flags.add('loss-of-firing');
  const threshold =
    rheo?.rheobase_uA_cm2 != null
      ? thresholdAt(model, rest.start, rheo.rheobase_uA_cm2 * p.thresholdStepFactor, p)
      : null;
  const referenceDrive =
    request.referenceDrive_uA_cm2 ??
    (request.referenceDriveFactor !== undefined && rheo?.rheobase_uA_cm2 != null
      ? request.referenceDriveFactor * rheo.rheobase_uA_cm2
      : null);
  const rateAt = (drive: number) =>
    firingRate(model, rest.start, drive, { ...integrator, step_ms: p.rateStep_ms });
  const reference = referenceDrive === null ? null : rateAt(referenceDrive);
  const curve =
    request.fiCurve && rheo?.rheobase_uA_cm2 != null
      ? fiCurveDrives(request.fiCurve, rheo.rheobase_uA_cm2)
      : [];
  const drives = [...new Set([...(request.drives_uA_cm2 ?? []), ...curve])].sort((a, b) => a - b);
  const fI = drives.map((d) => (reference && d === referenceDrive ? reference : rateAt(d)));
  if (reference && reference.spikes === 0 && !rest.spontaneousFiring) flags.add('loss-of-firing');
  const blockLevel = threshold ?? FALLBACK_BLOCK_LEVEL_mV;
  for (const r of reference ? [reference, ...fI] : fI) {
    if (r.spikes > 0 && r.lateSpikes < 3 && r.lateMeanV_mV > blockLevel) flags.add('depolarisation-block');
  }
  if (reference && reference.spikes > 0 && reference.lateSpikes === 0 && reference.lateMeanV_mV <= blockLevel)
    flags.add('firing-stops');
  return {
    rest_mV: rest.rest_mV,
    rheobase_uA_cm2: rheo?.rheobase_uA_cm2 ?? null,
    rheobaseBracket_uA_cm2: rheo?.bracket ?? null,
    threshold_mV: threshold,
    firstSpikeLatency_ms: rheo?.latency_ms ?? null,
    referenceDrive_uA_cm2: referenceDrive,
    reference,
    fI,
    flags: [...flags],
  };
}
