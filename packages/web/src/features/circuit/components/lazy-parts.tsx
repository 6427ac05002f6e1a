/**
 * The heavy parts of a circuit cell, each in its own lazily loaded chunk: the CodeMirror
 * editor and the Plotly plots. Their fallbacks keep the layout while they load.
 */
import { lazy, Suspense } from 'react';
import type { ComponentProps } from 'react';

const CircuitEditorChunk = lazy(() => import('../editor/circuit-editor'));
const CircuitPlotsChunk = lazy(() => import('../plot/circuit-plots'));

/** The circuit editor, loaded on first use. */
export function LazyCircuitEditor(props: ComponentProps<typeof CircuitEditorChunk>) {
  return (
    <Suspense fallback={<pre className="min-h-40 overflow-auto rounded-lg border border-rule bg-panel p-3 font-mono text-sm text-ink-soft">{props.value}</pre>}>
      <CircuitEditorChunk {...props} />
    </Suspense>
  );
}

/** The plots, loaded on first use. */
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
