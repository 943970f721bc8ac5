import { runForecastTask, type ForecastTask } from './tasks';

/** Worker-thread entry point for the forecast pool (pool.ts): one task in, its result out. */
export default function forecastWorker(task: ForecastTask) {
  return runForecastTask(task);
}
