/**
 * The cell language's words, each written once: statement words, part classes with their
 * units and articles, options, measures with their units, functions, constants, SI prefixes
 * and unit spellings. The lexer, parser, elaborator, expression reader, command line and the
 * web editor all read them from here. This module imports nothing of the solver.
 */

/** A unit the cell language knows, in its canonical spelling. */
export type Unit = 'Ω' | 'F' | 'H' | 'Hz' | 'V' | 'A' | 's' | 'S' | 'dB' | 'deg' | '%' | 'K' | '°C';

/** SI prefixes the language accepts; `u`, `µ` (micro sign) and `μ` (Greek mu) are all micro. */
export const SI_PREFIXES: Readonly<Record<string, number>> = {
  f: 1e-15,
  p: 1e-12,
  n: 1e-9,
  u: 1e-6,
  µ: 1e-6,
  μ: 1e-6,
  m: 1e-3,
  k: 1e3,
  M: 1e6,
  G: 1e9,
  T: 1e12,
};

/** Every spelling of a unit, mapped to its canonical form. */
export const UNIT_SPELLINGS: Readonly<Record<string, Unit>> = {
  Ω: 'Ω',
  ohm: 'Ω',
  F: 'F',
  H: 'H',
  Hz: 'Hz',
  V: 'V',
  A: 'A',
  s: 's',
  S: 'S',
  dB: 'dB',
  deg: 'deg',
  '°': 'deg',
  '%': '%',
  K: 'K',
  '°C': '°C',
};

/** Units that never take an SI prefix. */
export const UNPREFIXED_UNITS: readonly Unit[] = ['dB', 'deg', '%', 'K', '°C'];

/** The prefixes and units as a hint lists them. */
export const PREFIX_LIST = 'f p n u µ m k M G T';
export const UNIT_LIST = 'Ω (or ohm), F, H, Hz, V, A, s, S, dB, deg (or °), %, K, °C';

/** Words that start a statement, each with what it is for. */
export const STATEMENTS = {
  let: 'a parameter: let NAME = value',
  block: 'a reusable sub-network, closed by end',
  end: 'closes a block',
  use: 'an instance of a block: use NAME as B1 [nodes]',
  drive: 'the AC stimulus: drive NODE [amplitude]',
  show: 'a trace: show NODE, show loop …, show impedance NODE',
  sweep: 'the frequency sweep: sweep 10 .. 100k, 100/decade',
  time: 'the window of step traces: time 0 .. 1m',
  temperature: 'for noise: temperature 25°C or 290 K (default 300 K)',
  spread: 'tolerance spread: spread 200 draws, or spread extremes',
  require: 'a requirement: require out gain >= -3 dB over 10 .. 1k',
  vary: 'variants: vary R over 1k, 10k, or vary R over 1k .. 100k, 5 values',
  couple: 'magnetic coupling: couple L1 L2 0.98',
} as const;

export type StatementWord = keyof typeof STATEMENTS;

export const STATEMENT_WORDS = Object.keys(STATEMENTS) as StatementWord[];

/** What a line may start with, as hints say it. */
export const LINE_STARTS = `a line starts with a statement word (${STATEMENT_WORDS.filter((w) => w !== 'end').join(', ')}) or a part designator such as R1`;

/** Statements that belong to the whole cell, never inside a block. */
export const TOP_LEVEL_ONLY: ReadonlySet<string> = new Set<StatementWord>(['drive', 'show', 'sweep', 'time', 'temperature', 'spread', 'require', 'vary']);

export type PassiveKind = 'resistor' | 'capacitor' | 'inductor';

export type PartClassLetter = 'R' | 'C' | 'L' | 'U' | 'A' | 'T' | 'J';

/** A part class: the designator's letter, what it is, and how its line is written. */
export interface PartClass {
  kind: string;
  article: string;
  /** The nodes and value of an example line, after the designator. */
  template: string;
}

export const PART_CLASSES: Readonly<Record<PartClassLetter, PartClass>> = {
  R: { kind: 'resistor', article: 'a resistor', template: '[a b] 10k' },
  C: { kind: 'capacitor', article: 'a capacitor', template: '[a b] 10n' },
  L: { kind: 'inductor', article: 'an inductor', template: '[a b] 1m' },
  U: { kind: 'op-amp', article: 'an op-amp', template: '[p n out] opamp' },
  A: { kind: 'controlled source', article: 'a controlled source', template: '[o+ o- c+ c-] vgain 10' },
  T: { kind: 'transformer', article: 'a transformer', template: '[p+ p- s+ s-] turns 2' },
  J: { kind: 'loop break', article: 'a loop break', template: '[from to] break' },
};

export const PART_LETTERS = Object.keys(PART_CLASSES) as PartClassLetter[];

/** The letter of a block instance's designator (`use lowpass as B1 [in out]`). */
export const INSTANCE_LETTER = 'B';

/** A two-terminal part's value: its unit and an example. */
export const PASSIVES: Readonly<Record<PassiveKind, { letter: PartClassLetter; unit: Unit; example: string; options: readonly string[]; optionText: string }>> =
  {
    resistor: { letter: 'R', unit: 'Ω', example: '10k', options: ['tol', 'noise'], optionText: '±1%, tol 1%, noise off' },
    capacitor: { letter: 'C', unit: 'F', example: '10n', options: ['tol', 'esr', 'esl'], optionText: '±5%, tol 5%, esr Ω, esl H' },
    inductor: { letter: 'L', unit: 'H', example: '1m', options: ['tol', 'dcr'], optionText: '±10%, tol 10%, dcr Ω' },
  };

/** Every option word of a resistor, capacitor or inductor. */
export const PASSIVE_OPTIONS = ['tol', 'esr', 'esl', 'dcr', 'noise'] as const;

/** The one value `noise` takes on a resistor. */
export const NOISE_OFF = 'off';

/** The op-amp's word and its options, each with its unit. */
export const OPAMP_WORD = 'opamp';
export const OPAMP_OPTIONS = { gain: 'V/V or dB', gbw: 'Hz', pole2: 'Hz', zout: 'Ω', vnoise: 'V/√Hz', inoise: 'A/√Hz' } as const;
export type OpAmpOptionName = keyof typeof OPAMP_OPTIONS;
export const OPAMP_OPTION_WORDS = Object.keys(OPAMP_OPTIONS) as OpAmpOptionName[];

/** An ideal transformer's word: `T1 [p+ p- s+ s-] turns N`, N secondary turns per primary turn. */
export const TURNS_WORD = 'turns';

/** A loop break's word: `J1 [from to] break`, a link that `show loop at J1` opens. */
export const BREAK_WORD = 'break';

/** What an A part is, by the word after its nodes. */
export const CONTROLLED_MODES = {
  vgain: 'voltage gain, V(o+,o-) = K·V(c+,c-)',
  gm: 'transconductance, current gm·V(c+,c-)',
  igain: 'current gain, K times the current of a part',
  rm: 'transresistance, rm times the current of a part',
  transfer: 'a transfer function, V(o+,o-) = H(s)·V(c+,c-) with H a ratio of polynomials in s',
  poles: 'a transfer function by its poles, zeros and gain at 0 Hz',
} as const;
export type ControlledMode = keyof typeof CONTROLLED_MODES;
export const CONTROLLED_MODE_WORDS = Object.keys(CONTROLLED_MODES) as ControlledMode[];

/** The words after `poles`: `poles 1k q 0.7, 20k zeros 5k gain 20dB`. */
export const RESPONSE_WORDS = ['zeros', 'q', 'gain'] as const;

/** The complex frequency in a `transfer` expression, in rad/s. */
export const LAPLACE_VARIABLE = 's';

/** Words of `show`: what a trace is of and how it is read. */
export const SHOW_MODES = ['loop', 'step', 'noise'] as const;
export const TRACE_WORDS = ['current', 'impedance'] as const;

/** The smaller words inside statements. */
export const CONNECTIVES = {
  drive: ['current', 'phase'],
  sweep: ['at', 'linear', 'decade'],
  time: ['points'],
  spread: ['draws', 'seed', 'extremes'],
  require: ['over', 'at'],
  vary: ['over', 'values', 'linear'],
  use: ['as'],
  part: ['of'],
} as const;

/**
 * What a requirement measures, with the unit of its value: '' for a plain number (Q), null
 * for the trace's own unit (magnitude, a step's final value and its value at a time). Every
 * readout a trace shows is a measure too.
 */
export const MEASURES = {
  gain: 'dB',
  phase: 'deg',
  delay: 's',
  magnitude: null,
  corner: 'Hz',
  'lower-corner': 'Hz',
  'upper-corner': 'Hz',
  bandwidth: 'Hz',
  centre: 'Hz',
  q: '',
  peak: 'dB',
  'peak-frequency': 'Hz',
  'low-frequency-gain': 'dB',
  'asymptotic-slope': 'dB/decade',
  'min-impedance': 'Ω',
  crossover: 'Hz',
  'phase-margin': 'deg',
  'phase-crossover': 'Hz',
  'gain-margin': 'dB',
  settling: 's',
  overshoot: '%',
  final: null,
  t63: 's',
  'rise-time': 's',
  value: null,
  ripple: 'dB',
  'min-attenuation': 'dB',
  'insertion-loss': 'dB',
  'notch-depth': 'dB',
  'notch-frequency': 'Hz',
  'max-impedance': 'Ω',
  'anti-resonance': 'Hz',
  'delay-variation': 's',
} as const;
export type Measure = keyof typeof MEASURES;

/**
 * Where a measure is read: `point`, at each point (`over` a range or `at` one frequency,
 * else over the whole sweep); `band`, one number over the band it needs (`over`); `at`, at
 * the one frequency it needs (for `value` of a step, the one time); `within`, one feature (a notch, an anti-resonance) of the
 * sweep or of the band an optional `over` gives; `trace`, one number for the whole trace.
 */
export type MeasureWhere = 'point' | 'band' | 'at' | 'within' | 'trace';
export const MEASURE_WHERE: Readonly<Record<Measure, MeasureWhere>> = {
  gain: 'point',
  phase: 'point',
  delay: 'point',
  magnitude: 'point',
  corner: 'trace',
  'lower-corner': 'trace',
  'upper-corner': 'trace',
  bandwidth: 'trace',
  centre: 'trace',
  q: 'trace',
  peak: 'trace',
  'peak-frequency': 'trace',
  'low-frequency-gain': 'trace',
  'asymptotic-slope': 'trace',
  'min-impedance': 'trace',
  crossover: 'trace',
  'phase-margin': 'trace',
  'phase-crossover': 'trace',
  'gain-margin': 'trace',
  settling: 'trace',
  overshoot: 'trace',
  final: 'trace',
  t63: 'trace',
  'rise-time': 'trace',
  value: 'at',
  ripple: 'band',
  'min-attenuation': 'band',
  'insertion-loss': 'at',
  'notch-depth': 'within',
  'notch-frequency': 'within',
  'max-impedance': 'within',
  'anti-resonance': 'within',
  'delay-variation': 'band',
};

/** Measures that only one kind of trace has. */
export const MEASURE_TRACE: Readonly<Partial<Record<Measure, 'loop' | 'step' | 'impedance'>>> = {
  crossover: 'loop',
  'phase-margin': 'loop',
  'phase-crossover': 'loop',
  'gain-margin': 'loop',
  settling: 'step',
  overshoot: 'step',
  final: 'step',
  t63: 'step',
  'rise-time': 'step',
  value: 'step',
  'min-impedance': 'impedance',
  'max-impedance': 'impedance',
  'anti-resonance': 'impedance',
};
export const MEASURE_WORDS = Object.keys(MEASURES) as Measure[];

/** Functions of value expressions, with how many arguments each takes. */
export const FUNCTIONS = {
  sqrt: 1,
  exp: 1,
  ln: 1,
  log10: 1,
  sin: 1,
  cos: 1,
  tan: 1,
  atan: 1,
  abs: 1,
  min: 'many',
  max: 'many',
} as const;
export type FunctionName = keyof typeof FUNCTIONS;
export const FUNCTION_WORDS = Object.keys(FUNCTIONS) as FunctionName[];

export function isFunctionName(word: string): word is FunctionName {
  return Object.prototype.hasOwnProperty.call(FUNCTIONS, word);
}

/** Constants of value expressions. */
export const CONSTANTS: Readonly<Record<string, number>> = { pi: Math.PI, e: Math.E };

/** Own names only: `constructor` and `toString` are ordinary names, not constants. */
export function isConstantName(word: string): boolean {
  return Object.prototype.hasOwnProperty.call(CONSTANTS, word);
}

/** The ground node's one name. */
export const GROUND = 'gnd';

/** The default temperature for noise, in K. */
export const DEFAULT_TEMPERATURE = 300;

/**
 * Words of the language's earlier forms, with what replaced them. The parser reports each
 * with a quick fix to the new form; `modernizeCellText` rewrites them.
 */
export const RETIRED = {
  noiseless: 'noise off',
  en: 'vnoise',
  in: 'inoise',
  tolerance: 'spread',
  montecarlo: 'draws',
  worstcase: 'extremes',
} as const;

/** A reference designator: its class letter, a number, optionally a lower-case suffix. */
const DESIGNATOR = /^([A-Z])(\d+)([a-z]*)$/;

/** Whether `name` is a well-formed reference designator of class `letter` (`R1`, `R4b`). */
export function isDesignator(name: string, letter: string): boolean {
  const m = DESIGNATOR.exec(name);
  return m !== null && m[1] === letter;
}

/** The number of a well-formed designator (`R12b` → 12), or null. */
export function designatorNumber(name: string): number | null {
  const m = DESIGNATOR.exec(name);
  return m === null ? null : Number(m[2]);
}

/** Whether `name` is written with digits only (a node name of the earlier forms). */
export function isDigitsOnly(name: string): boolean {
  return /^\d+$/.test(name);
}

/** The node name that replaces a digits-only one: `0` is ground, `12` becomes `n12`. */
export function nodeNameFor(digits: string): string {
  return digits === '0' ? GROUND : `n${digits}`;
}

/** The words after a part's nodes, by its class: the word that says what it is, and its options. */
export const PART_WORDS: Readonly<Record<PartClassLetter, { kinds: readonly string[]; options: readonly string[] }>> = {
  R: { kinds: [], options: PASSIVES.resistor.options },
  C: { kinds: [], options: PASSIVES.capacitor.options },
  L: { kinds: [], options: PASSIVES.inductor.options },
  U: { kinds: [OPAMP_WORD], options: OPAMP_OPTION_WORDS },
  A: { kinds: CONTROLLED_MODE_WORDS, options: [...CONNECTIVES.part, ...RESPONSE_WORDS] },
  T: { kinds: [TURNS_WORD], options: [] },
  J: { kinds: [BREAK_WORD], options: [] },
};
