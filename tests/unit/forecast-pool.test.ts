// The worker-thread pool gives exactly the in-thread forecast, and caches results.
import { afterAll, beforeEach, expect, test } from 'vitest';
import { computeForecast } from '@/lib/science/forecast/forecast';
import {
  clearForecastCache,
  closeForecastPool,
  FORECAST_WORKER_FILE,
  forecastPoolStats,
  runForecast,
} from '@/lib/compute/forecast-pool';
import { ForecastRequestError } from '@/lib/science/forecast/request-schema';

afterAll(closeForecastPool);
beforeEach(clearForecastCache);

const request = {
  preset: 'pospischil-rs-2008',
  potencies: { gNa: { ic50: 1, hill: 1 }, gM: { ic50: 3, hill: 1.2 } },
  concentrations: [0.3, 3],
  protocol: { drives_uA_cm2: [4] },
  trace: { points: 300, condition: 1 },
} as const;

test('the worker file is resolved from the repository root', () => {
  expect(FORECAST_WORKER_FILE).toBe(`${process.cwd()}/lib/compute/forecast-worker.ts`);
});

test('runForecast on worker threads returns the same as computeForecast', async () => {
  const pooled = await runForecast(request);
  expect(pooled).toEqual(computeForecast(request));
  expect(pooled.conditions).toHaveLength(2);
  expect(pooled.traces?.condition).not.toBeNull();
});

test('a repeated forecast comes from the cache, one entry per condition and trace', async () => {
  const before = forecastPoolStats().tasksRun;
  const first = await runForecast(request);
  // Control, two conditions, two traces.
  expect(forecastPoolStats()).toEqual({ cachedResults: 5, tasksRun: before + 5 });
  const again = await runForecast(request);
  expect(again).toEqual(first);
  expect(forecastPoolStats()).toEqual({ cachedResults: 5, tasksRun: before + 5 });
  // A new concentration adds only its own condition.
  await runForecast({ ...request, concentrations: [0.3, 3, 10] });
  expect(forecastPoolStats()).toEqual({ cachedResults: 6, tasksRun: before + 6 });
});

test('simultaneous identical forecasts share the work', async () => {
  const before = forecastPoolStats().tasksRun;
  const [a, b] = await Promise.all([runForecast(request), runForecast(request)]);
  expect(a).toEqual(b);
  expect(a).not.toBe(b);
  expect(forecastPoolStats().tasksRun).toBe(before + 5);
});

test('an invalid request is refused before any work', async () => {
  await expect(runForecast({ preset: 'hh-squid-1952', block: { gM: 0.2 } })).rejects.toBeInstanceOf(
    ForecastRequestError,
  );
});
