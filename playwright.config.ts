import { defineConfig, devices } from '@playwright/test';

const port = Number(process.env.GATEWELL_E2E_PORT ?? 4311);

const browser = {
  ...devices['Desktop Chrome'],
  viewport: { width: 1280, height: 860 },
  launchOptions: {
    executablePath: '/usr/bin/chromium',
    args: [
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
    ],
  },
};

// End-to-end tests drive Debian's Chromium against the production build that scripts/test.sh made.
export default defineConfig({
  testDir: 'tests/e2e',
  outputDir: 'test-output/playwright-artifacts',
  fullyParallel: false,
  workers: 1,
  retries: 0,
  timeout: 60_000,
  // Fits and forecasts arrive from the worker process a moment after the change that queued them.
  expect: { timeout: 10_000 },
  reporter: [['list'], ['json', { outputFile: 'test-output/playwright.json' }]],
  use: {
    baseURL: `http://127.0.0.1:${port}`,
    trace: 'retain-on-failure',
    screenshot: 'only-on-failure',
    viewport: { width: 1280, height: 860 },
  },
  // Fault tests (tests/e2e/faults) take the database and the mail server away under the running server,
  // so they run last, in a project of their own, once every other test has finished.
  projects: [
    { name: 'chromium', testIgnore: 'faults/**', use: browser },
    { name: 'faults', testMatch: 'faults/**/*.spec.ts', dependencies: ['chromium'], use: browser },
  ],
  // The topology of a team install in miniature: two web processes on one port (scripts/serve.mjs) that
  // only enqueue (GATEWELL_JOB_WORKER=off), and a separate worker process that takes the import, fit and
  // forecast jobs (docs/operations.md, "Topology").
  webServer: [
    {
      command: `node scripts/serve.mjs --port ${port} --hostname 127.0.0.1 --processes 2`,
      url: `http://127.0.0.1:${port}/api/health`,
      // GATEWELL_E2E_REUSE=1 runs against a server already listening on the port (e.g. the demo on 4310).
      reuseExistingServer: Boolean(process.env.GATEWELL_E2E_REUSE),
      timeout: 120_000,
      stdout: 'ignore',
      stderr: 'pipe',
      // The servers get the app's role only, not the schema owner's URL the test run holds.
      env: { GATEWELL_JOB_WORKER: 'off', DATABASE_OWNER_URL: '' },
    },
    ...(process.env.GATEWELL_E2E_REUSE
      ? []
      : [
          {
            // GATEWELL_E2E_WORKER_ARGS: scripts/test.sh runs Vitest beside Playwright and so keeps the worker at
            // normal priority (--scheduling nice --nice 0); in the idle class it would wait for Vitest's CPU.
            command:
              `node --conditions=react-server --import tsx scripts/worker.ts ${process.env.GATEWELL_E2E_WORKER_ARGS ?? ''}`.trim(),
            wait: { stdout: /taking jobs/ },
            timeout: 60_000,
            stdout: 'pipe' as const,
            stderr: 'pipe' as const,
            env: { DATABASE_OWNER_URL: '' },
          },
        ]),
  ],
});
