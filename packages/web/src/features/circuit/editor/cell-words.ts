/**
 * The words of the cell language, grouped by what they do in the editor (colour and
 * completion). Every word comes from the solver's vocabulary, so the editor and the
 * language never disagree; the solver stays the judge of what is valid.
 */
import {
  CONNECTIVES,
  CONSTANTS,
  FUNCTION_WORDS,
  MEASURE_WORDS,
  NOISE_OFF,
  PART_CLASSES,
  PART_LETTERS,
  PART_WORDS,
  SHOW_MODES,
  STATEMENTS,
  STATEMENT_WORDS,
  TRACE_WORDS,
} from '@rolloff/solver';
import type { StatementWord } from '@rolloff/solver';

/** Words that start a statement. */
export const statementWords: readonly StatementWord[] = STATEMENT_WORDS;

/** What each statement is for, shown beside it in completion. */
export const statementInfo: Readonly<Record<StatementWord, string>> = STATEMENTS;

/** The kinds of part, by the designator letter they start with. */
export const partLetters = PART_LETTERS.map((letter) => ({ letter, kind: PART_CLASSES[letter].kind, template: PART_CLASSES[letter].template }));

/** Words naming a part's kind after its nodes. */
export const partKindWords: readonly string[] = [...new Set(PART_LETTERS.flatMap((letter) => PART_WORDS[letter].kinds))];

/** Options written after a part's value (and `of`, which names the controlling part). */
export const partOptionWords: readonly string[] = [...new Set(PART_LETTERS.flatMap((letter) => PART_WORDS[letter].options))];

/** Words inside show, drive, sweep, time, spread and use statements. */
const modifierWords: readonly string[] = [...new Set<string>([...SHOW_MODES, ...TRACE_WORDS, ...Object.values(CONNECTIVES).flat(), NOISE_OFF])];

/** What a requirement measures. */
export const measureWords: readonly string[] = MEASURE_WORDS;

/** Functions and constants of value expressions. */
export const functionWords: readonly string[] = FUNCTION_WORDS;
const constantWords: readonly string[] = Object.keys(CONSTANTS);

const has = (list: readonly string[], word: string) => list.includes(word);

export const isStatementWord = (word: string): word is StatementWord => has(statementWords, word);
export const isPartKindWord = (word: string) => has(partKindWords, word);
export const isPartOptionWord = (word: string) => has(partOptionWords, word);
export const isModifierWord = (word: string) => has(modifierWords, word);
export const isMeasureWord = (word: string) => has(measureWords, word);
export const isBuiltinWord = (word: string) => has(functionWords, word) || has(constantWords, word);
