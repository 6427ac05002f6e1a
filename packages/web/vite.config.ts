import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';
import { bundleReport } from './build/bundle-report.ts';
import { compileHints } from './build/compile-hints.ts';

const results = process.env.TEST_RESULTS_DIR;
const apiPort = process.env.API_PORT ?? '4410';
const plottingLibrary = 'plotly.js-basic-dist-min';

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    compileHints({ packages: [plottingLibrary] }),
    // The plot chunk's budget is issue 18's: Plotly parsed as one long task that froze the page.
    bundleReport({ firstPageBudget: 300 * 1024, plotChunk: { package: plottingLibrary, budget: 1_500_000 } }),
  ],
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
