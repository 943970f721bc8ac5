/** Gatewell's single-compartment neuron model: presets, integrator and excitability measures. */
export { PRESET_NAMES, getPreset, isPresetName, conductanceNames, type PresetName } from './presets';
export type { NeuronPreset, ConductanceSpec, GateSpec, GateKinetics, MembraneState } from './types';
export type { RateForm, TauForm } from './rate-forms';
export { evaluateRate, evaluateTau, expLinear } from './rate-forms';
export { compileModel, steadyStateAt, type CompiledModel } from './model';
export {
  simulate,
  DEFAULT_DT_MS,
  type RunProtocol,
  type RunResult,
  type IntegratorOptions,
} from './integrate';
export { steadyStateCurrent, fixedPoints, isStable, type FixedPoint } from './steady-state';
export { findRest, type RestResult } from './rest';
export { findRheobase, type RheobaseOptions, type RheobaseResult } from './rheobase';
export { firingRate, type FiringRate, type FiringRateOptions } from './firing-rate';
export {
  measureExcitability,
  fiCurveDrives,
  DEFAULT_EXCITABILITY_PROTOCOL,
  type FiCurve,
  type Excitability,
  type ExcitabilityFlag,
  type ExcitabilityProtocol,
  type ExcitabilityRequest,
} from './excitability';
export { voltageTrace, type TraceRequest } from './voltage-trace';
export { downsampleMinMax, type VoltageTrace } from './downsample';
