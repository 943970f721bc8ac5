import { assembleForecast, type ForecastResult } from './assemble';
import { planBands } from './bands';
import { findFiringTransition } from './firing-transition';
import { conditionTasks, controlTask, planForecast, traceTasks } from './plan';
import { parseForecastRequest } from './request-schema';
import { runBandTask, runMeasureTask, runTraceTask } from './tasks';

/**
 * Excitability forecast computed in this thread: control, every blocked condition, the traces and,
 * when asked for, the uncertainty bands.
 * The app calls runForecast (lib/compute/forecast-pool.ts) instead, which does the same work on worker threads.
 * Throws ForecastRequestError on an invalid request.
 */
export function computeForecast(input: unknown): ForecastResult {
  const plan = planForecast(parseForecastRequest(input));
  const control = runMeasureTask(controlTask(plan));
  const conditions = conditionTasks(plan, control).map(runMeasureTask);
  const t = traceTasks(plan, control);
  const traces = t
    ? {
        drive_uA_cm2: t.drive_uA_cm2,
        control: runTraceTask(t.control),
        condition: t.condition ? runTraceTask(t.condition) : null,
      }
    : null;
  const bandWork = planBands(plan, control);
  const bands = bandWork
    ? bandWork.assemble(
        new Map(bandWork.conditions.map((i) => [i, runBandTask(bandWork.task(i, conditions[i]!))])),
        findFiringTransition(bandWork.transitionTask(control, conditions)),
      )
    : null;
  return assembleForecast(plan, control, conditions, traces, bands);
}
