/**
 * User Timing measures of the steps between a keystroke and a redrawn plot. They cost next to
 * nothing, show in the browser's performance panel, and the keystroke benchmark reads them
 * to say where the time went (bench/keystroke-plot.ts).
 */
export const TIMING = {
  solve: 'rolloff:solve',
  figures: 'rolloff:figures',
  plotDraw: 'rolloff:plot-draw',
} as const;

/** Runs `work` and records how long it took under `name`. */
export function timed<T>(name: string, work: () => T): T {
  const start = performance.now();
  try {
    return work();
  } finally {
    performance.measure(name, { start, end: performance.now() });
  }
}

/** Records a step that ran elsewhere (in the worker) and ended now. */
export function recordElapsed(name: string, elapsedMs: number): void {
  const end = performance.now();
  performance.measure(name, { start: end - elapsedMs, end });
}
