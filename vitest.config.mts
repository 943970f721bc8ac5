import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vitest/config';

// Unit and integration tests share one run; integration tests use the real test database,
// so files run one after another (Vitest 4: fileParallelism replaces poolOptions).
export default defineConfig({
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./', import.meta.url)),
      'server-only': fileURLToPath(new URL('./tests/support/server-only.ts', import.meta.url)),
    },
  },
  test: {
    include: ['tests/unit/**/*.test.ts', 'tests/integration/**/*.test.ts'],
    fileParallelism: false,
    // Integration files run the real job workers (tests/support/job-workers.ts); after-hooks run in the
    // order written, so those workers stop before a file's own afterAll closes the database.
    setupFiles: ['tests/support/job-workers.ts'],
    sequence: { hooks: 'list' },
    testTimeout: 30_000,
    hookTimeout: 60_000,
    reporters: ['default', ['json', { outputFile: 'test-output/vitest.json' }]],
  },
});
