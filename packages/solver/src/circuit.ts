/**
 * The elaborated network: what the parser and elaborator hand to the numerical core.
 * Blocks are flattened, parameters resolved to numbers, nodes numbered (0 is ground),
 * and every `show` and `require` mapped to what it reads. Plain data, no methods.
 */
import type { Measure } from './vocabulary.js';

/** A place in the cell's text. Lines and columns are 1-based; `endColumn` is exclusive. */
export interface SourceRange {
  line: number;
  column: number;
  endColumn: number;
}

/** Index into `Circuit.nodeNames`; 0 is always ground (`gnd` or `0`). */
export type NodeIndex = number;

interface ElementBase {
  /** Designator as the user sees it; inside a block instance `B1.R3`. */
  name: string;
  range: SourceRange;
  /** Relative tolerance (0.01 for ±1 %), when the part has one. */
  tolerance?: number;
}

export interface Resistor extends ElementBase {
  kind: 'resistor';
  a: NodeIndex;
  b: NodeIndex;
  /** Ω, > 0 */
  value: number;
  noiseless: boolean;
}

export interface Capacitor extends ElementBase {
  kind: 'capacitor';
  a: NodeIndex;
  b: NodeIndex;
  /** F, > 0 */
  value: number;
  /** Series parasitics, Ω and H; 0 when absent. */
  esr: number;
  esl: number;
}

export interface Inductor extends ElementBase {
  kind: 'inductor';
  a: NodeIndex;
  b: NodeIndex;
  /** H, > 0 */
  value: number;
  /** Series winding resistance, Ω; 0 when absent. */
  dcr: number;
}

/** Magnetic coupling between two inductors of the circuit, named by designator. */
export interface Coupling {
  kind: 'coupling';
  name: string;
  range: SourceRange;
  l1: string;
  l2: string;
  /** 0 < k ≤ 1 */
  k: number;
}

/**
 * Op-amp. With neither `gain` nor `gbw`: ideal (nullor). `gain` alone: flat gain.
 * `gain` and `gbw`: one pole, A(s) = G / (1 + s·G/(2π·gbw)); `pole2` multiplies that by
 * 1/(1 + s/(2π·pole2)) (it needs `gbw`). `zout` is a series output
 * resistance (0 when absent). `en` (V/√Hz) and `inoise` (A/√Hz) are noise densities.
 */
export interface OpAmp extends ElementBase {
  kind: 'opamp';
  p: NodeIndex;
  n: NodeIndex;
  o: NodeIndex;
  /** Linear (V/V), not dB. */
  gain?: number;
  /** Hz */
  gbw?: number;
  /** Hz: a second pole, A(s) / (1 + s/(2π·pole2)); only with `gbw`. */
  pole2?: number;
  zout: number;
  en?: number;
  inoise?: number;
}

/** V(op, on) = gain · V(cp, cn) */
export interface Vcvs extends ElementBase {
  kind: 'vcvs';
  op: NodeIndex;
  on: NodeIndex;
  cp: NodeIndex;
  cn: NodeIndex;
  gain: number;
}

/** A current gm·V(cp, cn) leaves the element at op into the network and returns at on. */
export interface Vccs extends ElementBase {
  kind: 'vccs';
  op: NodeIndex;
  on: NodeIndex;
  cp: NodeIndex;
  cn: NodeIndex;
  gm: number;
}

/** Current gain·I(control) leaves at op into the network and returns at on. */
export interface Cccs extends ElementBase {
  kind: 'cccs';
  op: NodeIndex;
  on: NodeIndex;
  /** Designator of the two-terminal part whose current (first node → second) controls. */
  control: string;
  gain: number;
}

/** V(op, on) = rm · I(control) */
export interface Ccvs extends ElementBase {
  kind: 'ccvs';
  op: NodeIndex;
  on: NodeIndex;
  control: string;
  rm: number;
}

/**
 * Ideal transformer, p1 and s1 the dotted ends: V(s1, s2) = turns·V(p1, p2), and the current
 * into p1 is turns × the current out of s1, so a load R on the secondary looks like R/turns².
 */
export interface Transformer extends ElementBase {
  kind: 'transformer';
  p1: NodeIndex;
  p2: NodeIndex;
  s1: NodeIndex;
  s2: NodeIndex;
  /** Secondary turns per primary turn, > 0. */
  turns: number;
}

/**
 * A link from `from` to `to` in a loop: V(to) = V(from), its current unknown. For its loop
 * trace a test voltage stands in series, V(to) − V(from) = 1 V with the drive zeroed, and
 * the loop gain is T = −V(from)/V(to), the returned voltage over the injected one.
 */
export interface LoopBreak extends ElementBase {
  kind: 'loop-break';
  from: NodeIndex;
  to: NodeIndex;
}

/**
 * V(op, on) = H(s)·V(cp, cn) with H(s) = num(s)/den(s), coefficients in ascending powers
 * of s (rad/s). den is not all zeros.
 */
export interface TransferSource extends ElementBase {
  kind: 'transfer';
  op: NodeIndex;
  on: NodeIndex;
  cp: NodeIndex;
  cn: NodeIndex;
  num: number[];
  den: number[];
}

export type Element = Resistor | Capacitor | Inductor | Coupling | OpAmp | Vcvs | Vccs | Cccs | Ccvs | Transformer | LoopBreak | TransferSource;

/**
 * The stimulus. A voltage drive is an AC source V(p) − V(n) = amplitude∠phase; a current
 * drive pushes amplitude∠phase (A) into p and out of n.
 */
export interface Drive {
  kind: 'voltage' | 'current';
  p: NodeIndex;
  n: NodeIndex;
  amplitude: number;
  phaseDeg: number;
  range: SourceRange;
}

/** What a trace reads from the solution, per unit of drive. */
export type Probe =
  /** V(p) − V(n); `n` is 0 for a single node. */
  | { kind: 'voltage'; p: NodeIndex; n: NodeIndex }
  /** V(num) / V(den) */
  | { kind: 'ratio'; num: NodeIndex; den: NodeIndex }
  /** Current through a two-terminal part, first node → second. */
  | { kind: 'current'; element: string }
  /** Driving-point impedance between p and n with the drive zeroed. */
  | { kind: 'impedance'; p: NodeIndex; n: NodeIndex }
  /** The loop gain at a loop break, −V(from)/V(to) with its test voltage as the only source. */
  | { kind: 'loop-break'; element: string }
  /** Σ factor·V(node): a sum of node voltages with constant factors. */
  | { kind: 'sum'; terms: { node: NodeIndex; factor: number }[] };

export type TraceKind = 'ratio' | 'transimpedance' | 'current' | 'impedance' | 'loop' | 'noise' | 'step';

export interface TraceSpec {
  /** The label written in quotes, or the expression as written. */
  label: string;
  /** The expression as written in the `show` line (without `loop`/`step`/`noise`). */
  expr: string;
  kind: TraceKind;
  /** For `noise`: a voltage probe of the node. */
  probe: Probe;
  /** Display unit: "V/V", "Ω", "A/V", "A/A", "V/A", "V/√Hz". */
  unit: string;
  range: SourceRange;
}

export type SweepSpec =
  | { kind: 'log'; from: number; to: number; perDecade: number }
  | { kind: 'linear'; from: number; to: number; points: number }
  | { kind: 'list'; frequencies: number[] };

/** What a requirement measures: the words of the language's vocabulary. */
export type { Measure } from './vocabulary.js';

export interface RequirementSpec {
  range: SourceRange;
  /** The line's text as written, trimmed and without its comment. */
  text: string;
  /** Index into `Circuit.traces`. */
  trace: number;
  measure: Measure;
  /**
   * `>=` and `<=` compare with `value`; `=` passes within `value ± tolerance`, where the
   * tolerance is absolute or, when `relative`, a fraction of `value` (0.02 for 2 %).
   */
  op: '>=' | '<=' | '=';
  value: number;
  tolerance?: { amount: number; relative: boolean };
  /** Where a pointwise measure is checked: `from`/`to` in Hz, open ends allowed; or `at`. */
  over?: { from?: number; to?: number };
  at?: number;
}

export interface ToleranceSpec {
  kind: 'montecarlo' | 'worstcase';
  draws?: number;
  seed?: number;
  range: SourceRange;
}

export interface Circuit {
  /** nodeNames[0] is "gnd". Names inside block instances are `B1.x`. */
  nodeNames: string[];
  elements: Element[];
  drive: Drive | null;
  traces: TraceSpec[];
  /** null: the default sweep (1 Hz .. 1 MHz, 100/decade, widened to cover the network). */
  sweep: SweepSpec | null;
  requirements: RequirementSpec[];
  tolerance: ToleranceSpec | null;
  /** Kelvin; default 300. */
  temperature: number;
  /** `time T1 .. T2 [, N points]` for step traces, seconds. */
  time: { from: number; to: number; points?: number } | null;
}
