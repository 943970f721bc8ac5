import { measureExcitability, type Excitability, type ExcitabilityRequest } from '../neuron/excitability';
import { compileModel } from '../neuron/model';
import type { NeuronPreset } from '../neuron/types';
import { voltageTrace, type TraceRequest } from '../neuron/voltage-trace';
import type { VoltageTrace } from '../neuron/downsample';
import type { BandSample, BandTask } from './bands';

/** Units of forecast work; plain data, so they cross to a worker thread unchanged. */
export interface MeasureTask {
  kind: 'measure';
  preset: NeuronPreset;
  /** Conductance → multiplier (1 − block). */
  scale: Record<string, number>;
  request: ExcitabilityRequest;
}

export interface TraceTask {
  kind: 'trace';
  preset: NeuronPreset;
  scale: Record<string, number>;
  request: TraceRequest;
}

export type ForecastTask = MeasureTask | TraceTask | BandTask;

export function runMeasureTask(task: MeasureTask): Excitability {
  return measureExcitability(compileModel(task.preset, task.scale), task.request);
}

export function runTraceTask(task: TraceTask): VoltageTrace {
  return voltageTrace(compileModel(task.preset, task.scale), task.request);
}

/** One measurement per scale map of a band task: rheobase, threshold and the rate at the reference drive. */
export function runBandTask(task: BandTask): BandSample[] {
  return task.scales.map((scale) => {
    const e = measureExcitability(compileModel(task.preset, scale), task.request);
    return {
      rheobase_uA_cm2: e.rheobase_uA_cm2,
      threshold_mV: e.threshold_mV,
      rate_Hz: e.reference?.rate_Hz ?? null,
    };
  });
}

/** Run any kind of task (the worker's entry point uses this). */
export function runForecastTask(task: ForecastTask): Excitability | VoltageTrace | BandSample[] {
  if (task.kind === 'band') return runBandTask(task);
  return task.kind === 'measure' ? runMeasureTask(task) : runTraceTask(task);
}
