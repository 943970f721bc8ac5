// No 'server-only' marker here, unlike the rest of lib/: this file is loaded by a worker thread that
// tsx starts without the react-server condition, where the marker would throw. It is only ever
// started by the pool (forecast-pool.ts) and runs pure science code. The import is relative so that
// it does not depend on the path aliases of whichever tool starts the thread.
import { runForecastTask, type ForecastTask } from '../science/forecast/tasks';

/** Worker-thread entry point for the forecast pool (forecast-pool.ts): one task in, its result out. */
export default function forecastWorker(task: ForecastTask) {
  return runForecastTask(task);
}
