import { measureExcitability, type Excitability, type ExcitabilityRequest } from '../neuron/excitability';
import { compileModel } from '../neuron/model';
import type { NeuronPreset } from '../neuron/types';
import { voltageTrace, type TraceRequest } from '../neuron/voltage-trace';
import type { VoltageTrace } from '../neuron/downsample';
import { bandCell, type BandCellResult, type BandTask } from './band-cell';
import { findFiringTransition, type FiringTransition, type TransitionTask } from './firing-transition';

/** Units of forecast work; plain data, so they cross to a worker thread unchanged. */
export interface MeasureTask {
  kind: 'measure';
  preset: NeuronPreset;
  /** Conductance → multiplier (1 − block). */
  scale: Record<string, number>;
  /** Conductance → shift of its inactivation (mV), for state-dependent block. @default none */
  inactivationShift?: Record<string, number>;
  request: ExcitabilityRequest;
}

export interface TraceTask {
  kind: 'trace';
  preset: NeuronPreset;
  scale: Record<string, number>;
  inactivationShift?: Record<string, number>;
  request: TraceRequest;
}

export type ForecastTask = MeasureTask | TraceTask | BandTask | TransitionTask;

export function runMeasureTask(task: MeasureTask): Excitability {
  return measureExcitability(compileModel(task.preset, task.scale, task.inactivationShift), task.request);
}

export function runTraceTask(task: TraceTask): VoltageTrace {
  return voltageTrace(compileModel(task.preset, task.scale, task.inactivationShift), task.request);
}

/** The bands of one concentration (band-cell.ts). */
export function runBandTask(task: BandTask): BandCellResult {
  return bandCell(task);
}

/** Run any kind of task (the worker's entry point uses this). */
export function runForecastTask(
  task: ForecastTask,
): Excitability | VoltageTrace | BandCellResult | FiringTransition {
  if (task.kind === 'band') return runBandTask(task);
  if (task.kind === 'transition') return findFiringTransition(task);
  return task.kind === 'measure' ? runMeasureTask(task) : runTraceTask(task);
}
