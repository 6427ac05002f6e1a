/**
 * A thin wrapper of our own around Plotly.react and Plotly.purge: draws a figure into a
 * div, redraws in place when the figure changes, reports clicks on its points, and frees
 * Plotly's state on unmount.
 * This module is only reached through a lazy import, so Plotly stays out of the first page.
 */
import Plotly from 'plotly.js-basic-dist-min';
import { useEffect, useImperativeHandle, useRef } from 'react';
import type { Ref } from 'react';
import type { ClickedPoint } from './plot-pins';
import type { Figure } from './result-figures';

export interface ChartHandle {
  /** Saves the figure as a PNG or SVG file. */
  download(format: 'png' | 'svg', filename: string): Promise<void>;
}

const config: Partial<Plotly.Config> = {
  responsive: true,
  displaylogo: false,
  displayModeBar: 'hover',
  modeBarButtonsToRemove: ['toImage', 'lasso2d', 'select2d', 'autoScale2d'],
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

  useEffect(() => {
    const target = element.current;
    if (!target) return;
    void Plotly.react(target, figure.data, figure.layout, config).then((plot) => {
      plot.removeAllListeners('plotly_click');
      plot.on('plotly_click', (event) => clicked.current?.(event.points));
    });
  }, [figure]);

  useEffect(() => {
    const target = element.current;
    return () => {
      if (target) Plotly.purge(target);
    };
  }, []);

  useImperativeHandle(ref, () => ({
    async download(format, filename) {
      if (!element.current) return;
      await Plotly.downloadImage(element.current, { format, filename, width: element.current.clientWidth || 900, height: element.current.clientHeight || 520 });
    },
  }));

  return <div ref={element} role="img" aria-label={label} className={className} data-testid={`plot-${figure.kind}`} />;
}
