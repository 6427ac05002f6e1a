/**
 * What the benchmark records inside the page, from before its first script runs: the main
 * thread's long tasks (and the long animation frames, whose scripts say who ran), when the
 * circuit editor, the readouts and the Bode plot first appear, and when the editor accepts
 * the first keystroke. Times are `performance.now()`, milliseconds since navigation start.
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
  keyDownAt: number | null;
  keyAcceptedAt: number | null;
}

declare global {
  interface Window {
    __rolloffBench?: PageTimings;
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
    keyDownAt: null,
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

  // The length of the editor's text when the key went down: the key is accepted once it grows.
  // (Callbacks stay anonymous: tsx would wrap named ones in a helper the page does not have.)
  let lengthAtKey = -1;
  let editor: Element | null = null;
  new MutationObserver(() => {
    const now = performance.now();
    if (!editor) {
      editor = document.querySelector('[data-cell-index="0"] .cm-content');
      if (editor) timings.editorShownAt = now;
    }
    if (timings.readoutsAt === null && document.querySelector('[data-cell-index="0"] [data-readout]')) timings.readoutsAt = now;
    if (timings.plotAt === null && document.querySelector('[data-cell-index="0"] [data-testid="plot-bode"] .main-svg')) timings.plotAt = now;
    if (editor && lengthAtKey >= 0 && timings.keyAcceptedAt === null && (editor.textContent ?? '').length > lengthAtKey) timings.keyAcceptedAt = now;
  }).observe(document, { subtree: true, childList: true, characterData: true });
  document.addEventListener(
    'keydown',
    () => {
      if (timings.keyDownAt !== null || !editor) return;
      timings.keyDownAt = performance.now();
      lengthAtKey = (editor.textContent ?? '').length;
    },
    { capture: true },
  );
}
