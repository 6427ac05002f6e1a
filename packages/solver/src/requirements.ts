/**
 * Checking `require` lines. Pointwise measures (gain, phase, delay, magnitude) are checked
 * at the true worst value over the range (`extremeOver`: the ends and every extremum,
 * between grid points too, from exact solves), or at the one `at` frequency; the measures
 * of a band or a feature (ripple, notch, anti-resonance, …) are read by `bandMeasure`; the
 * other single-number measures compare the trace's readout. A value that does not exist (a
 * trace that is zero everywhere, a singular point, a readout the trace does not have) is
 * never a pass: the requirement is not applicable, and says why.
 */
import type { Circuit, Measure, RequirementSpec } from './circuit.js';
import type { Diagnostic, Readout, ReadoutId, RequirementResult } from './result.js';
import { MEASURES, MEASURE_WHERE } from './vocabulary.js';
import type { AcAnalysis, TraceData } from './analysis.js';
import { stabilityReadouts } from './readouts.js';
import { READOUT_NAMES } from './result.js';
import type { Shape, TraceReadouts } from './readouts.js';
import { TraceView } from './trace-view.js';
import { extremeOver, measureAt } from './extremes.js';
import type { Extreme } from './extremes.js';
import { formatSi } from './units.js';
import { bandMeasure } from './band-measures.js';
import type { BandMeasure, Measured } from './band-measures.js';

/** `=` without a written tolerance: equal within this relative amount. */
const DEFAULT_RELATIVE_TOLERANCE = 1e-6;

/** The readout each one-number measure compares. */
const READOUT_OF: Partial<Record<Measure, ReadoutId>> = {
  corner: 'corner',
  'lower-corner': 'corner-low',
  'upper-corner': 'corner-high',
  bandwidth: 'bandwidth',
  centre: 'center',
  q: 'q',
  peak: 'peak',
  'peak-frequency': 'peak-frequency',
  'low-frequency-gain': 'low-frequency-gain',
  'asymptotic-slope': 'rolloff',
  'min-impedance': 'min-impedance',
  crossover: 'crossover',
  'phase-margin': 'phase-margin',
  'phase-crossover': 'phase-crossover',
  'gain-margin': 'gain-margin',
};

const STABILITY = new Set<ReadoutId>(['crossover', 'phase-margin', 'phase-crossover', 'gain-margin']);

/** Every requirement's result, in the order written, and warnings for what cannot be checked. */
export function checkRequirements(
  circuit: Circuit,
  analysis: AcAnalysis | null,
  readouts: TraceReadouts[],
): { results: RequirementResult[]; diagnostics: Diagnostic[] } {
  const results: RequirementResult[] = [];
  const diagnostics: Diagnostic[] = [];
  for (const req of circuit.requirements) {
    const r = checkOne(circuit, req, analysis, readouts);
    results.push(r.result);
    const where = { line: req.range.line, column: req.range.column, endColumn: req.range.endColumn };
    // A requirement on a step trace is checked by step-results.ts, which says what it cannot check;
    // one on a noise trace is not evaluated yet, and the elaborator says so on its line.
    const said = circuit.traces[req.trace]?.kind === 'step' || circuit.traces[req.trace]?.kind === 'noise';
    if (r.warning && !said) diagnostics.push({ severity: 'warning', ...where, message: r.warning, code: 'requirement-not-checked' });
    const m = r.result.measured;
    if (r.result.status !== 'not-applicable' && !Number.isFinite(m)) {
      diagnostics.push({ severity: 'info', ...where, message: infiniteReason(r.result), code: 'requirement-infinite' });
    }
  }
  return { results, diagnostics };
}

/** Why a requirement measured ±∞, in its own words (the check itself is sound: ∞ compares). */
function infiniteReason(q: RequirementResult): string {
  const value = q.measured > 0 ? '+∞' : '−∞';
  if (q.measure === 'gain-margin') return `the gain margin of ${q.trace} is ${value}: its phase never reaches −180° in the sweep`;
  const where = q.worstAt !== null ? ` at ${formatSi(q.worstAt, 'Hz')}` : '';
  if (q.measured < 0 && q.measure === 'gain') return `the worst gain is −∞ dB${where}: ${q.trace} is exactly 0 there (an exact null)`;
  if (q.measure === 'notch-depth' || q.measure === 'ripple')
    return `the ${q.measure} is +∞ dB: ${q.trace} is exactly 0 at a point${where ? '' : ' of the band'}${where} (an exact null)`;
  return `the measured ${q.measure} is ${value}${where}`;
}

type Outcome = { result: RequirementResult; warning?: string };

function checkOne(circuit: Circuit, req: RequirementSpec, analysis: AcAnalysis | null, readouts: TraceReadouts[]): Outcome {
  const base = structure(circuit, req, analysis);
  const measured = measure(circuit, req, base.band, analysis, readouts);
  if ('notApplicable' in measured) {
    return {
      result: { ...base, status: 'not-applicable', measured: NaN, worstAt: null, reason: measured.notApplicable },
      warning: `${measured.notApplicable}; this requirement is not checked`,
    };
  }
  const status = passes(base.band, measured.value) ? 'pass' : 'fail';
  return { result: { ...base, status, measured: measured.value, worstAt: measured.worstAt, reason: null } };
}

/** The requirement as read: its trace, measure, limit, band, range and unit. */
function structure(circuit: Circuit, req: RequirementSpec, analysis: AcAnalysis | null): Omit<RequirementResult, 'status' | 'measured' | 'worstAt' | 'reason'> {
  const trace = circuit.traces[req.trace];
  const grid = analysis?.frequencies;
  const sweepEnd = (k: number): number => (grid && grid.length > 0 ? grid[k < 0 ? grid.length - 1 : k] : NaN);
  const where = MEASURE_WHERE[req.measure];
  const ranged = (where === 'point' || where === 'band' || where === 'within') && req.at === undefined;
  return {
    line: req.range.line,
    text: req.text,
    trace: trace?.label ?? '',
    measure: req.measure,
    op: req.op,
    limit: req.value,
    tolerance: req.tolerance ? (req.tolerance.relative ? { relative: req.tolerance.amount } : { absolute: req.tolerance.amount }) : null,
    band: bandOf(req),
    over: ranged ? { from: req.over?.from ?? sweepEnd(0), to: req.over?.to ?? sweepEnd(-1) } : null,
    at: req.at ?? null,
    unit: MEASURES[req.measure] ?? trace?.unit ?? '',
  };
}

/** The values that pass; the check compares with exactly these bounds. */
function bandOf(req: RequirementSpec): RequirementResult['band'] {
  switch (req.op) {
    case '>=':
      return { low: req.value, high: null };
    case '<=':
      return { low: null, high: req.value };
    case '=': {
      const relative = req.tolerance ? (req.tolerance.relative ? req.tolerance.amount : null) : DEFAULT_RELATIVE_TOLERANCE;
      const half = relative === null ? req.tolerance!.amount : relative * Math.abs(req.value);
      return { low: req.value - half, high: req.value + half };
    }
  }
}

function passes(band: RequirementResult['band'], m: number): boolean {
  if (Number.isNaN(m)) return false;
  return (band.low === null || m >= band.low) && (band.high === null || m <= band.high);
}

function measure(circuit: Circuit, req: RequirementSpec, band: RequirementResult['band'], analysis: AcAnalysis | null, readouts: TraceReadouts[]): Measured {
  const notApplicable = (why: string): Measured => ({ notApplicable: why });
  const spec = circuit.traces[req.trace];
  if (!spec) return notApplicable('this requirement names a trace that does not exist');
  if (spec.kind === 'step') return notApplicable(`${spec.label} is a step response, checked in the time domain`);
  const trace = analysis?.traces.find((t) => t.plan.specIndex === req.trace);
  if (!analysis || !trace) return notApplicable(`the trace ${spec.label} has no AC result`);
  const where = MEASURE_WHERE[req.measure];
  if (where === 'point') return pointwise(req, band, analysis, trace);
  const own = readouts.find((r) => r.trace === trace);
  if (where !== 'trace') {
    if (zeroEverywhere(trace)) return notApplicable(`${spec.label} is zero at every frequency of the sweep, so it has no ${req.measure}`);
    const grid = analysis.frequencies;
    const from = req.at ?? req.over?.from ?? grid[0];
    const to = req.at ?? req.over?.to ?? grid[grid.length - 1];
    const written = req.at !== undefined || req.over !== undefined;
    return bandMeasure(req.measure as BandMeasure, new TraceView(analysis, trace), from, to, written, own?.level ?? NaN, own?.shape ?? 'unknown');
  }

  const name = READOUT_OF[req.measure]!;
  let found: Readout | undefined = own?.readouts.find((r) => r.name === name);
  if (!found && STABILITY.has(name)) found = stabilityReadouts(analysis, trace).find((r) => r.name === name);
  if (!found) return notApplicable(missingReason(name, spec.label, trace, own?.shape));
  return { value: found.value, worstAt: null };
}

/** Why a trace has no such readout, in words the user can act on. */
function missingReason(name: ReadoutId, label: string, trace: TraceData, shape: Shape | undefined): string {
  const words = READOUT_NAMES[name];
  if (zeroEverywhere(trace)) return `${label} is zero at every frequency of the sweep, so it has no ${words}`;
  const kind = trace.result.kind;
  switch (name) {
    case 'corner':
      if (kind === 'loop') return `${label} is a loop gain, which has no corner: require its crossover`;
      if (kind === 'impedance') return `${label} is an impedance, which has no corner`;
      if (shape === 'band-pass' || shape === 'band-stop') return `${label} is ${shape}: it has a lower and an upper corner, not one corner`;
      if (shape === 'flat') return `${label} stays within 3 dB of its level across the sweep, so it has no corner`;
      if (shape === 'unknown') return `neither end of ${label} settles to a passband level in the sweep, so it has no corner`;
      return `${label} does not fall 3 dB below its passband level anywhere in the sweep`;
    case 'corner-low':
    case 'corner-high':
    case 'bandwidth':
    case 'center':
    case 'q':
      if (kind === 'loop') return `${label} is a loop gain, which has no ${words}: require its crossover`;
      if (shape === 'low-pass' || shape === 'high-pass') return `${label} is ${shape}: it has one corner, not a ${words}`;
      if (shape === 'band-pass' || shape === 'band-stop') {
        const from = shape === 'band-pass' ? 'its peak' : 'its passband level';
        return `${label} does not cross 3 dB from ${from} on both sides within the sweep, so it has no ${words}: widen the sweep`;
      }
      return `${label} is neither band-pass nor band-stop in the sweep, so it has no ${words}`;
    case 'peak':
      return `${label} has no peak in the sweep`;
    case 'peak-frequency':
      return `${label} has no peak inside the sweep: its highest point is at an end`;
    case 'low-frequency-gain':
      if (kind === 'impedance') return `${label} is an impedance, which has no low-frequency gain: require its magnitude`;
      if (shape === 'band-pass' || shape === 'high-pass') return `${label} is ${shape}: its low-frequency level is not a passband`;
      return `the low end of ${label} does not settle to a level in the sweep`;
    case 'rolloff':
      return `the slope of ${label} does not settle above the sweep on a whole number of 20 dB/decade`;
    case 'crossover':
    case 'phase-margin':
      return `the magnitude of ${label} never falls through 1 (0 dB) in the sweep`;
    case 'phase-crossover':
      return `the phase of ${label} never reaches −180° in the sweep`;
    default:
      return `${label} has no ${words} in the sweep`;
  }
}

/** A pointwise requirement's worst value: the largest for `<=`, the smallest for `>=`, the farther from the limit for `=`. */
function pointwise(req: RequirementSpec, band: RequirementResult['band'], analysis: AcAnalysis, trace: TraceData): Measured {
  const view = new TraceView(analysis, trace);
  const label = trace.result.label;
  const measure = req.measure as 'gain' | 'phase' | 'delay' | 'magnitude';
  const grid = analysis.frequencies;
  const zero = zeroEverywhere(trace);
  if (zero && measure !== 'magnitude') return { notApplicable: `${label} is zero at every frequency of the sweep, so it has no ${measure}` };
  let worst: Extreme | null;
  if (req.at !== undefined) {
    worst = { value: measureAt(view, measure, req.at), at: req.at };
  } else {
    const from = req.over?.from ?? grid[0];
    const to = req.over?.to ?? grid[grid.length - 1];
    if (!(from <= to)) return { notApplicable: 'the range of this requirement is empty' };
    const high = req.op === '>=' ? null : extremeOver(view, measure, from, to, 'max');
    const low = req.op === '<=' ? null : extremeOver(view, measure, from, to, 'min');
    worst = high ?? low;
    if (high && low) {
      // Both ends of an `=` band: a failing side first, else the one farther from the limit.
      const failHigh = !passes(band, high.value);
      const failLow = !passes(band, low.value);
      worst = failHigh !== failLow ? (failHigh ? high : low) : Math.abs(high.value - req.value) >= Math.abs(low.value - req.value) ? high : low;
    }
  }
  if (!worst) return { notApplicable: 'the range of this requirement is empty' };
  if (Number.isNaN(worst.value)) {
    return { notApplicable: `${label} has no ${measure} at ${formatSi(worst.at, 'Hz')}: the network is singular there` };
  }
  return { value: worst.value, worstAt: worst.at };
}

/** True when every point of the trace is exactly 0 (a difference of two equal voltages, say). */
export function zeroEverywhere(trace: TraceData): boolean {
  const m = trace.result.magnitude;
  if (m.length === 0) return false;
  for (let k = 0; k < m.length; k++) if (m[k] !== 0) return false;
  return true;
}
