import {
  DEFAULT_EXCITABILITY_PROTOCOL,
  fiCurveDrives,
  type Excitability,
  type ExcitabilityProtocol,
  type FiCurve,
} from '../neuron/excitability';
import { getPreset } from '../neuron/presets';
import { inactivationSlope_mV, modulatedReceptorShift_mV } from '../neuron/state-dependent-block';
import type { NeuronPreset } from '../neuron/types';
import { DEFAULT_BAND_DRAWS, type BandRequest } from './band-request';
import { poreBlockFraction } from './pore-block';
import type { ParsedForecastRequest } from './request-schema';
import type { MeasureTask, TraceTask } from './tasks';

/** Protocol of a forecast with every default filled in. */
export interface ForecastProtocol extends ExcitabilityProtocol {
  /** Rate reference drive = this × control rheobase. @default 2 */
  referenceDriveFactor: number;
  /** Drives for the f–I curve (µA/cm²). @default [] */
  drives_uA_cm2: number[];
  /** Also an f–I curve of `points` drives up to `upToFactor` × control rheobase. @default none */
  fiCurve: FiCurve | null;
}

export const DEFAULT_FORECAST_PROTOCOL: ForecastProtocol = {
  ...DEFAULT_EXCITABILITY_PROTOCOL,
  referenceDriveFactor: 2,
  drives_uA_cm2: [],
  fiCurve: null,
};

export interface PlannedCondition {
  label: string;
  concentration: number | null;
  /** Fraction blocked, per blockable conductance (0 where not blocked). */
  block: Record<string, number>;
  /** Multiplier 1 − block per conductance. */
  scale: Record<string, number>;
  /**
   * Shift ΔV½ (mV) of the inactivation of each conductance blocked state-dependently (a potency with
   * inactivatedIc50); empty for tonic block.
   */
  inactivationShift: Record<string, number>;
}

export interface ForecastPlan {
  preset: NeuronPreset;
  protocol: ForecastProtocol;
  concentrationUnit: string | null;
  conditions: PlannedCondition[];
  trace: { condition: number; drive_uA_cm2: number | null; duration_ms: number; points: number } | null;
  /**
   * The potencies behind the conditions (conductance → IC50, Hill slope, and the inactivated-state IC50
   * of state-dependent block); null for a block request.
   */
  potencies: Record<string, { ic50: number; hill: number; inactivatedIc50?: number }> | null;
  /** Uncertainty bands asked for, or null. */
  bands: BandRequest | null;
}

/** Turn a validated request into conditions and a resolved protocol. */
export function planForecast(request: ParsedForecastRequest): ForecastPlan {
  const preset = getPreset(request.preset);
  const blockable = preset.conductances.filter((c) => c.blockable).map((c) => c.name);
  const p = request.protocol ?? {};
  const protocol: ForecastProtocol = {
    ...DEFAULT_FORECAST_PROTOCOL,
    dt_ms: p.dt_ms ?? DEFAULT_FORECAST_PROTOCOL.dt_ms,
    rheobaseStep_ms: p.stepMs ?? DEFAULT_FORECAST_PROTOCOL.rheobaseStep_ms,
    rateStep_ms: p.rateStepMs ?? DEFAULT_FORECAST_PROTOCOL.rateStep_ms,
    thresholdSlope_mV_ms: p.thresholdSlope_mV_ms ?? DEFAULT_FORECAST_PROTOCOL.thresholdSlope_mV_ms,
    thresholdStepFactor: p.thresholdStepFactor ?? DEFAULT_FORECAST_PROTOCOL.thresholdStepFactor,
    rheobaseRelTolerance: p.rheobaseRelTolerance ?? DEFAULT_FORECAST_PROTOCOL.rheobaseRelTolerance,
    rheobaseCeiling_uA_cm2: p.rheobaseCeiling_uA_cm2 ?? DEFAULT_FORECAST_PROTOCOL.rheobaseCeiling_uA_cm2,
    referenceDriveFactor: p.referenceDriveFactor ?? DEFAULT_FORECAST_PROTOCOL.referenceDriveFactor,
    drives_uA_cm2: p.drives_uA_cm2 ?? [],
    fiCurve: p.fiCurve ?? null,
  };
  const condition = (
    label: string,
    concentration: number | null,
    fractions: Record<string, number>,
    inactivationShift: Record<string, number> = {},
  ): PlannedCondition => {
    const block = Object.fromEntries(blockable.map((name) => [name, fractions[name] ?? 0]));
    const scale = Object.fromEntries(blockable.map((name) => [name, 1 - (block[name] ?? 0)]));
    return { label, concentration, block, scale, inactivationShift };
  };
  const unit = request.concentrationUnit ?? null;
  let conditions: PlannedCondition[] = [];
  if (request.block) conditions = [condition('block', null, request.block)];
  if (request.potencies && request.concentrations) {
    const potencies = request.potencies;
    conditions = request.concentrations.map((c) =>
      condition(
        `${c}${unit ? ` ${unit}` : ''}`,
        c,
        Object.fromEntries(
          Object.entries(potencies).map(([name, pot]) => [name, poreBlockFraction(c, pot.ic50, pot.hill)]),
        ),
        Object.fromEntries(
          Object.entries(potencies).flatMap(([name, pot]) => {
            const k = inactivationSlope_mV(preset, name);
            if (pot.inactivatedIc50 === undefined || k === null) return [];
            return [[name, modulatedReceptorShift_mV(c, pot.ic50, pot.inactivatedIc50, k)]];
          }),
        ),
      ),
    );
  }
  const t = request.trace;
  const trace =
    t === false
      ? null
      : {
          condition: t?.condition ?? Math.max(0, conditions.length - 1),
          drive_uA_cm2: t?.drive_uA_cm2 ?? null,
          duration_ms: t?.duration_ms ?? protocol.rateStep_ms,
          points: t?.points ?? 2000,
        };
  const u = request.uncertainty;
  const bands: BandRequest | null =
    u && request.potencies
      ? {
          draws: u.draws ?? DEFAULT_BAND_DRAWS,
          seed: u.seed,
          potencies: u.potencies ?? {},
          concentrations: u.concentrations ?? null,
        }
      : null;
  return {
    preset,
    protocol,
    concentrationUnit: unit,
    conditions,
    trace,
    potencies: request.potencies ?? null,
    bands,
  };
}

function excitabilityProtocol(p: ForecastProtocol): ExcitabilityProtocol {
  const {
    dt_ms,
    rates,
    rheobaseStep_ms,
    rheobaseRelTolerance,
    rheobaseCeiling_uA_cm2,
    rateStep_ms,
    thresholdSlope_mV_ms,
    thresholdStepFactor,
  } = p;
  return {
    dt_ms,
    rates,
    rheobaseStep_ms,
    rheobaseRelTolerance,
    rheobaseCeiling_uA_cm2,
    rateStep_ms,
    thresholdSlope_mV_ms,
    thresholdStepFactor,
  };
}

/** The control's measurement (its own rheobase sets the reference drive). */
export function controlTask(plan: ForecastPlan): MeasureTask {
  return {
    kind: 'measure',
    preset: plan.preset,
    scale: {},
    request: {
      protocol: excitabilityProtocol(plan.protocol),
      drives_uA_cm2: plan.protocol.drives_uA_cm2,
      referenceDriveFactor: plan.protocol.referenceDriveFactor,
      fiCurve: plan.protocol.fiCurve ?? undefined,
    },
  };
}

/** One measurement per blocked condition, at the control's drives and starting from its rheobase. */
export function conditionTasks(plan: ForecastPlan, control: Excitability): MeasureTask[] {
  const curve =
    plan.protocol.fiCurve && control.rheobase_uA_cm2 !== null
      ? fiCurveDrives(plan.protocol.fiCurve, control.rheobase_uA_cm2)
      : [];
  return plan.conditions.map((c) => ({
    kind: 'measure',
    preset: plan.preset,
    scale: c.scale,
    inactivationShift: c.inactivationShift,
    request: {
      protocol: excitabilityProtocol(plan.protocol),
      drives_uA_cm2: [...plan.protocol.drives_uA_cm2, ...curve],
      referenceDrive_uA_cm2: control.referenceDrive_uA_cm2 ?? undefined,
      rheobaseGuess_uA_cm2: control.rheobase_uA_cm2 ?? undefined,
    },
  }));
}

/** Traces for control and the chosen condition, or none (no drive to show them at). */
export function traceTasks(
  plan: ForecastPlan,
  control: Excitability,
): { drive_uA_cm2: number; control: TraceTask; condition: TraceTask | null } | null {
  if (!plan.trace) return null;
  const drive = plan.trace.drive_uA_cm2 ?? control.referenceDrive_uA_cm2 ?? plan.protocol.drives_uA_cm2[0];
  if (drive === undefined) return null;
  const request = {
    drive_uA_cm2: drive,
    duration_ms: plan.trace.duration_ms,
    points: plan.trace.points,
    dt_ms: plan.protocol.dt_ms,
    rates: plan.protocol.rates,
  };
  const chosen = plan.conditions[plan.trace.condition];
  return {
    drive_uA_cm2: drive,
    control: { kind: 'trace', preset: plan.preset, scale: {}, request },
    condition: chosen
      ? {
          kind: 'trace',
          preset: plan.preset,
          scale: chosen.scale,
          inactivationShift: chosen.inactivationShift,
          request,
        }
      : null,
  };
}
