/**
 * The solver's Result mapped to plot figures: a Bode plot (magnitude in dB over phase in
 * degrees on one log-frequency axis), an impedance plot (|Z| in Ω, log-log, with phase), a
 * noise-density plot and a step-response plot (step-noise-figures.ts). Readout markers
 * (readout-marks.ts) and requirement shading (requirement-marks.ts) come from the Result's
 * readouts and requirements alone (names, units, bands, ranges and frequencies as the solver
 * carries them); nothing is computed or re-read from the cell here beyond placing them. A
 * loop trace carries its margins on the plot (loop-margins.ts), and pins, when given, sit on
 * their traces (plot-pins.ts). What the figures share is in figure-style.ts and
 * trace-slots.ts. Pure functions of plain data, so they are tested without a browser's Plotly.
 */
import { formatSi } from '@rolloff/solver';
import type { NumberArray, Result, TraceResult } from '@rolloff/solver';
import type { Layout, ScatterData } from 'plotly.js-basic-dist-min';
import { loopMarginMarks } from './loop-margins';
import { pinMarkers } from './plot-pins';
import type { PlotPin, PlotTarget } from './plot-pins';
import { finiteOrNull, decibelRange, phaseTick, phaseRange, legendName, baseLayout, axisStyle, frequencyAxis, logRange } from './figure-style';
import type { PlotTheme, PlotSeries, Figure } from './figure-style';
import { PANEL_OF, MAGNITUDE_MEASURES, onGainAxis, placeRequirements, limitsOf, requirementShapes, frequencyRequirementShapes } from './requirement-marks';
import type { Panel } from './requirement-marks';
import { frequencyMarkers, mergeMarks, minimumImpedanceMarkers } from './readout-marks';
import { noiseFigure, stepFigure } from './step-noise-figures';
import { slotsOf, isPrimary, slotLabel } from './trace-slots';

const BODE_KINDS: ReadonlySet<TraceResult['kind']> = new Set(['ratio', 'loop', 'transimpedance', 'current']);

/** The hover text of each point: frequency, magnitude and phase together. */
function hoverData(frequencies: NumberArray, trace: TraceResult, magnitudeUnit: 'dB' | 'linear'): string[][] {
  const out: string[][] = new Array(frequencies.length);
  for (let i = 0; i < frequencies.length; i++) {
    const magnitude = magnitudeUnit === 'dB' ? formatSi(trace.magnitudeDb[i], 'dB') : formatSi(trace.magnitude[i], trace.unit);
    out[i] = [formatSi(frequencies[i], 'Hz'), magnitude, formatSi(trace.phaseDeg[i], 'deg')];
  }
  return out;
}

const HOVER = '%{customdata[0]}<br>magnitude %{customdata[1]}<br>phase %{customdata[2]}<extra>%{fullData.name}</extra>';

function gainPhaseFigure(kind: 'bode' | 'impedance', series: PlotSeries[], theme: PlotTheme, pins: readonly PlotPin[]): Figure | null {
  const slots = slotsOf(series, kind === 'bode' ? (k) => BODE_KINDS.has(k) : (k) => k === 'impedance', theme);
  if (slots.length === 0) return null;
  const primary = series[0].result;
  const frequencies = primary.frequencies;
  const data: Partial<ScatterData>[] = [];
  const targets: (PlotTarget | null)[] = [];
  for (const slot of slots) {
    const { series: s, trace, colour } = slot;
    const x = finiteOrNull(slot.frequencies);
    const customdata = hoverData(slot.frequencies, trace, kind === 'bode' ? 'dB' : 'linear');
    const line = { color: colour, width: 2, dash: s.dash ?? 'solid' };
    const group = `${s.name ?? ''}:${slotLabel(slot)}`;
    data.push({
      type: 'scatter',
      mode: 'lines',
      name: legendName(s, slotLabel(slot)),
      legendgroup: group,
      x,
      y: finiteOrNull(kind === 'bode' ? trace.magnitudeDb : trace.magnitude),
      xaxis: 'x',
      yaxis: 'y',
      line,
      customdata,
      hovertemplate: HOVER,
    });
    data.push({
      type: 'scatter',
      mode: 'lines',
      name: legendName(s, slotLabel(slot)),
      legendgroup: group,
      showlegend: false,
      x,
      y: finiteOrNull(trace.phaseDeg),
      xaxis: 'x',
      yaxis: 'y2',
      line: { ...line, width: 1.5 },
      customdata,
      hovertemplate: HOVER,
    });
    // Only the primary series (its first variant) can be pinned: the others are earlier revisions, or other variants, for comparison.
    const target: PlotTarget | null = isPrimary(slot) ? { kind: 'trace', trace: trace.label } : null;
    targets.push(target, target);
  }
  const placed = placeRequirements(primary).filter((p) => slots.some((s) => isPrimary(s) && s.trace.label === p.trace.label));
  const on = (panel: Panel) =>
    placed
      .filter((p) => PANEL_OF[p.requirement.measure] === panel && (panel !== 'magnitude' || MAGNITUDE_MEASURES[kind].includes(p.requirement.measure)))
      .map(onGainAxis);
  const limitsOn = (panel: Panel) => on(panel).flatMap((p) => limitsOf(p.requirement));
  const magnitudeRange: [number, number] =
    kind === 'bode'
      ? decibelRange(
          slots.map((s) => s.trace.magnitudeDb),
          limitsOn('magnitude'),
        )
      : logRange(
          slots.map((s) => s.trace.magnitude),
          limitsOn('magnitude'),
        );
  const phase = phaseRange(
    slots.map((s) => s.trace.phaseDeg),
    limitsOn('phase'),
  );
  const magnitudeAxis: [number, number] = kind === 'bode' ? magnitudeRange : [10 ** magnitudeRange[0], 10 ** magnitudeRange[1]];
  const magnitudeShading = requirementShapes(on('magnitude'), 'y', magnitudeAxis, theme);
  const phaseShading = requirementShapes(on('phase'), 'y2', phase, theme);
  const primaryColour = (label: string) => slots.find((s) => isPrimary(s) && s.trace.label === label)?.colour ?? null;
  const axisFrequencies = slots.flatMap((s) => (s.frequencies.length > 0 ? [s.frequencies[0], s.frequencies[s.frequencies.length - 1]] : []));
  // Variants of the cell: each one's corners and crossovers as lines in its shade, their values in the readouts table.
  const variants = [...new Set(slots.filter((s) => s.seriesIndex === 0).map((s) => s.variant))];
  const variantMarkers = (variant: number) => {
    const own = slots.filter((s) => s.seriesIndex === 0 && s.variant === variant);
    return frequencyMarkers(own[0].readouts, (label) => own.find((s) => s.trace.label === label)?.colour ?? null, theme, axisFrequencies, false);
  };
  const markers = variants.length > 1 ? mergeMarks(variants.map(variantMarkers)) : frequencyMarkers(primary.readouts, primaryColour, theme, frequencies);
  const impedanceMarkers = kind === 'impedance' ? minimumImpedanceMarkers(primary.readouts, primaryColour, theme) : { points: [], annotations: [] };
  const primarySlots = slots.filter(isPrimary);
  const margins = primarySlots.map((s) => loopMarginMarks(s.trace, primary.readouts, frequencies, s.colour, theme.panel));
  const pinned = pinMarkers(
    pins,
    primarySlots.map((s) => ({ label: s.trace.label, values: kind === 'bode' ? s.trace.magnitudeDb : s.trace.magnitude })),
    frequencies,
    theme.pin,
  );
  const marks = [...magnitudeShading.points, ...phaseShading.points, ...impedanceMarkers.points];
  data.push(...marks, ...pinned.data);
  targets.push(...marks.map(() => null), ...pinned.targets);
  const layout: Partial<Layout> = {
    ...baseLayout(theme),
    xaxis: frequencyAxis(theme, axisFrequencies, 'y2'),
    yaxis: {
      ...axisStyle(theme),
      domain: [0.42, 1],
      title: { text: kind === 'bode' ? 'magnitude (dB)' : `magnitude (${slots[0].trace.unit || 'Ω'})` },
      ...(kind === 'bode' ? { range: magnitudeRange } : { type: 'log' as const, range: magnitudeRange, exponentformat: 'SI' as const }),
    },
    yaxis2: { ...axisStyle(theme), domain: [0, 0.34], title: { text: 'phase (°)' }, range: phase, dtick: phaseTick(phase) },
    shapes: [
      ...frequencyRequirementShapes(on('frequency'), frequencies, theme),
      ...magnitudeShading.shapes,
      ...phaseShading.shapes,
      ...markers.shapes,
      ...margins.flatMap((m) => m.shapes),
    ],
    annotations: [...markers.annotations, ...margins.flatMap((m) => m.annotations), ...impedanceMarkers.annotations, ...pinned.annotations],
  };
  return { kind, title: kind === 'bode' ? 'Bode plot' : 'Impedance', data, layout, targets };
}

/**
 * Every figure a Result has something for, in the order a cell shows them; `pins` are drawn
 * on the Bode and impedance plots of the first series.
 */
export function figuresFor(series: PlotSeries[], theme: PlotTheme, pins: readonly PlotPin[] = []): Figure[] {
  if (series.length === 0 || series[0].result.frequencies.length === 0) {
    const steps = series.length > 0 ? stepFigure(series, theme) : null;
    return steps ? [steps] : [];
  }
  return [
    gainPhaseFigure('bode', series, theme, pins),
    gainPhaseFigure('impedance', series, theme, pins),
    noiseFigure(series, theme),
    stepFigure(series, theme),
  ].filter((f): f is Figure => f !== null);
}
