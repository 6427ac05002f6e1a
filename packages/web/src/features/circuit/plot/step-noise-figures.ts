/** The noise-density plot and the step-response plot. */
import { formatSi } from '@rolloff/solver';
import type { Layout, ScatterData } from 'plotly.js-basic-dist-min';
import { finiteOrNull, colourOf, legendName, baseLayout, axisStyle, frequencyAxis } from './figure-style';
import type { PlotTheme, PlotSeries, Figure } from './figure-style';
import { slotsOf, slotLabel } from './trace-slots';
import { variantShade } from './variant-shades';

export function noiseFigure(series: PlotSeries[], theme: PlotTheme): Figure | null {
  const slots = slotsOf(series, (k) => k === 'noise', theme);
  if (slots.length === 0) return null;
  const data: Partial<ScatterData>[] = slots.map((slot) => ({
    type: 'scatter',
    mode: 'lines',
    name: legendName(slot.series, slotLabel(slot)),
    x: finiteOrNull(slot.frequencies),
    y: finiteOrNull(slot.trace.magnitude),
    line: { color: slot.colour, width: 2, dash: slot.series.dash ?? 'solid' },
    customdata: Array.from(slot.frequencies, (f, i) => [formatSi(f, 'Hz'), formatSi(slot.trace.magnitude[i], 'V')]),
    hovertemplate: '%{customdata[0]}<br>%{customdata[1]}/√Hz<extra>%{fullData.name}</extra>',
  }));
  const layout: Partial<Layout> = {
    ...baseLayout(theme),
    xaxis: frequencyAxis(theme, series[0].result.frequencies, 'y'),
    yaxis: { ...axisStyle(theme), type: 'log', title: { text: 'noise density (V/√Hz)' }, exponentformat: 'SI' },
  };
  return { kind: 'noise', title: 'Noise density', data, layout, targets: data.map(() => null) };
}

export function stepFigure(series: PlotSeries[], theme: PlotTheme): Figure | null {
  const data: Partial<ScatterData>[] = [];
  const colours = new Map<string, string>();
  for (const s of series) {
    // A cell with a vary line: each variant's step traces, in shades of the trace's colour.
    const variants = s.result.variants ?? [{ label: null, steps: s.result.steps }];
    variants.forEach((variant, index) => {
      for (const step of variant.steps) {
        if (!colours.has(step.label)) colours.set(step.label, colourOf(theme, colours.size));
        data.push({
          type: 'scatter',
          mode: 'lines',
          name: legendName(s, variant.label === null ? step.label : `${step.label} · ${variant.label}`),
          x: finiteOrNull(step.times),
          y: finiteOrNull(step.values),
          line: { color: variantShade(colours.get(step.label) as string, theme.panel, index, variants.length), width: 2, dash: s.dash ?? 'solid' },
          customdata: Array.from(step.times, (t, i) => [formatSi(t, 's'), formatSi(step.values[i], step.unit)]),
          hovertemplate: 't = %{customdata[0]}<br>%{customdata[1]}<extra>%{fullData.name}</extra>',
        });
      }
    });
  }
  if (data.length === 0) return null;
  // Step traces are in V or A (V/V for a ratio): the axis names the unit when they share one.
  const units = new Set(series.flatMap((s) => s.result.steps.map((step) => step.unit)));
  const layout: Partial<Layout> = {
    ...baseLayout(theme),
    xaxis: { ...axisStyle(theme), title: { text: 'time (s)' }, exponentformat: 'SI' },
    yaxis: { ...axisStyle(theme), title: { text: units.size === 1 ? `step response (${[...units][0]})` : 'step response' }, exponentformat: 'SI' },
  };
  return { kind: 'step', title: 'Step response', data, layout, targets: data.map(() => null) };
}
