/**
 * The cell language for CodeMirror: each line is read by the solver's own lexer, and each
 * token is told apart (keywords, designators, node names, parameters, numbers with their SI
 * prefix, units, comments, strings) by the statement it stands in; the highlight style
 * colours them from our palette.
 */
import { HighlightStyle, StreamLanguage, syntaxHighlighting } from '@codemirror/language';
import type { StreamParser, StringStream } from '@codemirror/language';
import { tags } from '@lezer/highlight';
import { PART_LETTERS, UNIT_SPELLINGS, lex, separateUnit } from '@rolloff/solver';
import type { StatementWord, Token } from '@rolloff/solver';
import { isBuiltinWord, isMeasureWord, isModifierWord, isPartKindWord, isPartOptionWord, isStatementWord } from './cell-words';

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

type Head = StatementWord | 'part' | 'other';

/** Where a line stands after its tokens: what completion needs to know. */
export interface CellLineState {
  head: Head | null;
  inBracket: boolean;
  measureSeen: boolean;
}

/** One token of a cell's text with its style; columns are 0-based offsets within the line. */
export interface CellToken {
  line: number;
  from: number;
  to: number;
  text: string;
  style: CellTokenStyle;
}

/** The classifier's walk along one line. */
interface Walk extends CellLineState {
  words: number;
  parens: number;
  /** Inside the parentheses of block/use, a name after `=` is a value. */
  afterEquals: boolean;
  prevWord: string | null;
  previous: Token | null;
  numbersSeen: number;
}

/** Decides what a word is from the statement it stands in and its place there. */
function classifyWord(token: Token, walk: Walk): CellTokenStyle {
  const word = token.text;
  const index = walk.words;
  const prev = walk.prevWord;
  const afterNumber = walk.previous?.kind === 'number';
  walk.words += 1;
  walk.prevWord = word;
  if (walk.inBracket) return 'variableName.special';
  if (index === 0) {
    if (isStatementWord(word)) {
      walk.head = word;
      return 'keyword';
    }
    walk.head = (PART_LETTERS as readonly string[]).includes(word[0]) ? 'part' : 'other';
    return walk.head === 'part' ? 'labelName' : 'variableName';
  }
  if (afterNumber && separateUnit(token) !== null) return 'unit';
  if (walk.parens > 0 && (walk.head === 'block' || walk.head === 'use') && !walk.afterEquals) {
    return walk.head === 'block' ? 'variableName.definition' : 'propertyName';
  }
  if (isBuiltinWord(word) && walk.head !== 'drive' && walk.head !== 'show') return 'variableName.standard';
  switch (walk.head) {
    case 'let':
      return index === 1 ? 'variableName.definition' : 'variableName';
    case 'part':
      if (prev === 'of') return 'labelName';
      if (isPartKindWord(word)) return 'typeName';
      if (isPartOptionWord(word) || (prev === 'noise' && isModifierWord(word))) return 'modifier';
      return 'variableName';
    case 'couple':
      return index <= 2 ? 'labelName' : 'variableName';
    case 'drive':
      if (word === 'current' || word === 'phase') return 'modifier';
      return walk.numbersSeen === 0 && prev !== 'phase' ? 'variableName.special' : 'variableName';
    case 'show':
      if (prev === 'current') return 'labelName';
      if (isModifierWord(word)) return 'modifier';
      return 'variableName.special';
    case 'require':
      if (!walk.measureSeen) {
        if (index > 1 && isMeasureWord(word)) {
          walk.measureSeen = true;
          return 'propertyName';
        }
        if (prev === 'current') return 'labelName';
        if (word === 'impedance' || word === 'current' || word === 'loop') return 'modifier';
        return 'variableName.special';
      }
      return word === 'over' || word === 'at' ? 'modifier' : 'variableName';
    case 'sweep':
    case 'time':
    case 'spread':
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

/**
 * A number token in up to two pieces: the digits with their SI prefix (or IEC letter), then
 * the unit written on it, or the suffix the solver could not read.
 */
function numberPieces(token: Token, line: string): [number, number, CellTokenStyle][] {
  const from = token.range.column - 1;
  const to = token.range.endColumn - 1;
  if (token.unitRange === undefined) return [[from, to, 'number']];
  const suffixFrom = token.unitRange.column - 1;
  if (token.bad === true)
    return [
      [from, suffixFrom, 'number'],
      [suffixFrom, to, 'invalid'],
    ];
  if (token.unit === null || token.unit === undefined) return [[from, to, 'number']];
  // The unit is the suffix's end; a letter before it is the SI prefix.
  const unitFrom = UNIT_SPELLINGS[line.slice(suffixFrom, to)] !== undefined ? suffixFrom : suffixFrom + 1;
  return unitFrom === from
    ? [[from, to, 'unit']]
    : [
        [from, unitFrom, 'number'],
        [unitFrom, to, 'unit'],
      ];
}

function punctStyle(token: Token, walk: Walk): CellTokenStyle {
  switch (token.punct) {
    case '[':
    case ']':
      walk.inBracket = token.punct === '[';
      return 'squareBracket';
    case '(':
    case ')':
      walk.parens = Math.max(0, walk.parens + (token.punct === '(' ? 1 : -1));
      if (token.punct === '(') walk.afterEquals = false;
      return 'paren';
    case ',':
      walk.afterEquals = false;
      return 'punctuation';
    default:
      if (token.punct === '=') walk.afterEquals = true;
      return 'operator';
  }
}

/** Tokenizes one line with the solver's lexer and styles each token; returns where the line stands too. */
export function tokenizeCellLine(text: string, line = 1): { tokens: CellToken[]; state: CellLineState } {
  const walk: Walk = {
    head: null,
    inBracket: false,
    measureSeen: false,
    words: 0,
    parens: 0,
    afterEquals: false,
    prevWord: null,
    previous: null,
    numbersSeen: 0,
  };
  const tokens: CellToken[] = [];
  const add = (from: number, to: number, style: CellTokenStyle) => {
    if (to > from) tokens.push({ line, from, to, text: text.slice(from, to), style });
  };
  const lexed = lex(text).lines[0]?.tokens ?? [];
  for (const token of lexed) {
    const from = token.range.column - 1;
    const to = token.range.endColumn - 1;
    switch (token.kind) {
      case 'name':
        add(from, to, classifyWord(token, walk));
        break;
      case 'number':
        for (const [a, b, style] of numberPieces(token, text)) add(a, b, style);
        walk.numbersSeen += 1;
        break;
      case 'string':
        walk.words += 1;
        add(from, to, 'string');
        break;
      case 'unit':
        add(from, to, 'unit');
        break;
      case 'punct':
        add(from, to, punctStyle(token, walk));
        break;
      case 'error':
        add(from, to, 'invalid');
        break;
    }
    walk.previous = token;
  }
  // The lexer stops at a comment (and gives up on a line that starts with a dot).
  const end = lexed.length === 0 ? 0 : lexed[lexed.length - 1].range.endColumn - 1;
  const hash = text.indexOf('#', end);
  const unread = text.slice(end, hash >= 0 ? hash : text.length);
  const skipped = unread.length - unread.trimStart().length;
  add(end + skipped, end + unread.trimEnd().length, 'invalid');
  if (hash >= 0) add(hash, text.length, 'comment');
  const { head, inBracket, measureSeen } = walk;
  return { tokens, state: { head, inBracket, measureSeen } };
}

/** Tokenizes a whole cell, line by line. */
export function tokenizeCell(text: string): CellToken[] {
  return text.split(/\r\n|\r|\n/).flatMap((line, i) => tokenizeCellLine(line, i + 1).tokens);
}

/** The stream parser's state: the current line's styled tokens, read once at its start. */
interface StreamState {
  tokens: CellToken[];
  next: number;
}

function readToken(stream: StringStream, state: StreamState): string | null {
  if (stream.sol()) {
    state.tokens = tokenizeCellLine(stream.string).tokens;
    state.next = 0;
  }
  while (state.next < state.tokens.length && state.tokens[state.next].to <= stream.pos) state.next++;
  const token = state.tokens[state.next];
  if (token === undefined) {
    stream.skipToEnd();
    return null;
  }
  if (stream.pos < token.from) {
    stream.pos = token.from;
    return null;
  }
  stream.pos = token.to;
  state.next++;
  return token.style;
}

const cellParser: StreamParser<StreamState> = {
  name: 'rolloff-cell',
  startState: () => ({ tokens: [], next: 0 }),
  token: readToken,
  languageData: { commentTokens: { line: '#' } },
};

/** The cell language as a CodeMirror language. */
export const cellLanguage = StreamLanguage.define(cellParser);

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
