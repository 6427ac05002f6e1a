/**
 * The cell as written: one node per statement, each with its source range. Nothing here is
 * resolved yet (names are names, values are unevaluated); `elaborate` does that.
 * A statement whose parse failed part-way keeps what was read, with `null` for the rest.
 */
import type { SourceRange } from './circuit.js';
import type { Token } from './lexer.js';
import type { ControlledMode, Measure, OpAmpOptionName, PassiveKind, Unit } from './vocabulary.js';

export type { ControlledMode, OpAmpOptionName, PassiveKind };

/** A name as written, with where it stands. */
export interface Ident {
  name: string;
  range: SourceRange;
}

/** A value slot: a number, a parameter name, or an expression. */
export type Value =
  | {
      kind: 'number';
      /** With its SI prefix applied. */
      value: number;
      unit: Unit | null;
      /** An SI prefix or IEC letter was written (`0.25p`, `4k7`). */
      prefixed?: boolean;
      /** The number could not be read; its diagnostic has been made. */
      bad?: boolean;
      unitRange?: SourceRange;
      text: string;
      range: SourceRange;
    }
  | { kind: 'name'; name: string; range: SourceRange }
  /** `(2*Cb)`, or the right-hand side of `let`; `tokens` excludes the outer parentheses. */
  | { kind: 'expr'; tokens: Token[]; text: string; range: SourceRange };

/** `[a b]` as written. */
export interface NodeList {
  nodes: Ident[];
  range: SourceRange;
}

export interface LetStatement {
  kind: 'let';
  name: Ident;
  value: Value | null;
  range: SourceRange;
}

export type PartOption =
  | { kind: 'tolerance'; value: Value; range: SourceRange }
  | { kind: 'esr' | 'esl' | 'dcr'; value: Value; range: SourceRange }
  | { kind: 'noise-off'; range: SourceRange };

export interface PassiveStatement {
  kind: 'passive';
  part: PassiveKind;
  designator: Ident;
  nodes: NodeList;
  value: Value | null;
  options: PartOption[];
  range: SourceRange;
}

export interface OpAmpStatement {
  kind: 'opamp';
  designator: Ident;
  nodes: NodeList;
  options: { name: OpAmpOptionName; value: Value; range: SourceRange }[];
  range: SourceRange;
}

export interface ControlledStatement {
  kind: 'controlled';
  designator: Ident;
  nodes: NodeList;
  mode: ControlledMode;
  value: Value | null;
  /** The part whose current controls (`igain`, `rm`). */
  control: Ident | null;
  /** `transfer` and `poles`: the transfer function as written. */
  response?: ResponseSpec;
  range: SourceRange;
}

/** A transfer function: an expression in s, or poles and zeros (Hz, with an optional Q) and the gain at 0 Hz. */
export type ResponseSpec = { form: 'transfer'; expr: Value | null } | { form: 'poles'; poles: ResponseRoot[]; zeros: ResponseRoot[]; gain: Value | null };

/** `1k`, or `1k q 0.7` for a pair with natural frequency 1 kHz and that Q. */
export interface ResponseRoot {
  f: Value;
  q: Value | null;
}

/** `T1 [p+ p- s+ s-] turns N`: an ideal transformer. */
export interface TransformerStatement {
  kind: 'transformer';
  designator: Ident;
  nodes: NodeList;
  turns: Value | null;
  range: SourceRange;
}

/** `J1 [from to] break`: a link in a loop, where `show loop at J1` opens it. */
export interface BreakStatement {
  kind: 'break';
  designator: Ident;
  nodes: NodeList;
  range: SourceRange;
}

export interface CoupleStatement {
  kind: 'couple';
  l1: Ident;
  l2: Ident;
  k: Value | null;
  range: SourceRange;
}

export interface BlockParam {
  name: Ident;
  default: Value | null;
}

export interface BlockStatement {
  kind: 'block';
  name: Ident;
  pins: NodeList;
  params: BlockParam[];
  body: Statement[];
  /** The `block …` line. */
  range: SourceRange;
  /** The `end` line, or null when it is missing. */
  endRange: SourceRange | null;
}

export interface UseStatement {
  kind: 'use';
  block: Ident;
  instance: Ident;
  nodes: NodeList;
  args: { name: Ident; value: Value | null }[];
  range: SourceRange;
}

export interface DriveStatement {
  kind: 'drive';
  source: 'voltage' | 'current';
  /** One node (the other end is gnd) or two. */
  nodes: Ident[];
  nodesRange: SourceRange;
  amplitude: Value | null;
  phase: Value | null;
  range: SourceRange;
}

/** What a trace reads, as written. */
export type TraceExpr =
  | { kind: 'node'; node: Ident }
  | { kind: 'difference'; p: Ident; n: Ident }
  | { kind: 'ratio'; num: Ident; den: Ident }
  | { kind: 'current'; element: Ident }
  | { kind: 'impedance'; p: Ident; n: Ident | null; bracketed: boolean }
  /** `show loop at J1`: the loop opened at a loop break. */
  | { kind: 'break'; element: Ident }
  /** Node voltages times constant factors, added: `out + a`, `2 * out`, `out - 0.5 * a`. */
  | { kind: 'sum'; terms: SumTerm[]; text: string };

/** One term of a sum of traces: ± [FACTOR *] NODE. */
export interface SumTerm {
  sign: 1 | -1;
  factor: Value | null;
  node: Ident;
}

export type ShowMode = 'plain' | 'loop' | 'step' | 'noise';

export interface ShowStatement {
  kind: 'show';
  label: { text: string; range: SourceRange } | null;
  mode: ShowMode;
  expr: TraceExpr;
  /** The expression in canonical spacing (`out - in`, `impedance [a b]`). */
  exprText: string;
  exprRange: SourceRange;
  range: SourceRange;
}

export type SweepStatement =
  | { kind: 'sweep'; form: 'log'; from: Value; to: Value; perDecade: Value | null; range: SourceRange }
  | { kind: 'sweep'; form: 'linear'; from: Value; to: Value; points: Value; range: SourceRange }
  | { kind: 'sweep'; form: 'list'; frequencies: Value[]; range: SourceRange };

export interface TimeStatement {
  kind: 'time';
  from: Value;
  to: Value;
  points: Value | null;
  range: SourceRange;
}

export interface TemperatureStatement {
  kind: 'temperature';
  value: Value;
  range: SourceRange;
}

/** `spread N draws [seed S]` or `spread extremes`. */
export interface SpreadStatement {
  kind: 'spread';
  mode: 'draws' | 'extremes';
  draws: Value | null;
  seed: Value | null;
  range: SourceRange;
}

/** What a requirement measures; the same words the elaborated network uses. */
export type MeasureName = Measure;

/** What a requirement names: a quoted label, or the words of a `show` line's expression. */
export interface RequireTarget {
  /** A quoted label's text, or the canonical text of what was written (`loop out`). */
  text: string;
  quoted: boolean;
  range: SourceRange;
}

export interface RequireStatement {
  kind: 'require';
  target: RequireTarget;
  measure: { name: MeasureName; range: SourceRange };
  op: { op: '>=' | '<=' | '='; range: SourceRange };
  value: Value;
  tolerance: Value | null;
  over: { from: Value | null; to: Value | null; range: SourceRange } | null;
  at: Value | null;
  /** The line as written, trimmed and without its comment. */
  text: string;
  range: SourceRange;
}

/**
 * `vary NAME over V1, V2, …` or `vary NAME over V1 .. V2, N values [linear]`: variants of the
 * cell, each with the parameter NAME set to one value.
 */
export type VaryStatement =
  | { kind: 'vary'; name: Ident; form: 'list'; values: Value[]; range: SourceRange }
  | { kind: 'vary'; name: Ident; form: 'range'; from: Value; to: Value; count: Value; linear: boolean; range: SourceRange };

export type Statement =
  | LetStatement
  | PassiveStatement
  | OpAmpStatement
  | ControlledStatement
  | TransformerStatement
  | BreakStatement
  | CoupleStatement
  | BlockStatement
  | UseStatement
  | DriveStatement
  | ShowStatement
  | SweepStatement
  | TimeStatement
  | TemperatureStatement
  | SpreadStatement
  | RequireStatement
  | VaryStatement;

export interface Program {
  statements: Statement[];
  /** Some line could not be read; the elaborator then skips whole-cell checks that would mislead. */
  incomplete: boolean;
  /** Count of lines in the text (at least 1). */
  lineCount: number;
  /**
   * Every word on a line that could not be read. A name written there may be a node, a
   * part or a parameter that the broken line would have defined, so the elaborator does
   * not also report it as unknown elsewhere.
   */
  brokenWords: Set<string>;
}
