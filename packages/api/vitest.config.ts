import { defineConfig } from 'vitest/config';

const results = process.env.TEST_RESULTS_DIR;

export default defineConfig({
  test: {
    include: ['src/**/*.test.ts', 'test/**/*.test.ts'],
    globalSetup: ['test/global-setup.ts'],
    // The tests share one MariaDB database: run files one after another.
    fileParallelism: false,
    testTimeout: 20_000,
    hookTimeout: 60_000,
    reporters: results ? ['default', 'json'] : ['default'],
    outputFile: results ? { json: `${results}/api.json` } : undefined,
  },
});
