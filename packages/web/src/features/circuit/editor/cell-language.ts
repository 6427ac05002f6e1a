/**
 * The cell language for CodeMirror: a line-by-line stream tokenizer that tells keywords,
 * designators, node names, parameters, numbers with their SI prefix, units, comments and
 * strings apart, and the highlight style that colours them from our palette.
 */
import { HighlightStyle, StreamLanguage, StringStream, syntaxHighlighting } from '@codemirror/language';
import type { StreamParser } from '@codemirror/language';
import { tags } from '@lezer/highlight';
import {
  isBuiltinWord,
  isMeasureWord,
  isModifierWord,
  isPartKindWord,
  isPartOptionWord,
  isStatementWord,
  isUnitText,
  siPrefixes,
  unitSpellings,
} from './cell-words';

/** What a token is, as the highlighter and completion see it. */
export type CellTokenStyle =
  | 'comment'
  | 'string'
  | 'keyword'
  | 'typeName'
  | 'labelName'
  | 'variableName.special'
  | 'variableName.definition'
  | 'variableName'
  | 'variableName.standard'
  | 'modifier'
  | 'propertyName'
  | 'number'
  | 'unit'
  | 'operator'
  | 'squareBracket'
  | 'paren'
  | 'punctuation'
  | 'invalid';

type Head =
  | 'let'
  | 'drive'
  | 'show'
  | 'sweep'
  | 'time'
  | 'temperature'
  | 'tolerance'
  | 'require'
  | 'block'
  | 'end'
  | 'use'
  | 'couple'
  | 'part'
  | 'other';

/** The tokenizer's state; it only describes the current line, so it resets at each line start. */
export interface CellLineState {
  head: Head | null;
  /** Words seen on this line so far. */
  words: number;
  inBracket: boolean;
  parens: number;
  /** Inside the parentheses of block/use, a name before `=` is a parameter name. */
  afterEquals: boolean;
  prevWord: string | null;
  prevWasNumber: boolean;
  numbersSeen: number;
  measureSeen: boolean;
  /** A number's unit (or unreadable suffix) still to be read as its own token. */
  pendingSuffix: 'unit' | 'invalid' | null;
  pendingLength: number;
}

const freshState = (): CellLineState => ({
  head: null,
  words: 0,
  inBracket: false,
  parens: 0,
  afterEquals: false,
  prevWord: null,
  prevWasNumber: false,
  numbersSeen: 0,
  measureSeen: false,
  pendingSuffix: null,
  pendingLength: 0,
});

const NAME_START = /[A-Za-z_]/;
const NAME = /^[A-Za-z_][A-Za-z0-9_]*(?:\.[A-Za-z0-9_]+)*/;
const DIGITS_NODE = /^\d+(?![A-Za-z0-9_.µμΩ°%])/;
const IEC_NUMBER = /^\d+[fpnuµμmkMGTR]\d+/;
const NUMBER = /^(?:\d+(?:\.(?!\.)\d*)?|\.\d+)(?:[eE][+-]?\d+)?/;
const SUFFIX = /^[A-Za-zµμΩ°%]+/;
const OPERATORS = ['+/-', '..', '>=', '<=', '=>', '=<', '==', '+-', '…', '≥', '≤', '±', '=', '>', '<', '+', '-', '−', '*', '/', '^'];

/**
 * Splits what follows a number's digits into the part that belongs to the number (an SI
 * prefix) and the rest (a unit, or something unreadable).
 */
function splitSuffix(suffix: string): { prefixLength: number; rest: 'unit' | 'invalid' | null } {
  if (suffix === '' || suffix === 'R') return { prefixLength: suffix.length, rest: null };
  if ((unitSpellings as readonly string[]).includes(suffix)) return { prefixLength: 0, rest: 'unit' };
  const first = suffix[0];
  if ((siPrefixes as readonly string[]).includes(first)) {
    if (suffix.length === 1) return { prefixLength: 1, rest: null };
    return { prefixLength: 1, rest: isUnitText(suffix) ? 'unit' : 'invalid' };
  }
  return { prefixLength: 0, rest: 'invalid' };
}

function readNumber(stream: StringStream, state: CellLineState): CellTokenStyle {
  const iec = stream.match(IEC_NUMBER);
  if (!iec) stream.match(NUMBER);
  const suffix = stream.match(SUFFIX, false);
  const text = Array.isArray(suffix) ? suffix[0] : '';
  if (iec) {
    if (text !== '') {
      state.pendingSuffix = (unitSpellings as readonly string[]).includes(text) ? 'unit' : 'invalid';
      state.pendingLength = text.length;
    }
  } else {
    const { prefixLength, rest } = splitSuffix(text);
    stream.pos += prefixLength;
    if (rest !== null) {
      state.pendingSuffix = rest;
      state.pendingLength = text.length - prefixLength;
    }
  }
  state.prevWasNumber = true;
  state.numbersSeen += 1;
  return 'number';
}

/** Decides what a word is from the statement it stands in and its place there. */
function classifyWord(word: string, state: CellLineState): CellTokenStyle {
  const index = state.words;
  const prev = state.prevWord;
  const afterNumber = state.prevWasNumber;
  state.words += 1;
  state.prevWord = word;
  state.prevWasNumber = false;
  if (state.inBracket) return 'variableName.special';
  if (index === 0) {
    if (isStatementWord(word)) {
      state.head = word as Head;
      return 'keyword';
    }
    state.head = /^[RCLUA]/.test(word) ? 'part' : 'other';
    return state.head === 'part' ? 'labelName' : 'variableName';
  }
  if (afterNumber && isUnitText(word)) return 'unit';
  if (state.parens > 0 && (state.head === 'block' || state.head === 'use') && !state.afterEquals) {
    return state.head === 'block' ? 'variableName.definition' : 'propertyName';
  }
  if (isBuiltinWord(word) && state.head !== 'drive' && state.head !== 'show') return 'variableName.standard';
  switch (state.head) {
    case 'let':
      return index === 1 ? 'variableName.definition' : 'variableName';
    case 'part':
      if (prev === 'of') return 'labelName';
      if (isPartKindWord(word)) return 'typeName';
      if (isPartOptionWord(word)) return 'modifier';
      return 'variableName';
    case 'couple':
      return index <= 2 ? 'labelName' : 'variableName';
    case 'drive':
      if (word === 'current' || word === 'phase') return 'modifier';
      return state.numbersSeen === 0 && prev !== 'phase' ? 'variableName.special' : 'variableName';
    case 'show':
      if (prev === 'current') return 'labelName';
      if (isModifierWord(word)) return 'modifier';
      return 'variableName.special';
    case 'require':
      if (!state.measureSeen) {
        if (index > 1 && isMeasureWord(word)) {
          state.measureSeen = true;
          return 'propertyName';
        }
        if (prev === 'current') return 'labelName';
        if (word === 'impedance' || word === 'current' || word === 'loop') return 'modifier';
        return 'variableName.special';
      }
      return word === 'over' || word === 'at' ? 'modifier' : 'variableName';
    case 'sweep':
    case 'time':
    case 'tolerance':
      return isModifierWord(word) ? 'modifier' : 'variableName';
    case 'block':
      return index === 1 ? 'typeName' : 'variableName';
    case 'use':
      if (index === 1) return 'typeName';
      if (word === 'as') return 'modifier';
      return prev === 'as' ? 'labelName' : 'variableName';
    default:
      return 'variableName';
  }
}

/** Reads one token of a cell line. */
function readToken(stream: StringStream, state: CellLineState): CellTokenStyle | null {
  if (stream.sol()) Object.assign(state, freshState());
  if (state.pendingSuffix !== null) {
    const style = state.pendingSuffix;
    stream.pos += state.pendingLength;
    state.pendingSuffix = null;
    state.pendingLength = 0;
    return style;
  }
  if (stream.eatSpace()) return null;
  const ch = stream.peek() ?? '';
  if (ch === '#') {
    stream.skipToEnd();
    return 'comment';
  }
  if (ch === '"' || ch === '“' || ch === '”') {
    stream.next();
    while (!stream.eol()) {
      const c = stream.next();
      if (c === '"' || c === '”' || c === '“') break;
    }
    state.prevWasNumber = false;
    state.words += 1;
    return 'string';
  }
  if (ch === '[' || ch === ']') {
    stream.next();
    state.inBracket = ch === '[';
    state.prevWasNumber = false;
    return 'squareBracket';
  }
  if (ch === '(' || ch === ')') {
    stream.next();
    state.parens = Math.max(0, state.parens + (ch === '(' ? 1 : -1));
    if (ch === '(') state.afterEquals = false;
    state.prevWasNumber = false;
    return 'paren';
  }
  if (ch === ',') {
    stream.next();
    state.afterEquals = false;
    state.prevWasNumber = false;
    return 'punctuation';
  }
  if (state.inBracket && stream.match(DIGITS_NODE)) {
    state.words += 1;
    return 'variableName.special';
  }
  if (/\d/.test(ch) || (ch === '.' && /\d/.test(stream.string.charAt(stream.pos + 1)))) return readNumber(stream, state);
  if (NAME_START.test(ch)) {
    const match = stream.match(NAME);
    let word = Array.isArray(match) ? match[0] : stream.next() ?? '';
    if ((word === 'phase' || word === 'gain') && stream.match(/^-margin(?![A-Za-z0-9_])/)) word += '-margin';
    return classifyWord(word, state);
  }
  for (const op of OPERATORS) {
    if (stream.match(op)) {
      if (op === '=') state.afterEquals = true;
      // A tolerance (±1%) and a range keep reading numbers, so the unit rule still applies.
      state.prevWasNumber = false;
      return 'operator';
    }
  }
  if (ch === '°' || ch === 'Ω' || ch === '%') {
    stream.next();
    if (ch === '°') stream.eat('C');
    state.prevWasNumber = false;
    return 'unit';
  }
  stream.next();
  return 'invalid';
}

const cellParser: StreamParser<CellLineState> = {
  name: 'rolloff-cell',
  startState: freshState,
  token: readToken,
  blankLine: (state) => {
    Object.assign(state, freshState());
  },
  languageData: { commentTokens: { line: '#' } },
};

/** The cell language as a CodeMirror language. */
export const cellLanguage = StreamLanguage.define(cellParser);

/** One token of a cell's text with its style; columns are 0-based offsets within the line. */
export interface CellToken {
  line: number;
  from: number;
  to: number;
  text: string;
  style: CellTokenStyle;
}

/** Tokenizes one line with the same rules the editor colours by; returns the end state too. */
export function tokenizeCellLine(text: string, line = 1): { tokens: CellToken[]; state: CellLineState } {
  const state = freshState();
  const tokens: CellToken[] = [];
  const stream = new StringStream(text, 4, 2);
  while (!stream.eol()) {
    stream.start = stream.pos;
    const style = readToken(stream, state);
    if (stream.pos === stream.start) stream.pos += 1;
    if (style !== null) tokens.push({ line, from: stream.start, to: stream.pos, text: text.slice(stream.start, stream.pos), style });
  }
  return { tokens, state };
}

/** Tokenizes a whole cell, line by line. */
export function tokenizeCell(text: string): CellToken[] {
  return text.split(/\r\n|\r|\n/).flatMap((line, i) => tokenizeCellLine(line, i + 1).tokens);
}

/** Colours for the cell language, from the palette's syntax variables (light and dark). */
export const cellHighlightStyle = HighlightStyle.define([
  { tag: tags.comment, color: 'var(--syn-comment)', fontStyle: 'italic' },
  { tag: tags.string, color: 'var(--syn-string)' },
  { tag: tags.keyword, color: 'var(--syn-keyword)', fontWeight: '500' },
  { tag: tags.typeName, color: 'var(--syn-kind)' },
  { tag: tags.labelName, color: 'var(--syn-designator)', fontWeight: '500' },
  { tag: tags.special(tags.variableName), color: 'var(--syn-node)' },
  { tag: tags.definition(tags.variableName), color: 'var(--syn-param)', fontWeight: '500' },
  { tag: tags.variableName, color: 'var(--syn-param)' },
  { tag: tags.standard(tags.variableName), color: 'var(--syn-kind)' },
  { tag: tags.modifier, color: 'var(--syn-keyword)' },
  { tag: tags.propertyName, color: 'var(--syn-measure)' },
  { tag: tags.number, color: 'var(--syn-number)' },
  { tag: tags.unit, color: 'var(--syn-unit)' },
  { tag: [tags.operator, tags.punctuation, tags.squareBracket, tags.paren], color: 'var(--ink-soft)' },
  { tag: tags.invalid, color: 'var(--fail)', textDecoration: 'underline wavy' },
]);

/** The language and its colours, ready for an editor. */
export const cellLanguageSupport = () => [cellLanguage, syntaxHighlighting(cellHighlightStyle)];
