/**
 * The cell language's lexer. A cell is read line by line (one statement per line), so the
 * lexer hands back each line's tokens; `#` comments are dropped. Columns are 1-based and
 * count UTF-16 code units, as editors do; `endColumn` is exclusive.
 */
import type { SourceRange } from './circuit.js';
import type { Diagnostic } from './result.js';
import { readSuffix } from './units.js';
import { diagnostic } from './diagnostic.js';
import { LINE_STARTS, MEASURE_WORDS, PREFIX_LIST, SI_PREFIXES, UNIT_LIST, UNIT_SPELLINGS } from './vocabulary.js';
import type { SuffixProblem } from './units.js';
import type { Unit } from './vocabulary.js';

export type TokenKind = 'name' | 'number' | 'string' | 'punct' | 'unit' | 'error';

/** Punctuation, in canonical spelling (`≥` is read as `>=`, `+/-` as `±`, `…` as `..`). */
export type Punct = '[' | ']' | '(' | ')' | ',' | '=' | '==' | '>=' | '<=' | '>' | '<' | '±' | '..' | '+' | '-' | '*' | '/' | '^';

export interface Token {
  kind: TokenKind;
  /** The text as written. For strings, the contents without the quotes. */
  text: string;
  range: SourceRange;
  /** Whitespace (or the line start) comes right before this token. */
  spaced: boolean;
  /** `punct`: the canonical punctuation. */
  punct?: Punct;
  /** `number`: the value with its SI prefix applied. */
  value?: number;
  /** `number` and `unit`: the unit written on the number (or standing alone). */
  unit?: Unit | null;
  /** `number`: where the unit (or the bad suffix) sits. */
  unitRange?: SourceRange;
  /** `number`: the suffix could not be read; a diagnostic has been made. */
  bad?: boolean;
  /** `number`: an SI prefix (or an IEC letter) was written on it. */
  prefixed?: boolean;
}

export interface Line {
  /** 1-based. */
  line: number;
  /** The whole line as written, without its line break. */
  text: string;
  tokens: Token[];
}

export interface LexResult {
  lines: Line[];
  diagnostics: Diagnostic[];
}

/** Measures whose name holds a hyphen, read as one word. */
const HYPHENATED = MEASURE_WORDS.filter((m) => m.includes('-'));

function isDigit(c: string | undefined): boolean {
  return c !== undefined && c >= '0' && c <= '9';
}

function isNameStart(c: string | undefined): boolean {
  return c !== undefined && ((c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c === '_');
}

function isNameChar(c: string | undefined): boolean {
  return isNameStart(c) || isDigit(c);
}

/** Letters that may follow a number's digits as its prefix and unit. */
function isSuffixChar(c: string | undefined): boolean {
  return isNameStart(c) || c === 'µ' || c === 'μ' || c === 'Ω' || c === '°' || c === '%';
}

/** Splits text into lines and each line into tokens. Never throws. */
export function lex(text: string): LexResult {
  const diagnostics: Diagnostic[] = [];
  const rawLines = text.split(/\r\n|\r|\n/);
  const lines = rawLines.map((raw, i) => lexLine(raw, i + 1, diagnostics));
  return { lines, diagnostics };
}

function lexLine(text: string, line: number, diagnostics: Diagnostic[]): Line {
  const tokens: Token[] = [];
  let i = 0;
  const n = text.length;
  const at = (start: number, end: number): SourceRange => ({ line, column: start + 1, endColumn: end + 1 });
  const report = (
    start: number,
    end: number,
    code: string,
    message: string,
    hint?: string,
    fix?: { title: string; replacement: string; start?: number; end?: number },
  ) => {
    const quickFix = fix === undefined ? undefined : { title: fix.title, replacement: fix.replacement, range: at(fix.start ?? start, fix.end ?? end) };
    diagnostics.push(diagnostic(at(start, end), code, message, { hint, fix: quickFix }));
  };

  while (i < n) {
    const c = text[i];
    const spaced = i === 0 || text[i - 1] === ' ' || text[i - 1] === '\t';
    if (c === ' ' || c === '\t' || c === '\f' || c === '\v' || c === '\u00a0') {
      i++;
      continue;
    }
    if (c === '#') break;
    const start = i;
    const push = (t: Omit<Token, 'spaced' | 'range'>, end: number) => {
      tokens.push({ ...t, spaced, range: at(start, end) });
      i = end;
    };
    const punct = (p: Punct, length: number) => push({ kind: 'punct', text: text.slice(start, start + length), punct: p }, start + length);

    // Numbers (a `.` starts one only before a digit and not as part of `..`).
    if (isDigit(c) || (c === '.' && isDigit(text[i + 1]) && text[i - 1] !== '.')) {
      i = lexNumber(text, start, line, tokens, spaced, report);
      continue;
    }
    if (isNameStart(c) || c === 'µ' || c === 'μ') {
      let j = i + 1;
      while (j < n && (isNameChar(text[j]) || (text[j] === '.' && isNameChar(text[j + 1])))) j++;
      // A prefixed unit standing apart from its number: `kΩ`, `MΩ`, `µF`.
      if (text[j] === 'Ω' && j === i + 1 && SI_PREFIXES[c] !== undefined) j++;
      let word = text.slice(i, j);
      // A measure written with a hyphen (`phase-margin`) is one word.
      const joined =
        text[j] !== '-'
          ? undefined
          : HYPHENATED.find((m) => m.startsWith(`${word}-`) && text.startsWith(m.slice(word.length), j) && !isNameChar(text[i + m.length]));
      if (joined !== undefined) {
        j = i + joined.length;
        word = joined;
      }
      push({ kind: 'name', text: word }, j);
      continue;
    }
    if (c === '"' || c === '“' || c === '”') {
      let j = i + 1;
      while (j < n && text[j] !== '"' && text[j] !== '”' && text[j] !== '“') j++;
      if (j >= n) {
        report(start, n, 'unterminated-string', 'this label has no closing quote', 'a label is written in double quotes, like "output"', {
          title: 'Add the closing quote',
          replacement: '"',
          start: n,
          end: n,
        });
        push({ kind: 'string', text: text.slice(i + 1, n) }, n);
      } else {
        push({ kind: 'string', text: text.slice(i + 1, j) }, j + 1);
      }
      continue;
    }
    const two = text.slice(i, i + 2);
    const three = text.slice(i, i + 3);
    if (three === '+/-') {
      punct('±', 3);
      continue;
    }
    switch (two) {
      case '..':
        punct('..', text[i + 2] === '.' ? 3 : 2);
        continue;
      case '>=':
      case '=>':
        if (two === '=>') {
          report(start, start + 2, 'bad-operator', '`=>` is not an operator here', 'write >= for "at least"', { title: 'Replace with >=', replacement: '>=' });
        }
        punct('>=', 2);
        continue;
      case '<=':
      case '=<':
        if (two === '=<') {
          report(start, start + 2, 'bad-operator', '`=<` is not an operator here', 'write <= for "at most"', { title: 'Replace with <=', replacement: '<=' });
        }
        punct('<=', 2);
        continue;
      case '==':
        punct('==', 2);
        continue;
      case '+-':
        punct('±', 2);
        continue;
    }
    const single: Record<string, Punct> = {
      '[': '[',
      ']': ']',
      '(': '(',
      ')': ')',
      ',': ',',
      '=': '=',
      '>': '>',
      '<': '<',
      '≥': '>=',
      '≤': '<=',
      '±': '±',
      '…': '..',
      '+': '+',
      '-': '-',
      '−': '-',
      '*': '*',
      '/': '/',
      '^': '^',
    };
    const p = single[c];
    if (p !== undefined) {
      punct(p, 1);
      continue;
    }
    // A unit standing on its own after a number: `25 °C`, `45 °`, `10 Ω`, `5 %`.
    if (c === '°' || c === 'Ω' || c === '%') {
      const end = c === '°' && text[i + 1] === 'C' && !isNameChar(text[i + 2]) ? i + 2 : i + 1;
      const spelling = text.slice(i, end);
      push({ kind: 'unit', text: spelling, unit: UNIT_SPELLINGS[spelling] ?? null }, end);
      continue;
    }
    // Anything else: one bad character (a whole surrogate pair counts as one).
    const code = text.codePointAt(i) ?? 0;
    const width = code > 0xffff ? 2 : 1;
    const ch = text.slice(i, i + width);
    const hint = badCharacterHint(ch, text, i);
    if (ch === '.' && tokens.length === 0) {
      report(start, wordEnd(text, i + 1), 'dot-command', 'a line cannot start with a dot', LINE_STARTS);
      i = n;
      continue;
    }
    const shown = ch === '`' ? 'the backtick' : `the character \`${ch}\``;
    report(start, start + width, 'bad-character', `${shown} has no meaning here`, hint);
    push({ kind: 'error', text: ch }, start + width);
  }
  return { line, text, tokens };
}

function wordEnd(text: string, from: number): number {
  let j = from;
  while (j < text.length && isNameChar(text[j])) j++;
  return Math.max(j, from);
}

function badCharacterHint(ch: string, text: string, i: number): string | undefined {
  switch (ch) {
    case ';':
      return 'one statement per line: start a new line instead of using ;';
    case '×':
    case '·':
      return 'write * for multiplication';
    case '√':
      return 'write sqrt(x) for a square root; noise densities are written in V or A, per √Hz implied';
    case "'":
      return 'a label is written in double quotes, like "output"';
    case '{':
    case '}':
      return 'an expression is written in round parentheses, like (2*Cb)';
    case '.':
      return text[i + 1] === undefined || text[i + 1] === ' ' ? 'a range is written with two dots, like 10 .. 100k' : undefined;
    default:
      return undefined;
  }
}

export type Report = (
  start: number,
  end: number,
  code: string,
  message: string,
  hint?: string,
  fix?: { title: string; replacement: string; start?: number; end?: number },
) => void;

/** Lexes one number starting at `start` and pushes it; returns the index after it. */
function lexNumber(text: string, start: number, line: number, tokens: Token[], spaced: boolean, report: Report): number {
  let j = start;
  while (isDigit(text[j])) j++;
  const intEnd = j;
  let plain = true;
  if (text[j] === '.' && text[j + 1] !== '.') {
    plain = false;
    j++;
    while (isDigit(text[j])) j++;
  }
  if ((text[j] === 'e' || text[j] === 'E') && (isDigit(text[j + 1]) || ((text[j + 1] === '-' || text[j + 1] === '+') && isDigit(text[j + 2])))) {
    plain = false;
    j += text[j + 1] === '-' || text[j + 1] === '+' ? 2 : 1;
    while (isDigit(text[j])) j++;
  }
  let value = Number(text.slice(start, j));
  // IEC 60062: the prefix letter (or R) stands for the decimal point, as in 4k7 or 4R7.
  const letter = text[j];
  if (plain && j === intEnd && letter !== undefined && (SI_PREFIXES[letter] !== undefined || letter === 'R') && isDigit(text[j + 1])) {
    let k = j + 1;
    while (isDigit(text[k])) k++;
    const scale = letter === 'R' ? 1 : SI_PREFIXES[letter];
    value = Number(`${text.slice(start, j)}.${text.slice(j + 1, k)}`) * scale;
    j = k;
    return finishNumber(text, start, j, value, line, tokens, spaced, report, true);
  }
  return finishNumber(text, start, j, value, line, tokens, spaced, report, false);
}

function finishNumber(
  text: string,
  start: number,
  digitsEnd: number,
  value: number,
  line: number,
  tokens: Token[],
  spaced: boolean,
  report: Report,
  iec: boolean,
): number {
  let k = digitsEnd;
  while (k < text.length && isSuffixChar(text[k])) k++;
  // Letters and digits mixed after a number (`2x3`, `10k5k`) are read as one bad suffix.
  while (k < text.length && (isSuffixChar(text[k]) || isDigit(text[k]))) k++;
  const suffix = text.slice(digitsEnd, k);
  const range: SourceRange = { line, column: start + 1, endColumn: k + 1 };
  const unitRange: SourceRange = { line, column: digitsEnd + 1, endColumn: k + 1 };
  const token: Token = { kind: 'number', text: text.slice(start, k), range, spaced, value, unit: null };
  if (suffix !== '') token.unitRange = unitRange;
  if (suffix === 'R' && !iec) {
    // `10R` is IEC 60062 for 10 Ω.
    token.prefixed = true;
    tokens.push(token);
    return k;
  }
  const reading = iec ? readIecSuffix(suffix) : readSuffix(suffix);
  if (iec) token.prefixed = true;
  if (reading.kind === 'ok') {
    token.value = value * reading.multiplier;
    token.unit = reading.unit;
    if (reading.prefix !== null) token.prefixed = true;
  } else {
    token.bad = true;
    describeSuffixProblem(reading.reason, text.slice(start, digitsEnd), digitsEnd, k, report);
  }
  tokens.push(token);
  return k;
}

/** After an IEC form (4k7) only a unit may follow, never a second prefix. */
function readIecSuffix(suffix: string): ReturnType<typeof readSuffix> {
  if (suffix === '') return { kind: 'ok', multiplier: 1, unit: null, prefix: null };
  const unit = UNIT_SPELLINGS[suffix];
  if (unit !== undefined) return { kind: 'ok', multiplier: 1, unit, prefix: null };
  const reading = readSuffix(suffix);
  if (reading.kind === 'bad') return reading;
  return { kind: 'bad', reason: { kind: 'unknown', spelling: suffix } };
}

/** Says what is wrong with the letters after a number (`10meg`, `1khz`, `-3 db`). */
export function describeSuffixProblem(reason: SuffixProblem, digits: string, from: number, to: number, report: Report): void {
  switch (reason.kind) {
    case 'mega':
      report(from, to, 'mega-spelling', `\`${reason.spelling}\` is not an SI prefix`, 'use M for mega (m is milli)', {
        title: `Replace with ${digits}${reason.replacement}`,
        replacement: reason.replacement,
      });
      return;
    case 'capital-prefix': {
      const names: Record<string, string> = { K: 'k for kilo', U: 'u or µ for micro', N: 'n for nano', P: 'p for pico' };
      report(from, to, 'prefix-case', `\`${reason.letter}\` is not an SI prefix`, `use ${names[reason.letter] ?? 'a lower-case prefix'}`, {
        title: `Replace with ${digits}${reason.replacement}`,
        replacement: reason.replacement,
      });
      return;
    }
    case 'unit-case':
      if (reason.replacement === null) {
        report(from, to, 'unit-case', `\`${reason.spelling}\` is not a unit`, reason.hint);
      } else {
        report(from, to, 'unit-case', `\`${reason.spelling}\` is not a unit`, `write ${reason.replacement}`, {
          title: `Replace with ${digits}${reason.replacement}`,
          replacement: reason.replacement,
        });
      }
      return;
    case 'prefixed-unit':
      report(from, to, 'prefixed-unit', `${reason.unit} does not take an SI prefix`, `write the number in ${reason.unit} without ${reason.prefix}`);
      return;
    case 'unknown':
      report(from, to, 'unknown-unit', `\`${reason.spelling}\` after ${digits} is not an SI prefix or a unit`, `prefixes: ${PREFIX_LIST}; units: ${UNIT_LIST}`);
      return;
  }
}

/**
 * A word that can stand after a number as its unit, with an optional SI prefix: `Hz`,
 * `kHz`, `nF`, `kΩ`, `dB`. Returns the multiplier and the unit, or null.
 */
export function separateUnit(t: Token | undefined): { multiplier: number; unit: Unit; prefixed: boolean } | null {
  if (t === undefined) return null;
  if (t.kind === 'unit') return t.unit ? { multiplier: 1, unit: t.unit, prefixed: false } : null;
  if (t.kind !== 'name') return null;
  const reading = readSuffix(t.text);
  if (reading.kind !== 'ok' || reading.unit === null) return null;
  return { multiplier: reading.multiplier, unit: reading.unit, prefixed: reading.prefix !== null };
}
