/**
 * The heavy parts of a circuit cell, each in its own lazily loaded chunk: the CodeMirror
 * editor and the Plotly plots. Their fallbacks keep the layout while they load.
 *
 * The plots never stand between the designer and the editor: their chunk is fetched only
 * once an editor on the page has shown and the browser has been idle after it (on a page
 * without an editor, once the browser is idle), so the editor takes keys while Plotly loads,
 * and the readouts, which need no Plotly, show first.
 */
import { lazy, Suspense, useEffect } from 'react';
import type { ComponentProps } from 'react';

/** Settles when the first editor on the page has been mounted; null until an editor is rendered. */
let editorShown: Promise<void> | null = null;
let markEditorShown = () => {};

function awaitEditor(): void {
  editorShown ??= new Promise((resolve) => {
    markEditorShown = resolve;
  });
}

const delay = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/** Resolves when the browser is idle (within `timeout` ms even if it never is). */
function whenIdle(timeout: number): Promise<void> {
  if (typeof requestIdleCallback !== 'function') return delay(0);
  return new Promise((resolve) => requestIdleCallback(() => resolve(), { timeout }));
}

const CircuitEditorChunk = lazy(() => import('../editor/circuit-editor'));
const CircuitPlotsChunk = lazy(async () => {
  // An editor that cannot load must not keep the plots away for good.
  if (editorShown) await Promise.race([editorShown, delay(10_000)]);
  await whenIdle(3000);
  return import('../plot/circuit-plots');
});

/** Marks the editor shown once it has mounted (its effects run after the editor's own). */
function EditorShown() {
  useEffect(() => markEditorShown(), []);
  return null;
}

/** The circuit editor, loaded on first use. */
export function LazyCircuitEditor(props: ComponentProps<typeof CircuitEditorChunk>) {
  awaitEditor();
  return (
    <Suspense fallback={<pre className="min-h-40 overflow-auto rounded-lg border border-rule bg-panel p-3 font-mono text-sm text-ink-soft">{props.value}</pre>}>
      <CircuitEditorChunk {...props} />
      <EditorShown />
    </Suspense>
  );
}

/** The plots, loaded once the editor (if any) is up and the page is idle. */
export function LazyCircuitPlots(props: ComponentProps<typeof CircuitPlotsChunk>) {
  return (
    <Suspense fallback={<PlotPlaceholder text="Loading the plot…" />}>
      <CircuitPlotsChunk {...props} />
    </Suspense>
  );
}

/** An empty plot frame with a short message. */
export function PlotPlaceholder({ text }: { text: string }) {
  return (
    <div role="status" className="flex h-80 items-center justify-center rounded-lg border border-dashed border-rule bg-panel text-sm text-ink-faint">
      {text}
    </div>
  );
}
