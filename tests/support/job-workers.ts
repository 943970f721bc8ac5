// Vitest setup: every integration test file runs Gatewell's real job workers (fits and forecasts) in
// its own process, as the web server does, so that imports get their fits and forecasts get computed.
// Queue tests that need the queue without workers call stopJobWorkers() themselves.
import { afterAll, beforeAll, expect } from 'vitest';

const integration = (path: string | undefined) =>
  Boolean(path && /[/\\]tests[/\\]integration[/\\]/.test(path));
let started = false;

beforeAll(async () => {
  if (!integration(expect.getState().testPath)) return;
  const { startJobWorkers } = await import('@/lib/jobs/worker');
  await startJobWorkers({ sweep: false });
  started = true;
});

afterAll(async () => {
  if (!started) return;
  const { stopJobWorkers } = await import('@/lib/jobs/worker');
  await stopJobWorkers();
});
