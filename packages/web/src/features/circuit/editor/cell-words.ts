/**
 * The words of the cell language (see the language reference), grouped by what they do,
 * for colouring and completion. The solver stays the judge of what is valid; these lists
 * only decide how a word looks and what the editor offers. Statement words, measures,
 * prefixes and units come from the solver itself, so the two never disagree.
 */
import { MEASURES, SI_PREFIXES, STATEMENT_KEYWORDS, UNIT_SPELLINGS } from '@rolloff/solver';

/** Words that start a statement. */
export const statementWords = STATEMENT_KEYWORDS;

/** What each statement is for, shown beside it in completion. */
export const statementInfo: Readonly<Record<(typeof statementWords)[number], string>> = {
  let: 'a parameter: let NAME = value',
  drive: 'the AC stimulus: drive NODE [amplitude]',
  show: 'a trace: show NODE, show loop …, show impedance NODE',
  sweep: 'the frequency sweep: sweep 10 .. 100k, 100/decade',
  time: 'the window of step traces: time 0 .. 1m',
  temperature: 'for noise: temperature 300 K',
  tolerance: 'a spread: tolerance montecarlo 200 or tolerance worstcase',
  require: 'a requirement: require out gain >= -3 dB over 10 .. 1k',
  block: 'a reusable sub-network, closed by end',
  end: 'closes a block',
  use: 'an instance of a block: use NAME as B1 [nodes]',
  couple: 'magnetic coupling: couple L1 L2 0.98',
};

/** The kinds of part, by the designator letter they start with. */
export const partLetters = [
  { letter: 'R', kind: 'resistor', template: '[a b] 10k' },
  { letter: 'C', kind: 'capacitor', template: '[a b] 100n' },
  { letter: 'L', kind: 'inductor', template: '[a b] 10m' },
  { letter: 'U', kind: 'op-amp', template: '[p n out] opamp' },
  { letter: 'A', kind: 'controlled source', template: '[o+ o- c+ c-] vgain 10' },
] as const;

/** Words naming a part's kind after its nodes. */
export const partKindWords = ['opamp', 'vgain', 'gm', 'igain', 'rm'] as const;

/** Options written after a part's value. */
export const partOptionWords = ['esr', 'esl', 'dcr', 'tol', 'noiseless', 'gain', 'gbw', 'zout', 'en', 'in', 'of'] as const;

/** Words inside show, drive, sweep and tolerance statements. */
export const modifierWords = ['current', 'impedance', 'loop', 'step', 'noise', 'phase', 'linear', 'decade', 'points', 'montecarlo', 'worstcase', 'seed', 'over', 'at', 'as'] as const;

/** What a requirement measures. */
export const measureWords = MEASURES;

/** Functions and constants of value expressions. */
export const functionWords = ['sqrt', 'exp', 'ln', 'log10', 'sin', 'cos', 'tan', 'atan', 'abs', 'min', 'max'] as const;
export const constantWords = ['pi', 'e'] as const;

/** SI prefixes a number may carry straight after its digits. */
export const siPrefixes: readonly string[] = Object.keys(SI_PREFIXES);

/** Every spelling of a unit. */
export const unitSpellings: readonly string[] = Object.keys(UNIT_SPELLINGS);

/** Units that never take a prefix. */
export const unprefixedUnits = ['dB', 'deg', '°', '%', 'K', '°C'] as const;

const has = (list: readonly string[], word: string) => list.includes(word);

export const isStatementWord = (word: string) => has(statementWords, word);
export const isPartKindWord = (word: string) => has(partKindWords, word);
export const isPartOptionWord = (word: string) => has(partOptionWords, word);
export const isModifierWord = (word: string) => has(modifierWords, word);
export const isMeasureWord = (word: string) => has(measureWords, word);
export const isBuiltinWord = (word: string) => has(functionWords, word) || has(constantWords, word);

/** True when `text` is a unit, with or without an SI prefix (`Hz`, `kHz`, `mA`, `dB`). */
export function isUnitText(text: string): boolean {
  if (has(unitSpellings, text)) return true;
  const prefix = text[0];
  const rest = text.slice(1);
  return prefix !== undefined && has(siPrefixes, prefix) && has(unitSpellings, rest) && !has(unprefixedUnits, rest);
}
