/**
 * The solver's Result mapped to plot figures: a Bode plot (magnitude in dB over phase in
 * degrees on one log-frequency axis), an impedance plot (|Z| in Ω, log-log, with phase), a
 * noise-density plot and a step-response plot. Markers and requirement shading come from the
 * Result's readouts and requirements alone (names, units, bands, ranges and frequencies as the
 * solver carries them); nothing is computed or re-read from the cell here beyond placing them.
 * A loop trace carries its margins on the plot (loop-margins.ts), and pins, when given, sit
 * on their traces (plot-pins.ts). Pure functions of plain data, so they are tested without a
 * browser's Plotly.
 */
import { READOUT_NAMES, STATUS_WORDS, formatSi } from '@rolloff/solver';
import type { Measure, NumberArray, Readout, ReadoutId, RequirementResult, Result, TraceResult } from '@rolloff/solver';
import type { Annotations, Layout, ScatterData, Shape } from 'plotly.js-basic-dist-min';
import { loopMarginMarks } from './loop-margins';
import { plotText } from './plot-text';
import { pinMarkers } from './plot-pins';
import type { PlotPin, PlotTarget } from './plot-pins';
import { variantShade } from './variant-shades';

/** Colours and font of the plots, read from the palette so light and dark both work. */
export interface PlotTheme {
  font: string;
  monoFont: string;
  ink: string;
  inkSoft: string;
  rule: string;
  panel: string;
  pass: string;
  fail: string;
  /** Pins on the plot. */
  pin: string;
  traces: readonly string[];
}

export type FigureKind = 'bode' | 'impedance' | 'noise' | 'step';

/** One Result to draw; extra series (other revisions) are overlaid with their own dash. */
export interface PlotSeries {
  result: Result;
  /** Prefix of the legend entries, e.g. "revision 3"; omitted for a single series. */
  name?: string;
  dash?: 'solid' | 'dash' | 'dot' | 'dashdot';
}

export interface Figure {
  kind: FigureKind;
  title: string;
  data: Partial<ScatterData>[];
  layout: Partial<Layout>;
  /** What each entry of `data` stands for (by index, as Plotly's `curveNumber`), for clicks. */
  targets: (PlotTarget | null)[];
}

const BODE_KINDS: ReadonlySet<TraceResult['kind']> = new Set(['ratio', 'loop', 'transimpedance', 'current']);
/** Readouts that are frequencies and get a vertical marker on the plot (a peak gets one at its `at`). */
const MARKED_FREQUENCIES: readonly ReadoutId[] = ['corner', 'corner-low', 'corner-high', 'center', 'crossover', 'phase-crossover'];

/** Peaks smaller than this (dB above the passband) get no marker. */
const MARKED_PEAK_DB = 0.1;

/** Where a requirement of each measure is drawn; measures not listed are not drawn. */
type Panel = 'magnitude' | 'phase' | 'frequency';
const PANEL_OF: Partial<Record<Measure, Panel>> = {
  gain: 'magnitude',
  'min-attenuation': 'magnitude',
  'insertion-loss': 'magnitude',
  magnitude: 'magnitude',
  'max-impedance': 'magnitude',
  phase: 'phase',
  corner: 'frequency',
  'lower-corner': 'frequency',
  'upper-corner': 'frequency',
  centre: 'frequency',
  'peak-frequency': 'frequency',
  'notch-frequency': 'frequency',
  'anti-resonance': 'frequency',
  crossover: 'frequency',
  'phase-crossover': 'frequency',
};
/** The measures each plot's magnitude panel draws: the Bode plot's is in dB, the impedance plot's in the trace's unit. */
const MAGNITUDE_MEASURES: Readonly<Record<'bode' | 'impedance', readonly Measure[]>> = {
  bode: ['gain', 'min-attenuation', 'insertion-loss'],
  impedance: ['magnitude', 'max-impedance'],
};
/** Measures of a loss in dB (−gain), drawn on the gain axis turned over. */
const LOSS_MEASURES: readonly Measure[] = ['min-attenuation', 'insertion-loss'];

/** A requirement as the gain axis reads it: a loss's band and value turned into gains. */
function onGainAxis(placed: PlacedRequirement): PlacedRequirement {
  const r = placed.requirement;
  if (!LOSS_MEASURES.includes(r.measure)) return placed;
  const turn = (v: number | null) => (v === null ? null : -v);
  return { ...placed, requirement: { ...r, limit: -r.limit, band: { low: turn(r.band.high), high: turn(r.band.low) }, measured: -r.measured } };
}

/** Plain numbers for Plotly, with NaN and ±∞ as gaps. */
export function finiteOrNull(values: NumberArray): (number | null)[] {
  return Array.from(values, (v) => (Number.isFinite(v) ? v : null));
}

function finiteRange(arrays: NumberArray[]): [number, number] | null {
  let lo = Infinity;
  let hi = -Infinity;
  for (const values of arrays) {
    for (const v of values) {
      if (!Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  return lo <= hi ? [lo, hi] : null;
}

/** Axis range for dB: whole tens around the data, never more than 200 dB deep. */
export function decibelRange(values: NumberArray[], limits: number[]): [number, number] {
  const range = finiteRange([...values, limits]) ?? [-40, 0];
  const hi = Math.ceil((range[1] + 3) / 10) * 10;
  const lo = Math.max(Math.floor((range[0] - 3) / 10) * 10, hi - 200);
  return [lo, hi];
}

/** Phase ticks at 45°, 90° or 180°, so a short panel does not crowd its labels. */
function phaseTick([lo, hi]: [number, number]): number {
  const span = hi - lo;
  return span > 540 ? 180 : span > 180 ? 90 : 45;
}

function phaseRange(values: NumberArray[], limits: number[]): [number, number] {
  const range = finiteRange([...values, limits]) ?? [-90, 90];
  return [Math.floor((range[0] - 10) / 45) * 45, Math.ceil((range[1] + 10) / 45) * 45];
}

function colourOf(theme: PlotTheme, index: number): string {
  return theme.traces[index % theme.traces.length];
}

/** A trace's name in the legend and on hover, as text: Plotly reads names as a little HTML. */
function legendName(series: PlotSeries, label: string): string {
  return plotText(series.name ? `${series.name} · ${label}` : label);
}

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

function baseLayout(theme: PlotTheme): Partial<Layout> {
  return {
    paper_bgcolor: 'rgba(0,0,0,0)',
    plot_bgcolor: 'rgba(0,0,0,0)',
    font: { family: theme.font, color: theme.ink, size: 12 },
    margin: { l: 64, r: 20, t: 36, b: 48 },
    showlegend: true,
    legend: { orientation: 'h', x: 0, y: 1.02, yanchor: 'bottom', font: { size: 12 } },
    hovermode: 'closest',
    hoverlabel: { font: { family: theme.monoFont, size: 12 }, bgcolor: theme.panel, bordercolor: theme.rule },
    autosize: true,
  };
}

function axisStyle(theme: PlotTheme) {
  return { gridcolor: theme.rule, linecolor: theme.rule, zerolinecolor: theme.rule, tickfont: { color: theme.inkSoft }, automargin: true };
}

function frequencyAxis(theme: PlotTheme, frequencies: NumberArray, anchor: 'y' | 'y2') {
  const first = Math.min(...frequencies);
  const last = Math.max(...frequencies);
  const range: [number, number] | undefined = first > 0 && last > first ? [Math.log10(first), Math.log10(last)] : undefined;
  return { ...axisStyle(theme), type: 'log' as const, anchor, title: { text: 'frequency (Hz)' }, exponentformat: 'SI' as const, range };
}

/** Labels in the right quarter of the frequency axis are written leftwards, so they stay inside. */
function labelSide(frequency: number, frequencies: NumberArray): { xanchor: 'left' | 'right'; xshift: number } {
  const first = Math.log10(frequencies[0]);
  const span = Math.log10(frequencies[frequencies.length - 1]) - first;
  const where = span > 0 ? (Math.log10(frequency) - first) / span : 0;
  return where > 0.75 ? { xanchor: 'right', xshift: -4 } : { xanchor: 'left', xshift: 4 };
}

/**
 * A vertical dotted marker with its value written at the top of the magnitude panel; without
 * `labelled` (the variants of a cell, whose values the readouts table lists) the line alone.
 */
function frequencyMarkers(readouts: Readout[], traceColour: (trace: string) => string | null, theme: PlotTheme, frequencies: NumberArray, labelled = true) {
  const shapes: Partial<Shape>[] = [];
  const annotations: Partial<Annotations>[] = [];
  const byTrace = new Map<string, Readout[]>();
  for (const readout of readouts) byTrace.set(readout.trace, [...(byTrace.get(readout.trace) ?? []), readout]);
  let slot = 0;
  for (const [trace, list] of byTrace) {
    const colour = traceColour(trace);
    if (colour === null) continue;
    for (const readout of list) {
      let at: number;
      let text: string;
      if (readout.name === 'peak') {
        // A flat response has a "peak" of a few µdB somewhere; only a real one is worth a marker.
        if (readout.at === null || !(readout.value >= MARKED_PEAK_DB)) continue;
        at = readout.at;
        text = `${READOUT_NAMES.peak} ${formatSi(readout.value, readout.unit)} at ${formatSi(at, 'Hz')}`;
      } else if (MARKED_FREQUENCIES.includes(readout.name)) {
        at = readout.value;
        text = `${READOUT_NAMES[readout.name]} ${formatSi(at, readout.unit)}`;
      } else {
        continue;
      }
      if (!(at > 0) || !Number.isFinite(at)) continue;
      shapes.push({ type: 'line', xref: 'x', yref: 'paper', x0: at, x1: at, y0: 0, y1: 1, line: { color: colour, width: 1, dash: 'dot' } });
      if (!labelled) continue;
      annotations.push({
        xref: 'x',
        yref: 'y domain',
        x: Math.log10(at),
        y: 1 - 0.09 * (slot % 4),
        yanchor: 'top',
        ...labelSide(at, frequencies),
        showarrow: false,
        text,
        font: { color: colour, size: 11 },
        bgcolor: theme.panel,
      });
      slot += 1;
    }
  }
  return { shapes, annotations };
}

/** A requirement that was checked, with the trace it reads. */
export interface PlacedRequirement {
  requirement: RequirementResult;
  trace: TraceResult;
}

/** The checked requirements of a result, each with its trace (the one whose label it carries). */
export function placeRequirements(result: Result): PlacedRequirement[] {
  const placed: PlacedRequirement[] = [];
  for (const requirement of result.requirements) {
    if (requirement.status === 'not-applicable') continue;
    const trace = result.traces.find((t) => t.label === requirement.trace);
    if (trace) placed.push({ requirement, trace });
  }
  return placed;
}

/** The x extent a requirement checks: its range, or a narrow band around `at`. */
function checkedSpan(requirement: RequirementResult): [number, number] | null {
  if (requirement.at !== null) return [requirement.at / 1.03, requirement.at * 1.03];
  if (requirement.over === null) return null;
  const { from, to } = requirement.over;
  return from > 0 && to > from ? [from, to] : null;
}

/** The band of values a requirement allows, its open sides at the axis edges. */
function allowedBand(requirement: RequirementResult, axis: [number, number]): [number, number] {
  return [requirement.band.low ?? axis[0], requirement.band.high ?? axis[1]];
}

/** The limits a requirement draws: the closed sides of its band. */
function limitsOf(requirement: RequirementResult): number[] {
  return [requirement.band.low, requirement.band.high].filter((v): v is number => v !== null && Number.isFinite(v));
}

const colourOfStatus = (requirement: RequirementResult, theme: PlotTheme) => (requirement.status === 'pass' ? theme.pass : theme.fail);

/**
 * Shading of the requirements drawn on one panel: the allowed band over the checked
 * frequencies, tinted by pass or fail, with its closed sides drawn as dashed lines and the
 * worst point marked.
 */
function requirementShapes(
  placed: PlacedRequirement[],
  yaxis: 'y' | 'y2',
  axis: [number, number],
  theme: PlotTheme,
): { shapes: Partial<Shape>[]; points: Partial<ScatterData>[] } {
  const shapes: Partial<Shape>[] = [];
  const points: Partial<ScatterData>[] = [];
  for (const { requirement } of placed) {
    const colour = colourOfStatus(requirement, theme);
    const passed = requirement.status === 'pass';
    const span = checkedSpan(requirement);
    if (span) {
      const band = allowedBand(requirement, axis);
      const [x0, x1] = span;
      shapes.push({
        type: 'rect',
        layer: 'below',
        xref: 'x',
        yref: yaxis,
        x0,
        x1,
        y0: band[0],
        y1: band[1],
        fillcolor: colour,
        opacity: 0.13,
        line: { width: 0 },
      });
      for (const limit of limitsOf(requirement)) {
        shapes.push({ type: 'line', layer: 'below', xref: 'x', yref: yaxis, x0, x1, y0: limit, y1: limit, line: { color: colour, width: 1.5, dash: 'dash' } });
      }
    }
    if (requirement.worstAt !== null && Number.isFinite(requirement.measured)) {
      points.push({
        type: 'scatter',
        mode: 'markers',
        x: [requirement.worstAt],
        y: [requirement.measured],
        xaxis: 'x',
        yaxis,
        showlegend: false,
        marker: { color: colour, size: 9, symbol: passed ? 'circle-open' : 'x', line: { width: 2, color: colour } },
        hovertemplate: `${STATUS_WORDS[requirement.status]}: ${plotText(requirement.text)}<br>worst %{y} at %{x} Hz<extra>line ${requirement.line}</extra>`,
      });
    }
  }
  return { shapes, points };
}

/** Requirements on a frequency (corner, crossover): the allowed band of frequencies, full height. */
function frequencyRequirementShapes(placed: PlacedRequirement[], frequencies: NumberArray, theme: PlotTheme): Partial<Shape>[] {
  const shapes: Partial<Shape>[] = [];
  const axis: [number, number] = [frequencies[0], frequencies[frequencies.length - 1]];
  for (const { requirement } of placed) {
    const band = allowedBand(requirement, axis);
    if (!(band[0] > 0) || !(band[1] > band[0])) continue;
    shapes.push({
      type: 'rect',
      layer: 'below',
      xref: 'x',
      yref: 'y domain',
      x0: band[0],
      x1: band[1],
      y0: 0,
      y1: 1,
      fillcolor: colourOfStatus(requirement, theme),
      opacity: 0.13,
      line: { width: 0 },
    });
  }
  return shapes;
}

interface TraceSlot {
  series: PlotSeries;
  seriesIndex: number;
  trace: TraceResult;
  colour: string;
  /** The frequencies the trace is drawn over: its result's, or its variant's own. */
  frequencies: NumberArray;
  /** Which variant of a cell with a `vary` line (0 for the first and for a cell without one). */
  variant: number;
  /** The variant's name ("Rload = 10 Ω"), or null without variants. */
  variantLabel: string | null;
  readouts: Readout[];
}

/**
 * Traces of the kinds a figure draws, with a colour per label shared across series; the
 * variants of a cell each get a shade of their trace's colour.
 */
function slotsOf(series: PlotSeries[], kinds: (kind: TraceResult['kind']) => boolean, theme: PlotTheme): TraceSlot[] {
  const colours = new Map<string, string>();
  const slots: TraceSlot[] = [];
  series.forEach((s, seriesIndex) => {
    const variants = s.result.variants ?? [{ label: null, frequencies: s.result.frequencies, traces: s.result.traces, readouts: s.result.readouts }];
    variants.forEach((v, variant) => {
      for (const trace of v.traces) {
        if (!kinds(trace.kind)) continue;
        if (!colours.has(trace.label)) colours.set(trace.label, colourOf(theme, colours.size));
        const colour = variantShade(colours.get(trace.label) as string, theme.panel, variant, variants.length);
        slots.push({ series: s, seriesIndex, trace, colour, frequencies: v.frequencies, variant, variantLabel: v.label, readouts: v.readouts });
      }
    });
  });
  return slots;
}

/** The first series' slots that carry its markers, margins and pins: those of its first variant. */
const isPrimary = (slot: TraceSlot) => slot.seriesIndex === 0 && slot.variant === 0;

/** A trace's legend entry: "out", or "out · Rload = 10 Ω" for a variant. */
const slotLabel = (slot: TraceSlot) => (slot.variantLabel === null ? slot.trace.label : `${slot.trace.label} · ${slot.variantLabel}`);

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

function mergeMarks(marks: { shapes: Partial<Shape>[]; annotations: Partial<Annotations>[] }[]) {
  return { shapes: marks.flatMap((m) => m.shapes), annotations: marks.flatMap((m) => m.annotations) };
}

/** Log-axis range (in decades) around positive data and limits. */
function logRange(values: NumberArray[], limits: number[]): [number, number] {
  const logs = values.map((v) => Array.from(v, (x) => (x > 0 ? Math.log10(x) : NaN)));
  const range = finiteRange([...logs, limits.filter((l) => l > 0).map((l) => Math.log10(l))]) ?? [0, 3];
  return [Math.floor(range[0] - 0.2), Math.ceil(range[1] + 0.2)];
}

function minimumImpedanceMarkers(readouts: Readout[], traceColour: (trace: string) => string | null, theme: PlotTheme) {
  const points: Partial<ScatterData>[] = [];
  const annotations: Partial<Annotations>[] = [];
  for (const readout of readouts) {
    const colour = traceColour(readout.trace);
    if (readout.name !== 'min-impedance' || colour === null || readout.at === null || !(readout.value > 0) || !(readout.at > 0)) continue;
    points.push({
      type: 'scatter',
      mode: 'markers',
      x: [readout.at],
      y: [readout.value],
      xaxis: 'x',
      yaxis: 'y',
      showlegend: false,
      hoverinfo: 'skip',
      marker: { color: colour, size: 8 },
    });
    annotations.push({
      xref: 'x',
      yref: 'y',
      x: Math.log10(readout.at),
      y: Math.log10(readout.value),
      yanchor: 'top',
      yshift: -6,
      showarrow: false,
      text: `${READOUT_NAMES['min-impedance']} ${formatSi(readout.value, readout.unit)} at ${formatSi(readout.at, 'Hz')}`,
      font: { color: colour, size: 11 },
      bgcolor: theme.panel,
    });
  }
  return { points, annotations };
}

function noiseFigure(series: PlotSeries[], theme: PlotTheme): Figure | null {
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

function stepFigure(series: PlotSeries[], theme: PlotTheme): Figure | null {
  const data: Partial<ScatterData>[] = [];
  const colours = new Map<string, string>();
  for (const s of series) {
    for (const step of s.result.steps) {
      if (!colours.has(step.label)) colours.set(step.label, colourOf(theme, colours.size));
      data.push({
        type: 'scatter',
        mode: 'lines',
        name: legendName(s, step.label),
        x: finiteOrNull(step.times),
        y: finiteOrNull(step.values),
        line: { color: colours.get(step.label), width: 2, dash: s.dash ?? 'solid' },
        customdata: Array.from(step.times, (t, i) => [formatSi(t, 's'), formatSi(step.values[i], step.unit)]),
        hovertemplate: 't = %{customdata[0]}<br>%{customdata[1]}<extra>%{fullData.name}</extra>',
      });
    }
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
