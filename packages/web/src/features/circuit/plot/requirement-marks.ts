/**
 * Requirements on a plot: which panel each measure is read on, the band it allows shaded in
 * its status's colour over the range it was checked, and frequency requirements as bands of
 * frequency. Everything comes from the fields of the solver's requirement results.
 */
import { STATUS_WORDS } from '@rolloff/solver';
import type { Measure, NumberArray, RequirementResult, Result, TraceResult } from '@rolloff/solver';
import type { ScatterData, Shape } from 'plotly.js-basic-dist-min';
import { plotText } from './plot-text';
import type { PlotTheme } from './figure-style';

/** Where a requirement of each measure is drawn; measures not listed are not drawn. */
export type Panel = 'magnitude' | 'phase' | 'frequency';

export const PANEL_OF: Partial<Record<Measure, Panel>> = {
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
export const MAGNITUDE_MEASURES: Readonly<Record<'bode' | 'impedance', readonly Measure[]>> = {
  bode: ['gain', 'min-attenuation', 'insertion-loss'],
  impedance: ['magnitude', 'max-impedance'],
};

/** Measures of a loss in dB (−gain), drawn on the gain axis turned over. */
const LOSS_MEASURES: readonly Measure[] = ['min-attenuation', 'insertion-loss'];

/** A requirement as the gain axis reads it: a loss's band and value turned into gains. */
export function onGainAxis(placed: PlacedRequirement): PlacedRequirement {
  const r = placed.requirement;
  if (!LOSS_MEASURES.includes(r.measure)) return placed;
  const turn = (v: number | null) => (v === null ? null : -v);
  return { ...placed, requirement: { ...r, limit: -r.limit, band: { low: turn(r.band.high), high: turn(r.band.low) }, measured: -r.measured } };
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
export function limitsOf(requirement: RequirementResult): number[] {
  return [requirement.band.low, requirement.band.high].filter((v): v is number => v !== null && Number.isFinite(v));
}

const colourOfStatus = (requirement: RequirementResult, theme: PlotTheme) => (requirement.status === 'pass' ? theme.pass : theme.fail);

/**
 * Shading of the requirements drawn on one panel: the allowed band over the checked
 * frequencies, tinted by pass or fail, with its closed sides drawn as dashed lines and the
 * worst point marked.
 */
export function requirementShapes(
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
export function frequencyRequirementShapes(placed: PlacedRequirement[], frequencies: NumberArray, theme: PlotTheme): Partial<Shape>[] {
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
