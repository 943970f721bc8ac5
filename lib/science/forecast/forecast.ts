import { assembleForecast, type ForecastResult } from './assemble';
import { conditionTasks, controlTask, planForecast, traceTasks } from './plan';
import { parseForecastRequest } from './request-schema';
import { runMeasureTask, runTraceTask } from './tasks';

/**
 * Excitability forecast computed in this thread: control, every blocked condition and the traces.
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
  return assembleForecast(plan, control, conditions, traces);
}
