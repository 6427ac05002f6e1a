/**
 * Checking `require` lines. Pointwise measures (gain, phase, delay, magnitude) are checked
 * at every sweep point inside the range and, by exact solves, at the range's ends (or at
 * the one `at` frequency); single-number measures compare the trace's readout.
 */
import type { Circuit, Measure, RequirementSpec } from './circuit.js';
import type { Diagnostic, Readout, ReadoutId, RequirementResult } from './result.js';
import { MEASURES } from './vocabulary.js';
import type { AcAnalysis, TraceData } from './analysis.js';
import { groupDelayOf } from './analysis.js';
import { TraceView, stabilityReadouts } from './readouts.js';
import type { TraceReadouts } from './readouts.js';

/** `=` without a written tolerance: equal within this relative amount. */
const DEFAULT_RELATIVE_TOLERANCE = 1e-6;

const POINTWISE = new Set<Measure>(['gain', 'phase', 'delay', 'magnitude']);
const READOUT_OF: Partial<Record<Measure, ReadoutId>> = {
  corner: 'corner',
  peak: 'peak',
  crossover: 'crossover',
  'phase-margin': 'phase-margin',
  'gain-margin': 'gain-margin',
};

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
    if (r.warning) {
      diagnostics.push({
        severity: 'warning',
        line: req.range.line,
        column: req.range.column,
        endColumn: req.range.endColumn,
        message: r.warning,
        code: 'requirement-not-checked',
      });
    }
  }
  return { results, diagnostics };
}

type Outcome = { result: RequirementResult; warning?: string };

/** What was measured: the worst value (and where), or why nothing could be. */
type Measured = { value: number; worstAt: number | null } | { notApplicable: string };

function checkOne(circuit: Circuit, req: RequirementSpec, analysis: AcAnalysis | null, readouts: TraceReadouts[]): Outcome {
  const base = structure(circuit, req, analysis);
  const measured = measure(circuit, req, base.band, analysis, readouts);
  if ('notApplicable' in measured) {
    return { result: { ...base, status: 'not-applicable', measured: NaN, worstAt: null }, warning: measured.notApplicable };
  }
  const status = passes(base.band, measured.value) ? 'pass' : 'fail';
  return { result: { ...base, status, measured: measured.value, worstAt: measured.worstAt } };
}

/** The requirement as read: its trace, measure, limit, band, range and unit. */
function structure(circuit: Circuit, req: RequirementSpec, analysis: AcAnalysis | null): Omit<RequirementResult, 'status' | 'measured' | 'worstAt'> {
  const trace = circuit.traces[req.trace];
  const grid = analysis?.frequencies;
  const sweepEnd = (k: number): number => (grid && grid.length > 0 ? grid[k < 0 ? grid.length - 1 : k] : NaN);
  const pointwise = POINTWISE.has(req.measure) && req.at === undefined;
  return {
    line: req.range.line,
    text: req.text,
    trace: trace?.label ?? '',
    measure: req.measure,
    op: req.op,
    limit: req.value,
    tolerance: req.tolerance ? (req.tolerance.relative ? { relative: req.tolerance.amount } : { absolute: req.tolerance.amount }) : null,
    band: bandOf(req),
    over: pointwise ? { from: req.over?.from ?? sweepEnd(0), to: req.over?.to ?? sweepEnd(-1) } : null,
    at: req.at ?? null,
    unit: req.measure === 'magnitude' ? (trace?.unit ?? '') : MEASURES[req.measure],
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
  const notApplicable = (why: string): Measured => ({ notApplicable: `${why}; this requirement is not checked` });
  if (req.measure === 'settling' || req.measure === 'overshoot') {
    return notApplicable(`${req.measure} needs the step response, which is not computed yet`);
  }
  const spec = circuit.traces[req.trace];
  if (!spec) return notApplicable('this requirement names a trace that does not exist');
  const trace = analysis?.traces.find((t) => t.plan.specIndex === req.trace);
  if (!analysis || !trace) return notApplicable(`the trace ${spec.label} has no AC result`);
  if (POINTWISE.has(req.measure)) return pointwise(req, band, analysis, trace);

  const name = READOUT_OF[req.measure]!;
  let found: Readout | undefined = readouts.find((r) => r.trace === trace)?.readouts.find((r) => r.name === name);
  if (!found && (req.measure === 'crossover' || req.measure === 'phase-margin' || req.measure === 'gain-margin')) {
    found = stabilityReadouts(analysis, trace).find((r) => r.name === name);
  }
  if (!found) {
    const shape = readouts.find((r) => r.trace === trace)?.shape;
    return notApplicable(
      req.measure === 'corner' && (shape === 'band-pass' || shape === 'band-stop')
        ? `${spec.label} is ${shape}: it has a lower and an upper corner, not one corner`
        : `${spec.label} has no ${req.measure} in the sweep`,
    );
  }
  return { value: found.value, worstAt: null };
}

/** How bad a measured value is for this requirement: larger is worse. */
function badness(req: RequirementSpec, m: number): number {
  if (Number.isNaN(m)) return Infinity;
  switch (req.op) {
    case '>=':
      return -m;
    case '<=':
      return m;
    case '=':
      return Math.abs(m - req.value);
  }
}

function pointwise(req: RequirementSpec, band: RequirementResult['band'], analysis: AcAnalysis, trace: TraceData): Measured {
  const view = new TraceView(analysis, trace);
  const grid = analysis.frequencies;
  const points: { f: number; m: number }[] = [];
  const measureExact = (f: number): number => {
    const v = view.value(f);
    if (!v) return NaN;
    switch (req.measure) {
      case 'gain':
        return 20 * Math.log10(Math.hypot(v.re, v.im));
      case 'magnitude':
        return Math.hypot(v.re, v.im);
      case 'delay':
        return groupDelayOf(v.re, v.im, v.dRe, v.dIm);
      default:
        return view.phaseAt(f);
    }
  };
  const r = trace.result;
  const measureGrid = (k: number): number => {
    switch (req.measure) {
      case 'gain':
        return r.magnitudeDb[k] as number;
      case 'magnitude':
        return r.magnitude[k] as number;
      case 'delay':
        return r.groupDelay[k] as number;
      default:
        return r.phaseDeg[k] as number;
    }
  };
  if (req.at !== undefined) {
    points.push({ f: req.at, m: measureExact(req.at) });
  } else {
    const from = req.over?.from ?? grid[0];
    const to = req.over?.to ?? grid[grid.length - 1];
    if (!(from <= to)) return { notApplicable: 'the range of this requirement is empty; it is not checked' };
    points.push({ f: from, m: measureExact(from) });
    for (let k = 0; k < grid.length; k++) {
      if (grid[k] > from && grid[k] < to) points.push({ f: grid[k], m: measureGrid(k) });
    }
    if (to !== from) points.push({ f: to, m: measureExact(to) });
  }
  // The worst point decides the status, so a failing point always comes before a passing one.
  const worse = (a: { m: number }, b: { m: number }): boolean => {
    const fa = !passes(band, a.m);
    return fa !== !passes(band, b.m) ? fa : badness(req, a.m) > badness(req, b.m);
  };
  let worst = points[0];
  for (const p of points) if (worse(p, worst)) worst = p;
  return { value: worst.m, worstAt: worst.f };
}
