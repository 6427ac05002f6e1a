/**
 * What the benchmark records inside the page, from before its first script runs: the main
 * thread's long tasks (and the long animation frames, whose scripts say who ran), when the
 * circuit editor, the readouts and the Bode plot first appear, and when the editor accepts
 * the first keystroke. Times are `performance.now()`, milliseconds since navigation start.
 * The moment the editor appears, the page tells the benchmark where its first line is, so the
 * click and the key are sent at once, not after a round trip of polling.
 */

export interface LongTask {
  start: number;
  duration: number;
}

/** The longest script of a long animation frame: which file and function ran. */
export interface FrameScript {
  start: number;
  duration: number;
  source: string;
  invoker: string;
}

export interface PageTimings {
  longTasks: LongTask[];
  frameScripts: FrameScript[];
  editorShownAt: number | null;
  readoutsAt: number | null;
  plotAt: number | null;
  /** When the browser took the click into the editor (the event's time stamp). */
  clickAt: number | null;
  keyAcceptedAt: number | null;
}

/** A point on the page, in CSS pixels of the viewport. */
export interface Point {
  x: number;
  y: number;
}

declare global {
  interface Window {
    __rolloffBench?: PageTimings;
    /** Exposed by the benchmark: clicks at the point and types a key. */
    __rolloffBenchEditorShown?: (point: Point) => void;
  }
}

/**
 * Installs the recorders (passed to `addInitScript`, so it runs in the page and uses nothing
 * from this module's scope).
 */
export function installProbe(): void {
  const timings: PageTimings = {
    longTasks: [],
    frameScripts: [],
    editorShownAt: null,
    readoutsAt: null,
    plotAt: null,
    clickAt: null,
    keyAcceptedAt: null,
  };
  window.__rolloffBench = timings;

  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) timings.longTasks.push({ start: entry.startTime, duration: entry.duration });
  }).observe({ type: 'longtask', buffered: true });

  interface ScriptTiming {
    startTime: number;
    duration: number;
    sourceURL: string;
    sourceFunctionName: string;
    invoker: string;
  }
  if (PerformanceObserver.supportedEntryTypes.includes('long-animation-frame')) {
    new PerformanceObserver((list) => {
      for (const entry of list.getEntries()) {
        const scripts = (entry as PerformanceEntry & { scripts?: ScriptTiming[] }).scripts ?? [];
        const longest = scripts.reduce<ScriptTiming | null>((a, b) => (a && a.duration >= b.duration ? a : b), null);
        if (!longest) continue;
        const file = longest.sourceURL.split('/').pop() ?? '';
        timings.frameScripts.push({
          start: longest.startTime,
          duration: longest.duration,
          source: `${file}${longest.sourceFunctionName ? ` ${longest.sourceFunctionName}` : ''}`,
          invoker: longest.invoker,
        });
      }
    }).observe({ type: 'long-animation-frame', buffered: true });
  }

  // The key is accepted once the editor's text is longer than when the editor appeared.
  // (Callbacks stay anonymous: tsx would wrap named ones in a helper the page does not have.)
  let lengthAtKey = -1;
  let editor: Element | null = null;
  new MutationObserver(() => {
    const now = performance.now();
    if (!editor) {
      editor = document.querySelector('[data-cell-index="0"] .cm-content');
      const line = editor?.querySelector('.cm-line');
      if (editor && line) {
        timings.editorShownAt = now;
        lengthAtKey = (editor.textContent ?? '').length;
        // The right end of the first line, a comment: typing there changes no part or value.
        const box = line.getBoundingClientRect();
        window.__rolloffBenchEditorShown?.({ x: box.right - 4, y: box.top + box.height / 2 });
      } else {
        editor = null;
      }
    }
    if (timings.readoutsAt === null && document.querySelector('[data-cell-index="0"] [data-readout]')) timings.readoutsAt = now;
    if (timings.plotAt === null && document.querySelector('[data-cell-index="0"] [data-testid="plot-bode"] .main-svg')) timings.plotAt = now;
    if (editor && lengthAtKey >= 0 && timings.keyAcceptedAt === null && (editor.textContent ?? '').length > lengthAtKey) timings.keyAcceptedAt = now;
  }).observe(document, { subtree: true, childList: true, characterData: true });
  document.addEventListener(
    'mousedown',
    (event) => {
      if (timings.clickAt === null && editor) timings.clickAt = event.timeStamp;
    },
    { capture: true },
  );
}
