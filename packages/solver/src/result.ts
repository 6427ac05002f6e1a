/**
 * What `analyze()` returns: plain data that every screen draws from. The shape follows
 * the solver contract; arrays of numbers may be typed arrays inside the library, and the
 * command line turns them into plain JSON: a non-finite number in an array becomes null (no
 * value), but an infinite `Readout.value` or `RequirementResult.measured` (a gain margin of
 * +∞, the −∞ dB of an exact null) is written as the string "Infinity" or "-Infinity". Readouts and
 * requirement results carry everything a screen needs to draw them (ids, units, limits,
 * frequencies), so no screen reads the cell's text again.
 */
import type { Measure } from './circuit.js';

/** `info`: nothing is wrong with the cell, but a person should know (a caution, code `hazardous-voltage`). */
export type Severity = 'error' | 'warning' | 'info';

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
  /** Seconds, −dφ/dω from exact solves (a column of the command line's CSV too). */
  groupDelay: NumberArray;
}

/** The stable ids of readouts (kept in JSON); `READOUT_NAMES` says how each reads on screen. */
export type ReadoutId =
  | 'low-frequency-gain'
  | 'corner'
  | 'corner-low'
  | 'corner-high'
  | 'bandwidth'
  | 'center'
  | 'q'
  | 'peak'
  | 'peak-frequency'
  | 'rolloff'
  | 'crossover'
  | 'phase-margin'
  | 'phase-crossover'
  | 'gain-margin'
  | 'min-impedance'
  | 'final'
  | 't63'
  | 'rise-time'
  | 'settling'
  | 'overshoot';

/**
 * The one name of each readout wherever a person reads it: the readouts panel, the plot's
 * markers, the command line's text output.
 */
export const READOUT_NAMES: Readonly<Record<ReadoutId, string>> = {
  'low-frequency-gain': 'low-frequency gain',
  corner: 'corner',
  'corner-low': 'lower corner',
  'corner-high': 'upper corner',
  bandwidth: 'bandwidth',
  center: 'centre',
  q: 'Q',
  peak: 'peak',
  'peak-frequency': 'peak frequency',
  rolloff: 'asymptotic slope',
  crossover: 'crossover',
  'phase-margin': 'phase margin',
  'phase-crossover': 'phase crossover',
  'gain-margin': 'gain margin',
  'min-impedance': 'minimum impedance',
  final: 'final value',
  t63: 't63',
  'rise-time': 'rise time',
  settling: 'settling time',
  overshoot: 'overshoot',
};

export interface Readout {
  /** The trace's label, as in `TraceResult.label`. */
  trace: string;
  name: ReadoutId;
  /** Always finite, except a `gain-margin` of +∞ (JSON: "Infinity"). */
  value: number;
  unit: string;
  /**
   * Hz where a value that is not itself a frequency was found: `peak` (where there is one),
   * `phase-margin` (at the crossover), `gain-margin` (at the phase crossover),
   * `min-impedance`. Null otherwise.
   */
  at: number | null;
}

/** `not-applicable`: the requirement could not be checked (its `reason`, and a warning on its line, say why). */
export type RequirementStatus = 'pass' | 'fail' | 'not-applicable';

/** How a requirement's status reads everywhere: screens, badges, the command line. */
export const STATUS_WORDS: Readonly<Record<RequirementStatus, string>> = { pass: 'pass', fail: 'fail', 'not-applicable': 'n/a' };

/** A `require` line as the solver read it and checked it. */
export interface RequirementResult {
  line: number;
  /** The line as written, trimmed and without its comment. */
  text: string;
  status: RequirementStatus;
  /** The label of the trace it reads, as in `TraceResult.label`. */
  trace: string;
  measure: Measure;
  op: '>=' | '<=' | '=';
  /** The limit (the centre of an `=` band), evaluated, in `unit`. */
  limit: number;
  /** As written after `±`: a fraction of the limit (0.02 for 2 %) or an amount in `unit`. */
  tolerance: { relative: number } | { absolute: number } | null;
  /**
   * The values that pass, in `unit`, exactly as the check compares them: `[limit, ∞)` for
   * `>=`, `(−∞, limit]` for `<=`, limit ± tolerance for `=` (± 1e-6 of the limit when no
   * tolerance is written). An open side is null.
   */
  band: { low: number | null; high: number | null };
  /**
   * The frequencies (Hz) a pointwise measure, or one of a band (`ripple`, `notch-depth`, …),
   * is checked over, open ends resolved to the sweep's (the whole sweep when none is
   * written); null for the other single-number measures and for `at`.
   */
  over: { from: number; to: number } | null;
  /** The one frequency (Hz) of `require … at F` (the one time, in s, of a step trace's `value … at T`), else null. */
  at: number | null;
  /**
   * Unit of `limit`, `band` and `measured`: "dB", "deg", "s", "Hz", "%", "Ω", "dB/decade", "" (Q), or the trace's unit
   * for `magnitude` and a step trace's `final` and `value` ("V", "A").
   */
  unit: string;
  /**
   * The worst measured value (or the value of a single-number measure); NaN when not
   * applicable; ±∞ when that is the value (JSON: "Infinity", "-Infinity"; a note says why).
   */
  measured: number;
  /**
   * Hz where the worst value was found, or where a single number was (a notch's depth at the
   * notch, a peak impedance at its peak, the least attenuation where the gain is highest, an
   * insertion loss at its `at`); null for a value that is itself a frequency or has no one place.
   */
  worstAt: number | null;
  /** Why it could not be checked (status `not-applicable`), in plain words; null otherwise. */
  reason: string | null;
  /**
   * Only in a cell with a `vary` line, where a requirement passes only if every variant
   * passes: `failed` lists the variants that fail it, `worst` is the variant whose values
   * (status, measured, worstAt, reason) this result carries (indices into `Result.variants`).
   */
  variants?: { worst: number; failed: number[] };
}

/**
 * A `show step` trace: the response to a step of the drive from 0 to its amplitude at t = 0,
 * at rest before it; at t = 0 the value just after the step.
 */
export interface StepResult {
  label: string;
  /** The expression as written in the `show step` line. */
  expr: string;
  /** "V", "A", or "V/V" for a ratio of two node voltages. */
  unit: string;
  /** Seconds, evenly spaced over the window. */
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

/** One variant of a cell with a `vary` line: the cell with its parameter set to `value`. */
export interface VariantResult {
  /** The `let` parameter the `vary` line steps. */
  parameter: string;
  value: number;
  /** The parameter's unit as its `let` line writes it; '' without one. */
  unit: string;
  /** How the variant is named on every screen: "Rload = 10 Ω". */
  label: string;
  /** This variant's own sweep (without a sweep line each variant's default sweep covers its own network). */
  frequencies: NumberArray;
  traces: TraceResult[];
  readouts: Readout[];
  /** This variant's own result of each requirement, in the order of `Result.requirements`. */
  requirements: RequirementResult[];
  /** This variant's step responses, one per `show step` line. */
  steps: StepResult[];
}

/**
 * A cell without `vary` fills every field but `variants`. With `vary`, `frequencies`,
 * `traces` and `readouts` are those of the first variant, each requirement is checked over
 * every variant (see `RequirementResult.variants`), and `variants` holds each variant.
 */
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
  /** Present only with a `vary` line: every variant, in the order its values are written. */
  variants?: VariantResult[];
}
