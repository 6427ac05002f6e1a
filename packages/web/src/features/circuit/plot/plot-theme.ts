/**
 * The plot colours, read from the palette's CSS variables so a plot follows the light or
 * dark theme; re-read whenever the theme changes.
 */
import { useEffect, useState } from 'react';
import type { PlotTheme } from './figure-style';

/** Reads the current palette from the document. */
export function readPlotTheme(): PlotTheme {
  const style = getComputedStyle(document.documentElement);
  const get = (name: string, fallback: string) => style.getPropertyValue(name).trim() || fallback;
  return {
    font: 'Fira Sans, ui-sans-serif, system-ui, sans-serif',
    monoFont: 'Fira Mono, ui-monospace, monospace',
    ink: get('--ink', '#1d2a2e'),
    inkSoft: get('--ink-soft', '#4b5b60'),
    rule: get('--rule', '#dcd7cb'),
    panel: get('--panel', '#fffdf9'),
    pass: get('--pass', '#2f7a4f'),
    fail: get('--fail', '#b4462f'),
    pin: get('--sand', '#c99a3c'),
    traces: [1, 2, 3, 4, 5, 6].map((i) => get(`--trace-${i}`, '#1f5d6b')),
  };
}

/** The palette as a plot theme, updated when the user or the system switches theme. */
export function usePlotTheme(): PlotTheme {
  const [theme, setTheme] = useState(readPlotTheme);
  useEffect(() => {
    const update = () => setTheme(readPlotTheme());
    const observer = new MutationObserver(update);
    observer.observe(document.documentElement, { attributes: true, attributeFilter: ['data-theme'] });
    const media = window.matchMedia?.('(prefers-color-scheme: dark)');
    media?.addEventListener('change', update);
    return () => {
      observer.disconnect();
      media?.removeEventListener('change', update);
    };
  }, []);
  return theme;
}
