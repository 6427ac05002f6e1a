import { defineConfig } from 'vitest/config';

const results = process.env.TEST_RESULTS_DIR;

export default defineConfig({
  test: {
    include: ['test/**/*.test.ts'],
    setupFiles: ['test/setup-fast-check.ts'],
    reporters: results ? ['default', 'json'] : ['default'],
    outputFile: results ? { json: `${results}/solver.json` } : undefined,
  },
});
