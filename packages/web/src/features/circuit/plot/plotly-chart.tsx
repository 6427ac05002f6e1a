/**
 * A thin wrapper of our own around Plotly.react and Plotly.purge: draws a figure into a
 * div, redraws in place when the figure changes, reports clicks on its points, and frees
 * Plotly's state on unmount. Plotly's own mode bar is off (its buttons, and with them any
 * offer to send the chart to Plotly's hosted service): the plot toolbar is ours.
 * This module is only reached through a lazy import, so Plotly stays out of the first page.
 */
import Plotly from 'plotly.js-basic-dist-min';
import { useEffect, useImperativeHandle, useRef } from 'react';
import type { Ref } from 'react';
import { TIMING } from '../../../lib/timing';
import type { ClickedPoint } from './plot-pins';
import type { Figure } from './figure-style';

export interface ChartHandle {
  /** Saves the figure as a PNG or SVG file. */
  download(format: 'png' | 'svg', filename: string): Promise<void>;
  /** Back to the figure's own axis ranges after zooming or panning. */
  resetZoom(): Promise<void>;
}

export const chartConfig: Partial<Plotly.Config> = {
  responsive: true,
  displayModeBar: false,
  displaylogo: false,
  showLink: false,
  showSendToCloud: false,
  showEditInChartStudio: false,
};

export interface PlotlyChartProps {
  figure: Figure;
  label: string;
  className?: string;
  /** Called with the points under the pointer when the plot is clicked. */
  onPointClick?: (points: ClickedPoint[]) => void;
  ref?: Ref<ChartHandle>;
}

/** One Plotly chart. */
export function PlotlyChart({ figure, label, className, onPointClick, ref }: PlotlyChartProps) {
  const element = useRef<HTMLDivElement>(null);
  // Read through a ref, so a new callback does not mean re-registering with Plotly.
  const clicked = useRef(onPointClick);
  clicked.current = onPointClick;

  const drawn = useRef(false);
  const generation = useRef(0);

  // Plotly writes zoom and pan into the layout it is given: it gets a copy, so the figure's
  // own ranges stay as they were and resetting the zoom is drawing the figure again.
  const draw = async (target: HTMLDivElement) => {
    const layout = structuredClone(figure.layout);
    const current = ++generation.current;
    let plot: Plotly.PlotlyHTMLElement;
    if (drawn.current) {
      const start = performance.now();
      plot = await Plotly.react(target, figure.data, layout, chartConfig);
      performance.measure(TIMING.plotDraw, { start, end: performance.now() });
    } else {
      // The first draw is the heaviest: the axes and curves, then in a task of their own the
      // shapes and annotations, so neither half holds the main thread as long as the whole.
      drawn.current = true;
      plot = await Plotly.react(target, figure.data, { ...layout, shapes: [], annotations: [] }, chartConfig);
      await new Promise((resolve) => setTimeout(resolve, 0));
      // A newer figure drawn meanwhile has its own shapes and annotations (or the chart is gone).
      if (current !== generation.current) return;
      plot = await Plotly.relayout(target, { shapes: layout.shapes ?? [], annotations: layout.annotations ?? [] });
    }
    plot.removeAllListeners('plotly_click');
    plot.on('plotly_click', (event) => clicked.current?.(event.points));
  };

  // Drawn in a task of its own, never inside React's commit: a commit that follows a keystroke
  // then ends as soon as the editor has the key, and the plot catches up after.
  useEffect(() => {
    const timer = setTimeout(() => {
      if (element.current) void draw(element.current);
    }, 0);
    return () => clearTimeout(timer);
  }, [figure]);

  useEffect(() => {
    const target = element.current;
    return () => {
      // A first draw still halfway through must not finish on a purged chart.
      generation.current += 1;
      if (target) Plotly.purge(target);
    };
  }, []);

  useImperativeHandle(ref, () => ({
    async download(format, filename) {
      if (!element.current) return;
      await Plotly.downloadImage(element.current, { format, filename, width: element.current.clientWidth || 900, height: element.current.clientHeight || 520 });
    },
    async resetZoom() {
      if (element.current) await draw(element.current);
    },
  }));

  return <div ref={element} role="img" aria-label={label} className={className} data-testid={`plot-${figure.kind}`} />;
}
