import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';
import { bundleReport } from './build/bundle-report.ts';

const results = process.env.TEST_RESULTS_DIR;
const apiPort = process.env.API_PORT ?? '4410';

export default defineConfig({
  plugins: [react(), tailwindcss(), bundleReport({ firstPageBudget: 300 * 1024 })],
  server: {
    // `npm run dev` in this package: the API runs beside it.
    proxy: { '/api': `http://127.0.0.1:${apiPort}`, '/auth': `http://127.0.0.1:${apiPort}` },
  },
  build: {
    sourcemap: true,
    reportCompressedSize: true,
  },
  worker: { format: 'es' },
  test: {
    include: ['src/**/*.test.{ts,tsx}'],
    environment: 'jsdom',
    reporters: results ? ['default', 'json'] : ['default'],
    outputFile: results ? { json: `${results}/web.json` } : undefined,
  },
});
