/**
 * Keystroke → redrawn plot (issue 13's budget): a circuit cell of 20 parts swept at 1 001
 * points, open in Debian's Chromium at the machine's own speed. The benchmark types into a
 * value the whole network depends on (`let R = 10k` becomes `110k`, then `10k` again), so each
 * key means a new solve in the worker, new figures and a redraw, and times each key from its
 * `keydown` to the first frame painted after the Bode plot's curve changed. Budget: median
 * under 50 ms. Prints a table for BENCHMARKS.md and exits 1 when the budget is missed.
 * BENCH_KEYS sets the number of timed keys (20; three more are typed first, untimed).
 */
import { openBrowser } from '../e2e/browser';
import { TIMING } from '../src/lib/timing';
import { baseUrl, createNotebook, deleteNotebook, machineLine, median, ms, requireServer, signIn } from './bench-server';

const keys = Number(process.env.BENCH_KEYS ?? 20);
const warmUpKeys = 3;
const budgetMs = 50;

/** Ten RC sections, every resistor R: 20 parts; 200 points a decade over 5 decades is 1 001 points. */
const sections = Array.from({ length: 10 }, (_, i) => [`R${i + 1} [${i === 0 ? 'in' : `n${i}`} n${i + 1}] R`, `C${i + 1} [n${i + 1} gnd] 1n`]).flat();
const CELL = ['let R = 10k', 'drive in', ...sections, 'show "out" n10', 'sweep 10 .. 1M, 200/decade', 'require out gain >= -3 dB at 100'].join('\n');

/** One key: keydown → first paint after the Bode curve changed, and the steps measured inside it. */
interface KeyTiming {
  total: number;
  /** The User Timing measures of src/lib/timing.ts that began after the key, summed by name. */
  steps: Record<string, number>;
}

declare global {
  interface Window {
    __rolloffKeyToPlot?: KeyTiming[];
  }
}

/** Runs in the page (addInitScript): pairs each key with the next change of the Bode curve. */
function installKeyProbe(): void {
  const timings: KeyTiming[] = [];
  window.__rolloffKeyToPlot = timings;
  let keyAt: number | null = null;
  document.addEventListener(
    'keydown',
    (event) => {
      keyAt = event.timeStamp;
    },
    { capture: true },
  );
  new MutationObserver((records) => {
    if (keyAt === null) return;
    const curveChanged = records.some((r) => r.target instanceof Element && r.target.closest('[data-testid="plot-bode"] .scatterlayer'));
    if (!curveChanged) return;
    const start = keyAt;
    keyAt = null;
    // The frame that shows the new curve: after the next animation frame has been painted.
    requestAnimationFrame(() =>
      setTimeout(() => {
        const steps: Record<string, number> = {};
        for (const m of performance.getEntriesByType('measure')) if (m.startTime >= start) steps[m.name] = (steps[m.name] ?? 0) + m.duration;
        timings.push({ total: performance.now() - start, steps });
      }, 0),
    );
  }).observe(document, { subtree: true, attributes: true, attributeFilter: ['d'], childList: true });
}

const STEPS: Record<string, string> = {
  [TIMING.solve]: 'the solve in the worker',
  [TIMING.figures]: 'building the figures',
  [TIMING.plotDraw]: 'Plotly redrawing',
};

/** Median, 90th percentile and worst, as table cells. */
function spread(values: number[]): string {
  const sorted = [...values].sort((a, b) => a - b);
  const p90 = sorted[Math.min(sorted.length - 1, Math.ceil(0.9 * sorted.length) - 1)];
  return `${ms(median(values))} | ${ms(p90)} | ${ms(sorted[sorted.length - 1])}`;
}

async function main(): Promise<void> {
  await requireServer();
  const session = await openBrowser();
  const { page } = session;
  try {
    await signIn(page);
    await page.context().addInitScript(installKeyProbe);
    const id = await createNotebook(page, `Keystroke benchmark ${new Date().toISOString()}`, CELL);
    try {
      await page.goto(`${baseUrl}/notebooks/${id}`);
      await page.locator('[data-cell-index="0"] [data-testid="plot-bode"] .main-svg').first().waitFor({ timeout: 60_000 });
      // The cursor between `1` and `0k` of `let R = 10k`.
      await page.locator('[data-cell-index="0"] .cm-line').first().click();
      await page.keyboard.press('End');
      await page.keyboard.press('ArrowLeft');
      await page.keyboard.press('ArrowLeft');
      for (let i = 0; i < warmUpKeys + keys; i++) {
        const before = await page.evaluate(() => window.__rolloffKeyToPlot!.length);
        await page.keyboard.press(i % 2 === 0 ? '1' : 'Backspace');
        await page.waitForFunction((n) => window.__rolloffKeyToPlot!.length > n, before, { timeout: 30_000 });
        // Let the autosave and the readouts settle, as a person pausing between keys would.
        await page.waitForTimeout(300);
      }
      const timed = (await page.evaluate(() => window.__rolloffKeyToPlot!)).slice(warmUpKeys);
      const totals = timed.map((t) => t.total);
      const verdict = median(totals) <= budgetMs ? '✓' : '✗ over budget';
      console.log(machineLine());
      console.log(`${keys} keys into a 20-part cell at 1 001 points, CPU at its own speed (after ${warmUpKeys} untimed keys)`);
      console.log('');
      console.log('| measure | median | 90th percentile | worst | budget |');
      console.log('|---|---|---|---|---|');
      console.log(`| keystroke → Bode plot redrawn and painted | ${spread(totals)} | median < ${budgetMs} ms ${verdict} |`);
      for (const [name, step] of Object.entries(STEPS)) console.log(`| (of which: ${step}) | ${spread(timed.map((t) => t.steps[name] ?? 0))} | |`);
      if (median(totals) > budgetMs) process.exitCode = 1;
    } finally {
      await deleteNotebook(page, id);
    }
  } finally {
    await session.close();
  }
}

main().catch((error: unknown) => {
  console.error(error instanceof Error ? error.message : error);
  process.exitCode = 1;
});
