/**
 * What `analyze()` returns: plain data that every screen draws from. The shape follows
 * the solver contract; arrays of numbers may be typed arrays inside the library, and the
 * command line turns them into plain JSON (non-finite values become null).
 */

export type Severity = 'error' | 'warning';

/** A quick fix: replace the text in `range` (same line) with `replacement`. */
export interface QuickFix {
  title: string;
  line: number;
  column: number;
  endColumn: number;
  replacement: string;
}

/** One problem in a cell. Lines and columns are 1-based; `endColumn` is exclusive. */
export interface Diagnostic {
  severity: Severity;
  line: number;
  column: number;
  endColumn: number;
  message: string;
  hint?: string;
  fix?: QuickFix;
  /** A stable id for the kind of problem, e.g. "unknown-statement", "undefined-name". */
  code: string;
}

export type NumberArray = Float64Array | number[];

export interface TraceResult {
  label: string;
  expr: string;
  kind: 'ratio' | 'transimpedance' | 'current' | 'impedance' | 'loop' | 'noise';
  unit: string;
  re: NumberArray;
  im: NumberArray;
  magnitude: NumberArray;
  magnitudeDb: NumberArray;
  /** Unwrapped along the sweep; the first point lies in (−180°, 180°]. */
  phaseDeg: NumberArray;
  /** Seconds, −dφ/dω from exact solves. */
  groupDelay: NumberArray;
}

export interface Readout {
  trace: string;
  name: string;
  value: number;
  unit: string;
  /** Hz where a readout belongs to a frequency (min-impedance), else null. */
  at: number | null;
}

export interface RequirementResult {
  line: number;
  text: string;
  pass: boolean;
  /** The worst measured value (or the value of a single-number measure). */
  measured: number;
  /** Hz where the worst value was found; null for single-number measures. */
  worstAt: number | null;
  /**
   * `not-available` when the requirement could not be checked (its measure is not computed
   * yet, or the trace has no such readout in the sweep); `pass` is then false.
   */
  status?: 'pass' | 'fail' | 'not-available';
  /** Unit of `measured`: "dB", "deg", "s", "Hz", or the trace's unit for `magnitude`. */
  unit?: string;
}

export interface StepResult {
  label: string;
  times: NumberArray;
  values: NumberArray;
}

export interface Complex {
  re: number;
  im: number;
}

export interface EnvelopeResult {
  label: string;
  minDb: NumberArray;
  maxDb: NumberArray;
  minPhaseDeg: NumberArray;
  maxPhaseDeg: NumberArray;
}

export interface Result {
  diagnostics: Diagnostic[];
  frequencies: NumberArray;
  traces: TraceResult[];
  readouts: Readout[];
  requirements: RequirementResult[];
  steps: StepResult[];
  poles: Complex[];
  zeros: Complex[];
  envelope: EnvelopeResult[];
}
