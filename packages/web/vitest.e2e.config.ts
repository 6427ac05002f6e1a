import { defineConfig } from 'vitest/config';

const results = process.env.TEST_RESULTS_DIR;

// End-to-end tests: real Chromium against the real server that `npm test` started.
export default defineConfig({
  test: {
    include: ['e2e/**/*.e2e.ts'],
    fileParallelism: false,
    testTimeout: 60_000,
    hookTimeout: 60_000,
    reporters: results ? ['default', 'json'] : ['default'],
    outputFile: results ? { json: `${results}/e2e.json` } : undefined,
  },
});
