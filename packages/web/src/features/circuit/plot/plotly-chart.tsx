/**
 * A thin wrapper of our own around Plotly.react and Plotly.purge: draws a figure into a
 * div, redraws in place when the figure changes, and frees Plotly's state on unmount.
 * This module is only reached through a lazy import, so Plotly stays out of the first page.
 */
import Plotly from 'plotly.js-dist-min';
import { useEffect, useImperativeHandle, useRef } from 'react';
import type { Ref } from 'react';
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

/** One Plotly chart. */
export function PlotlyChart({ figure, label, className, ref }: { figure: Figure; label: string; className?: string; ref?: Ref<ChartHandle> }) {
  const element = useRef<HTMLDivElement>(null);

  useEffect(() => {
    const target = element.current;
    if (!target) return;
    void Plotly.react(target, figure.data, figure.layout, config);
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
