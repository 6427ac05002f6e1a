/**
 * Checking `require` lines. Pointwise measures (gain, phase, delay, magnitude) are checked
 * at every sweep point inside the range and, by exact solves, at the range's ends (or at
 * the one `at` frequency); single-number measures compare the trace's readout.
 */
import type { Circuit, Measure, RequirementSpec } from './circuit.js';
import type { Diagnostic, Readout, RequirementResult } from './result.js';
import type { AcAnalysis, TraceData } from './analysis.js';
import { groupDelayOf } from './analysis.js';
import { TraceView, stabilityReadouts } from './readouts.js';
import type { TraceReadouts } from './readouts.js';

/** `=` without a written tolerance: equal within this relative amount. */
const DEFAULT_RELATIVE_TOLERANCE = 1e-6;

const POINTWISE = new Set<Measure>(['gain', 'phase', 'delay', 'magnitude']);
const READOUT_OF: Partial<Record<Measure, string>> = {
  corner: 'corner',
  peak: 'peak',
  crossover: 'crossover',
  'phase-margin': 'phase-margin',
  'gain-margin': 'gain-margin',
};
const UNIT_OF: Record<Measure, string> = {
  gain: 'dB',
  phase: 'deg',
  delay: 's',
  magnitude: '',
  corner: 'Hz',
  peak: 'dB',
  crossover: 'Hz',
  'phase-margin': 'deg',
  'gain-margin': 'dB',
  settling: 's',
  overshoot: '%',
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

function checkOne(circuit: Circuit, req: RequirementSpec, analysis: AcAnalysis | null, readouts: TraceReadouts[]): Outcome {
  const outcome = checkMeasure(circuit, req, analysis, readouts);
  const traceUnit = circuit.traces[req.trace]?.unit ?? '';
  outcome.result.unit = req.measure === 'magnitude' ? traceUnit : UNIT_OF[req.measure];
  return outcome;
}

function checkMeasure(circuit: Circuit, req: RequirementSpec, analysis: AcAnalysis | null, readouts: TraceReadouts[]): Outcome {
  const unavailable = (why: string): Outcome => ({
    result: { line: req.range.line, text: req.text, pass: false, measured: NaN, worstAt: null, status: 'not-available' },
    warning: why,
  });
  if (req.measure === 'settling' || req.measure === 'overshoot') {
    return unavailable(`${req.measure} needs the step response, which is not computed yet; this requirement is not checked`);
  }
  const spec = circuit.traces[req.trace];
  if (!spec) return unavailable('this requirement names a trace that does not exist');
  const trace = analysis?.traces.find((t) => t.plan.specIndex === req.trace);
  if (!analysis || !trace) return unavailable(`the trace ${spec.label} has no AC result, so this requirement is not checked`);
  if (POINTWISE.has(req.measure)) return pointwise(req, analysis, trace);

  const name = READOUT_OF[req.measure]!;
  let found: Readout | undefined = readouts.find((r) => r.trace === trace)?.readouts.find((r) => r.name === name);
  if (!found && (req.measure === 'crossover' || req.measure === 'phase-margin' || req.measure === 'gain-margin')) {
    found = stabilityReadouts(analysis, trace).find((r) => r.name === name);
  }
  if (!found) {
    const shape = readouts.find((r) => r.trace === trace)?.shape;
    const why =
      req.measure === 'corner' && (shape === 'band-pass' || shape === 'band-stop')
        ? `${spec.label} is ${shape}: it has corner-low and corner-high, not one corner`
        : `${spec.label} has no ${name} in the sweep`;
    return unavailable(`${why}; this requirement is not checked`);
  }
  const pass = compare(req, found.value);
  return { result: { line: req.range.line, text: req.text, pass, measured: found.value, worstAt: null, status: pass ? 'pass' : 'fail' } };
}

function compare(req: RequirementSpec, m: number): boolean {
  if (Number.isNaN(m)) return false;
  switch (req.op) {
    case '>=':
      return m >= req.value;
    case '<=':
      return m <= req.value;
    case '=': {
      const tol = req.tolerance
        ? req.tolerance.relative
          ? req.tolerance.amount * Math.abs(req.value)
          : req.tolerance.amount
        : DEFAULT_RELATIVE_TOLERANCE * Math.abs(req.value);
      return Math.abs(m - req.value) <= tol;
    }
  }
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

function pointwise(req: RequirementSpec, analysis: AcAnalysis, trace: TraceData): Outcome {
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
    if (!(from <= to)) {
      return {
        result: { line: req.range.line, text: req.text, pass: false, measured: NaN, worstAt: null, status: 'not-available' },
        warning: 'the range of this requirement is empty; it is not checked',
      };
    }
    points.push({ f: from, m: measureExact(from) });
    for (let k = 0; k < grid.length; k++) {
      if (grid[k] > from && grid[k] < to) points.push({ f: grid[k], m: measureGrid(k) });
    }
    if (to !== from) points.push({ f: to, m: measureExact(to) });
  }
  let worst = points[0];
  let pass = true;
  for (const p of points) {
    if (!compare(req, p.m)) pass = false;
    if (badness(req, p.m) > badness(req, worst.m)) worst = p;
  }
  return { result: { line: req.range.line, text: req.text, pass, measured: worst.m, worstAt: worst.f, status: pass ? 'pass' : 'fail' } };
}
