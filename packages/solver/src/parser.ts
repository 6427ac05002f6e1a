/**
 * The cell language's parser: a cursor over one line's tokens (`next`, `eat`, `expect`,
 * `error`) and one function per statement. It never throws: every problem becomes a
 * diagnostic, and a statement that fails part-way is skipped (or kept with what was read).
 */
import type { SourceRange } from './circuit.js';
import type { Diagnostic } from './result.js';
import { describeSuffixProblem, lex, separateUnit } from './lexer.js';
import { readSuffix } from './units.js';
import {
  CONTROLLED_MODE_WORDS,
  DEFAULT_TEMPERATURE,
  INSTANCE_LETTER,
  LINE_STARTS,
  MEASURE_WORDS,
  NOISE_OFF,
  OPAMP_OPTIONS,
  OPAMP_OPTION_WORDS,
  OPAMP_WORD,
  PART_CLASSES,
  PART_LETTERS,
  PASSIVES,
  PASSIVE_OPTIONS,
  RETIRED,
  SI_PREFIXES,
  STATEMENT_WORDS,
  TOP_LEVEL_ONLY,
  isDesignator,
  isDigitsOnly,
} from './vocabulary.js';
import type { ControlledMode, OpAmpOptionName, PartClassLetter } from './vocabulary.js';
import type { Line, Punct, Token } from './lexer.js';
import type {
  BlockParam,
  BlockStatement,
  ControlledStatement,
  CoupleStatement,
  DriveStatement,
  Ident,
  LetStatement,
  MeasureName,
  NodeList,
  OpAmpStatement,
  PartOption,
  PassiveKind,
  PassiveStatement,
  Program,
  RequireStatement,
  RequireTarget,
  ShowMode,
  ShowStatement,
  SpreadStatement,
  Statement,
  SweepStatement,
  TemperatureStatement,
  TimeStatement,
  TraceExpr,
  UseStatement,
  Value,
} from './ast.js';
import { didYouMean, suggest, suggestionHint } from './suggest.js';
import { diagnostic, tidyDiagnostics } from './diagnostic.js';
import type { FixSpec } from './diagnostic.js';
import { planRenames } from './modernize.js';
import type { RenamePlan } from './modernize.js';

const STATEMENT_LIST = STATEMENT_WORDS.filter((w) => w !== 'end').join(', ');
/** `a, b or c` (or `a, b and c`). */
function orList(words: readonly string[], last: 'or' | 'and' = 'or'): string {
  return words.length <= 1 ? words.join('') : `${words.slice(0, -1).join(', ')} ${last} ${words[words.length - 1]}`;
}
const PART_LIST = orList(PART_LETTERS.map((l) => `${l} (${PART_CLASSES[l].kind})`));
const MEASURE_LIST = MEASURE_WORDS.join(', ');
const TEMPERATURE_HINT = `write temperature 25°C or temperature 290 K; without this line it is ${DEFAULT_TEMPERATURE} K`;
const SPREAD_HINT = 'write spread 200 draws, spread 200 draws seed 7, or spread extremes';

/** Stops a statement's parse after its diagnostic has been made; never leaves this module. */
class StatementError extends Error {}

function merge(a: SourceRange, b: SourceRange): SourceRange {
  return { line: a.line, column: Math.min(a.column, b.column), endColumn: Math.max(a.endColumn, b.endColumn) };
}

function show(t: Token): string {
  return t.kind === 'string' ? `"${t.text}"` : t.text;
}

/** A cursor over one line's tokens. */
class Cursor {
  pos = 0;
  constructor(
    readonly line: Line,
    readonly diagnostics: Diagnostic[],
    /** The cell's new names, for the quick fixes of its earlier forms (worked out on first need). */
    readonly plan: () => RenamePlan,
    /** '' at the top level, else the name of the block this line stands in. */
    readonly scope: string,
  ) {}

  get tokens(): Token[] {
    return this.line.tokens;
  }

  peek(offset = 0): Token | undefined {
    return this.tokens[this.pos + offset];
  }

  atEnd(): boolean {
    return this.pos >= this.tokens.length;
  }

  next(): Token | undefined {
    const t = this.tokens[this.pos];
    if (t !== undefined) this.pos++;
    return t;
  }

  isPunct(p: Punct, offset = 0): boolean {
    const t = this.peek(offset);
    return t !== undefined && t.kind === 'punct' && t.punct === p;
  }

  isWord(word: string, offset = 0): boolean {
    const t = this.peek(offset);
    return t !== undefined && t.kind === 'name' && t.text === word;
  }

  /** Takes the next token when it is the punctuation or word given. */
  eat(what: Punct | string): Token | undefined {
    const t = this.peek();
    if (t === undefined) return undefined;
    if ((t.kind === 'punct' && t.punct === what) || (t.kind === 'name' && t.text === what)) return this.next();
    return undefined;
  }

  /** Takes the punctuation or word given, or stops the statement with a diagnostic. */
  expect(what: Punct | string, code: string, message: string, hint?: string): Token {
    const t = this.eat(what);
    if (t !== undefined) return t;
    return this.error(this.here(), code, message, hint);
  }

  /** The range of the next token, or of the last one when the line has run out. */
  here(): SourceRange {
    const t = this.peek() ?? this.tokens[this.tokens.length - 1];
    return t.range;
  }

  /** The range from the statement's first token to its last. */
  whole(): SourceRange {
    return merge(this.tokens[0].range, this.tokens[this.tokens.length - 1].range);
  }

  report(range: SourceRange, code: string, message: string, hint?: string, fix?: FixSpec): void {
    this.diagnostics.push(diagnostic(range, code, message, { hint, fix }));
  }

  /** Reports an error and stops the statement. */
  error(range: SourceRange, code: string, message: string, hint?: string, fix?: FixSpec): never {
    this.report(range, code, message, hint, fix);
    throw new StatementError(message);
  }

  /** Complains about whatever is left on the line. */
  finish(what: string, hint?: string): void {
    const t = this.peek();
    if (t === undefined) return;
    const last = this.tokens[this.tokens.length - 1];
    this.report(merge(t.range, last.range), 'unexpected-token', `unexpected \`${show(t)}\` after ${what}`, hint);
  }
}

/**
 * Reads a cell. Never throws: problems come back as diagnostics, and the program holds
 * every statement that could be read.
 */
export function parse(text: string): { program: Program; diagnostics: Diagnostic[] } {
  const diagnostics: Diagnostic[] = [];
  let lineCount = 1;
  const source = typeof text === 'string' ? text : String(text);
  try {
    const lexed = lex(source);
    lineCount = Math.max(1, lexed.lines.length);
    diagnostics.push(...lexed.diagnostics);
    const badLines = new Set(lexed.diagnostics.filter((d) => d.code === 'dot-command').map((d) => d.line));
    const lines = lexed.lines.filter((l) => l.tokens.length > 0 && !badLines.has(l.line));
    let plan: RenamePlan | undefined;
    const reader = new LineReader(lines, diagnostics, () => (plan ??= planRenames(lines)));
    const statements = reader.statements(null);
    // After a lexical error on a line, what the parser says further along it is an echo.
    const firstLexError = new Map<number, number>();
    for (const d of lexed.diagnostics) {
      const before = firstLexError.get(d.line);
      if (d.severity === 'error' && (before === undefined || d.column < before)) firstLexError.set(d.line, d.column);
    }
    const echoes = (d: Diagnostic) => d.column >= (firstLexError.get(d.line) ?? Infinity);
    const kept = diagnostics.filter((d, i) => i < lexed.diagnostics.length || !echoes(d));
    const incomplete = kept.some((d) => d.severity === 'error');
    const brokenLines = new Set(kept.filter((d) => d.severity === 'error').map((d) => d.line));
    const brokenWords = new Set<string>();
    for (const line of lexed.lines) {
      if (!brokenLines.has(line.line)) continue;
      for (const t of line.tokens) if (t.kind === 'name' || (t.kind === 'number' && /^\d+$/.test(t.text))) brokenWords.add(t.text);
    }
    return { program: { statements, incomplete, lineCount, brokenWords }, diagnostics: tidyDiagnostics(kept, source) };
  } catch (e) {
    diagnostics.push(internalError(e));
    return { program: { statements: [], incomplete: true, lineCount, brokenWords: new Set() }, diagnostics: tidyDiagnostics(diagnostics, source) };
  }
}

/** The diagnostic for a fault of our own, so that a caller still gets an answer, not a throw. */
export function internalError(e: unknown): Diagnostic {
  const why = e instanceof Error ? e.message : String(e);
  return {
    severity: 'error',
    line: 1,
    column: 1,
    endColumn: 1,
    code: 'internal-error',
    message: `the cell could not be read because of a fault in Rolloff (${why})`,
    hint: 'please report this cell to the Rolloff team',
  };
}

/** Walks the lines; a `block` takes the lines up to its `end`. */
class LineReader {
  private index = 0;
  /** The line where an unclosed block was taken to end. */
  private unclosedAt: number | null = null;
  constructor(
    private readonly lines: Line[],
    private readonly diagnostics: Diagnostic[],
    private readonly plan: () => RenamePlan,
  ) {}

  statements(block: BlockStatement | null): Statement[] {
    const out: Statement[] = [];
    while (this.index < this.lines.length) {
      const line = this.lines[this.index++];
      const cur = new Cursor(line, this.diagnostics, this.plan, block?.name.name ?? '');
      const first = line.tokens[0];
      if (first.kind === 'name' && first.text === 'end') {
        if (block !== null) {
          block.endRange = first.range;
          cur.next();
          cur.finish('`end`', 'a block ends with `end` alone on its line');
          return out;
        }
        cur.report(first.range, 'stray-end', '`end` without a block to close', 'a block starts with block NAME [pins]');
        continue;
      }
      if (first.kind === 'name' && first.text === 'block') {
        const header = this.safely(cur, () => blockHeader(cur));
        if (header === null) {
          // Still consume the body so its lines are not read as top-level statements.
          const dummy: BlockStatement = {
            kind: 'block',
            name: { name: '', range: first.range },
            pins: { nodes: [], range: first.range },
            params: [],
            body: [],
            range: first.range,
            endRange: null,
          };
          this.statements(dummy);
          continue;
        }
        if (block !== null) {
          cur.report(first.range, 'nested-block', 'a block cannot be defined inside another block', `end block ${block.name.name} first, then define ${header.name.name} on its own`);
        }
        this.unclosedAt = null;
        header.body = this.statements(header);
        if (header.endRange === null) {
          const where = this.unclosedAt === null ? '' : ` before line ${this.unclosedAt}`;
          cur.report(header.name.range, 'missing-end', `block ${header.name.name} has no \`end\``, `close the block with a line holding only end${where}`);
        }
        if (block === null) out.push(header);
        continue;
      }
      if (block !== null && first.kind === 'name' && (TOP_LEVEL_ONLY.has(first.text) || first.text === 'tolerance')) {
        if (!this.endAhead()) {
          // The block was never closed: end it here and read the rest as the top level.
          this.index--;
          this.unclosedAt = line.line;
          return out;
        }
        cur.report(first.range, 'not-in-block', `\`${first.text}\` belongs outside blocks`, 'a block holds parts, couple, use and let lines; put this line after the block’s end');
        continue;
      }
      const statement = this.safely(cur, () => statementOf(cur));
      if (statement !== null) out.push(statement);
    }
    return out;
  }

  /** Whether an `end` line is still to come. */
  private endAhead(): boolean {
    for (let i = this.index; i < this.lines.length; i++) {
      const t = this.lines[i].tokens[0];
      if (t.kind === 'name' && t.text === 'end') return true;
    }
    return false;
  }

  private safely<T>(cur: Cursor, read: () => T): T | null {
    try {
      return read();
    } catch (e) {
      if (e instanceof StatementError) return null;
      cur.report(cur.whole(), 'internal-error', `this line could not be read because of a fault in Rolloff (${e instanceof Error ? e.message : String(e)})`, 'please report this cell to the Rolloff team');
      return null;
    }
  }
}

function statementOf(cur: Cursor): Statement | null {
  const first = cur.peek() as Token;
  if (first.kind === 'name') {
    switch (first.text) {
      case 'let':
        return letStatement(cur);
      case 'use':
        return useStatement(cur);
      case 'couple':
        return coupleStatement(cur);
      case 'drive':
        return driveStatement(cur);
      case 'show':
        return showStatement(cur);
      case 'sweep':
        return sweepStatement(cur);
      case 'time':
        return timeStatement(cur);
      case 'temperature':
        return temperatureStatement(cur);
      case 'spread':
        return spreadStatement(cur);
      case 'tolerance':
        return retiredToleranceStatement(cur);
      case 'require':
        return requireStatement(cur);
    }
    const letter = partLetter(first.text);
    if (letter !== null && cur.isPunct('[', 1)) return partStatement(cur, letter);
    if (letter !== null && suggest(first.text, STATEMENT_WORDS).length === 0) {
      return cur.error(
        cur.peek(1)?.range ?? first.range,
        'missing-nodes',
        `${first.text} needs its nodes in brackets after the designator`,
        `write it like ${first.text} ${PART_CLASSES[letter].template}`,
      );
    }
  }
  return unknownStatement(cur, first);
}

/** The part class of a word's first letter, or null. */
function partLetter(word: string): PartClassLetter | null {
  return (PART_LETTERS as string[]).includes(word[0]) ? (word[0] as PartClassLetter) : null;
}

function unknownStatement(cur: Cursor, first: Token): never {
  if (first.kind !== 'name') {
    return cur.error(first.range, 'unknown-statement', `a line cannot start with \`${show(first)}\``, LINE_STARTS);
  }
  const word = first.text;
  const bracket = cur.isPunct('[', 1);
  const near = didYouMean(word, STATEMENT_WORDS);
  if (!bracket && near.question !== undefined) {
    return cur.error(first.range, 'unknown-statement', `\`${word}\` is not a statement`, suggestionHint(near, `the statements are ${STATEMENT_LIST}`), near.fix);
  }
  const upper = word[0].toUpperCase();
  if (bracket && word[0] !== upper && partLetter(upper) !== null) {
    const fixed = upper + word.slice(1);
    return cur.error(first.range, 'unknown-statement', `\`${word}\` is not a statement or a part`, `designators start with a capital letter: ${fixed}`, { title: `Replace with ${fixed}`, replacement: fixed });
  }
  if (bracket || /^[A-Z]/.test(word)) {
    const transistor = 'the language describes linear networks: model a transistor’s small signal with A (controlled source), R and C parts';
    const hints: Record<string, string> = {
      B: `a block instance is written use NAME as ${word} [nodes]`,
      V: 'the stimulus is written with drive, like drive in or drive [p n]',
      I: 'a current stimulus is written drive current [p n] 1m',
      E: 'a voltage-controlled voltage source is an A part: A1 [o+ o- c+ c-] vgain 10',
      G: 'a voltage-controlled current source is an A part: A1 [o+ o- c+ c-] gm 1m',
      F: 'a current-controlled current source is an A part: A1 [o+ o-] igain 10 of R1',
      H: 'a current-controlled voltage source is an A part: A1 [o+ o-] rm 1k of R1',
      K: 'coupling between inductors is written couple L1 L2 0.99',
      Q: transistor,
      M: transistor,
      J: transistor,
      D: 'the language describes linear networks: model a diode’s small signal with R and C parts',
      X: 'a sub-network is written as a block and placed with use NAME as B1 [nodes]',
    };
    const hint = word.includes('.') ? 'a name with a dot is a part inside a block instance; give this part a designator of its own, like R7' : (hints[upper] ?? 'an impedance is built from R, C and L parts; a sub-network is a block placed with use');
    return cur.error(first.range, 'unknown-part-kind', `\`${word}\` is not a kind of part: a designator starts with ${PART_LIST}`, hint);
  }
  return cur.error(first.range, 'unknown-statement', `\`${word}\` is not a statement`, `the statements are ${STATEMENT_LIST}; parts start with ${orList(PART_LETTERS)}`);
}

// ---------------------------------------------------------------------------------------
// Values, names and node lists

/**
 * Reads a value: a number (with a unit written on it or standing after it), a parameter
 * name, or an expression in parentheses. A leading minus sign is allowed. Returns null,
 * with a diagnostic, when there is no value here.
 */
function value(cur: Cursor, what: string, stopWords: readonly string[] = [], hint?: string): Value | null {
  const t = cur.peek();
  const missing = () => {
    cur.report(t?.range ?? cur.here(), 'missing-value', `${what} is missing`, hint);
    return null;
  };
  if (t === undefined) return missing();
  if (t.kind === 'punct' && (t.punct === '-' || t.punct === '+')) {
    const after = cur.peek(1);
    if (after !== undefined && (after.kind === 'number' || after.kind === 'name' || (after.kind === 'punct' && after.punct === '('))) {
      cur.next();
      const inner = value(cur, what, stopWords, hint);
      if (inner === null) return null;
      const range = merge(t.range, inner.range);
      if (t.punct === '+') return { ...inner, range };
      if (inner.kind === 'number') return { ...inner, value: -inner.value, text: '-' + inner.text, range };
      const paren = (p: '(' | ')'): Token => ({ kind: 'punct', text: p, punct: p, range: inner.range, spaced: false });
      const tokens = inner.kind === 'expr' ? [t, paren('('), ...inner.tokens, paren(')')] : [t, nameToken(inner)];
      return { kind: 'expr', tokens, text: '-' + (inner.kind === 'expr' ? `(${inner.text})` : inner.name), range };
    }
    return missing();
  }
  if (t.kind === 'number') {
    cur.next();
    const v: Value = { kind: 'number', value: t.value ?? NaN, unit: t.unit ?? null, text: t.text, range: t.range };
    if (t.prefixed === true) v.prefixed = true;
    if (t.bad === true) v.bad = true;
    if (t.unitRange !== undefined && t.unit !== null && t.unit !== undefined) v.unitRange = t.unitRange;
    const u = cur.peek();
    const apart = separateUnit(u);
    if (apart !== null && u !== undefined) {
      if (v.unit !== null || t.bad) {
        cur.report(u.range, 'unexpected-token', `\`${t.text}\` already has a unit; \`${u.text}\` is one too many`);
      } else if (apart.prefixed && t.prefixed === true) {
        cur.report(u.range, 'unexpected-token', `\`${t.text}\` has an SI prefix already; \`${u.text}\` would add a second`, `write ${t.text}${apart.unit}`);
      } else {
        v.value *= apart.multiplier;
        if (apart.prefixed) v.prefixed = true;
        v.unit = apart.unit;
        v.unitRange = u.range;
        v.text = `${t.text} ${u.text}`;
        v.range = merge(t.range, u.range);
      }
      cur.next();
    } else if (u !== undefined && u.kind === 'name' && SI_PREFIXES[u.text] !== undefined && v.unit === null && t.unitRange === undefined) {
      // A prefix standing apart from its digits: `10 k`.
      cur.report(u.range, 'spaced-prefix', `the prefix ${u.text} goes straight after the digits`, `write ${t.text}${u.text}`, {
        title: `Write ${t.text}${u.text}`,
        replacement: '',
        range: { line: t.range.line, column: t.range.endColumn, endColumn: u.range.column },
      });
      v.bad = true;
      cur.next();
    } else if (u !== undefined && u.kind === 'name') {
      // A misspelt unit standing apart: `-3 db`, `10 hz`, `1 KHz`.
      const reading = readSuffix(u.text);
      if (reading.kind === 'bad' && reading.reason.kind !== 'unknown') {
        const col = u.range.column - 1;
        describeSuffixProblem(reading.reason, '', col, col + u.text.length, (start, end, code, message, hint, fix) => {
          const range = { line: u.range.line, column: start + 1, endColumn: end + 1 };
          const qf = fix === undefined ? undefined : { title: `Replace with ${fix.replacement}`, replacement: fix.replacement, range: { line: u.range.line, column: (fix.start ?? start) + 1, endColumn: (fix.end ?? end) + 1 } };
          cur.report(range, code, message, hint, qf);
        });
        v.bad = true;
        cur.next();
      }
    }
    return v;
  }
  if (t.kind === 'name') {
    if (stopWords.includes(t.text)) return missing();
    cur.next();
    return { kind: 'name', name: t.text, range: t.range };
  }
  if (t.kind === 'punct' && t.punct === '(') {
    return parenthesised(cur);
  }
  if (t.kind === 'unit') {
    cur.error(t.range, 'misplaced-unit', `the unit \`${t.text}\` needs a number before it`, 'write the unit straight after the number, like 10kΩ');
  }
  return missing();
}

function nameToken(v: Value & { kind: 'name' }): Token {
  return { kind: 'name', text: v.name, range: v.range, spaced: true };
}

/** `( … )` with the parentheses balanced; the tokens inside become an expression. */
function parenthesised(cur: Cursor): Value {
  const open = cur.next() as Token;
  let depth = 1;
  const tokens: Token[] = [];
  while (!cur.atEnd()) {
    const t = cur.next() as Token;
    if (t.kind === 'punct' && t.punct === '(') depth++;
    if (t.kind === 'punct' && t.punct === ')') {
      depth--;
      if (depth === 0) {
        const range = merge(open.range, t.range);
        return { kind: 'expr', tokens, text: cur.line.text.slice(open.range.column, t.range.column - 1).trim(), range };
      }
    }
    tokens.push(t);
  }
  return cur.error(open.range, 'unclosed-parenthesis', 'this `(` is never closed', 'an expression in parentheses ends with `)` on the same line');
}

function ident(cur: Cursor, what: string, example: string): Ident {
  const t = cur.peek();
  if (t === undefined || t.kind !== 'name') {
    return cur.error(cur.here(), 'missing-name', `${what} is missing`, `write it like ${example}`);
  }
  cur.next();
  return { name: t.text, range: t.range };
}

const NODE_NAME_HINT = 'a node name starts with a letter or _, such as out, n2 or _x; ground is gnd';

/**
 * A node: a name. Digits only are the earlier forms, an error with the quick fix to the
 * new name (`0` → gnd, `12` → n12); `0` is then read as gnd and other digits as written.
 */
function nodeName(cur: Cursor, what: string): Ident {
  const t = cur.peek();
  if (t !== undefined && t.kind === 'name') {
    cur.next();
    return { name: t.text, range: t.range };
  }
  if (t !== undefined && t.kind === 'number' && isDigitsOnly(t.text)) {
    cur.next();
    const renamed = cur.plan().node(t.text);
    if (t.text === '0') {
      cur.report(t.range, 'ground-is-gnd', 'ground is written gnd, not 0', 'the ground node has one name, gnd', { title: 'Replace with gnd', replacement: renamed });
      return { name: renamed, range: t.range };
    }
    cur.report(t.range, 'digit-node', `\`${t.text}\` cannot be a node name: a node name starts with a letter or _`, `write ${renamed}, or a name that says what the node is, like out`, {
      title: `Replace with ${renamed}`,
      replacement: renamed,
    });
    return { name: t.text, range: t.range };
  }
  if (t !== undefined && t.kind === 'number') {
    return cur.error(t.range, 'bad-node-name', `\`${t.text}\` cannot be a node name`, NODE_NAME_HINT);
  }
  return cur.error(cur.here(), 'missing-node', `${what} is missing`, NODE_NAME_HINT);
}

function nodeList(cur: Cursor): NodeList {
  const open = cur.next() as Token;
  if (!cur.tokens.slice(cur.pos).some((t) => t.kind === 'punct' && t.punct === ']')) {
    return cur.error(open.range, 'unclosed-bracket', 'this `[` is never closed', 'a node list ends with `]`, like [a b]');
  }
  const nodes: Ident[] = [];
  while (!cur.atEnd() && !cur.isPunct(']')) {
    const t = cur.peek() as Token;
    if (t.kind === 'punct' && t.punct === ',') {
      cur.next();
      continue;
    }
    if (t.kind === 'name' || t.kind === 'number') {
      nodes.push(nodeName(cur, 'a node'));
      continue;
    }
    cur.error(t.range, 'bad-node-name', `\`${show(t)}\` cannot be a node name`, NODE_NAME_HINT);
  }
  const close = cur.peek();
  if (close === undefined) {
    return cur.error(open.range, 'unclosed-bracket', 'this `[` is never closed', 'a node list ends with `]`, like [a b]');
  }
  cur.next();
  return { nodes, range: merge(open.range, close.range) };
}

// ---------------------------------------------------------------------------------------
// Statements

function letStatement(cur: Cursor): LetStatement | null {
  const keyword = cur.next() as Token;
  const name = ident(cur, 'the parameter’s name', 'let R = 10k');
  if (cur.isPunct('==')) {
    const t = cur.next() as Token;
    cur.report(t.range, 'bad-operator', '`==` is not how a parameter is set', 'write let NAME = VALUE', { title: 'Replace with =', replacement: '=' });
  } else {
    cur.expect('=', 'missing-equals', `\`=\` is missing after ${name.name}`, `write let ${name.name} = VALUE`);
  }
  const rest = cur.tokens.slice(cur.pos);
  let v: Value | null;
  if (rest.length === 0) {
    v = value(cur, `the value of ${name.name}`);
  } else {
    const save = cur.pos;
    const diagCount = cur.diagnostics.length;
    const single = value(cur, `the value of ${name.name}`);
    if (single !== null && cur.atEnd()) {
      v = single;
    } else {
      // More than one value: the whole rest of the line is an expression (`2*Cb`).
      cur.pos = save;
      cur.diagnostics.length = diagCount;
      const last = rest[rest.length - 1];
      const range = merge(rest[0].range, last.range);
      v = { kind: 'expr', tokens: rest, text: cur.line.text.slice(rest[0].range.column - 1, last.range.endColumn - 1), range };
      cur.pos = cur.tokens.length;
    }
  }
  return { kind: 'let', name, value: v, range: merge(keyword.range, cur.whole()) };
}

function partStatement(cur: Cursor, letter: PartClassLetter): Statement | null {
  const d = cur.next() as Token;
  const designator: Ident = { name: d.text, range: d.range };
  checkDesignator(cur, d, letter);
  const nodes = nodeList(cur);
  switch (letter) {
    case 'R':
      return passive(cur, 'resistor', designator, nodes);
    case 'C':
      return passive(cur, 'capacitor', designator, nodes);
    case 'L':
      return passive(cur, 'inductor', designator, nodes);
    case 'U':
      return opamp(cur, designator, nodes);
    case 'A':
      return controlled(cur, designator, nodes);
  }
}

/**
 * A designator is a reference designator (`R1`, `R4b`, `B2`). A free-form one is the earlier
 * forms: an error whose quick fix writes the next free number of its class. The line is
 * still read under the name as written, so that references to it resolve.
 */
function checkDesignator(cur: Cursor, d: Token, letter: string): void {
  if (isDesignator(d.text, letter)) return;
  const plan = cur.plan();
  const renamed = plan.designator(cur.scope, d.text);
  const what = letter === INSTANCE_LETTER ? 'a block instance’s designator' : 'a designator';
  // The quick fix renames the part where it is defined; say where other lines name it.
  const others = plan.linesOf(d.text).filter((line) => line !== d.range.line);
  const alsoNamed = others.length === 0 ? '' : `; rename it on line${others.length === 1 ? '' : 's'} ${orList(others.map(String), 'and')} too`;
  cur.report(
    d.range,
    'bad-designator',
    `\`${d.text}\` is not a reference designator: ${what} is ${letter}, a number and an optional lower-case suffix, like ${letter}1 or ${letter}4b`,
    `number the part, and say what it does in a comment, like  # ${d.text}${alsoNamed}`,
    renamed === undefined ? undefined : { title: `Replace with ${renamed}`, replacement: renamed },
  );
}

/** Reports a word of the language's earlier forms, with the quick fix to its new form. */
function retired(cur: Cursor, range: SourceRange, written: string, replacement: string): void {
  cur.report(range, 'retired-word', `\`${written}\` is an earlier form of the language`, `write ${replacement}`, { title: `Replace with ${replacement}`, replacement });
}

function checkCount(cur: Cursor, nodes: NodeList, want: number, what: string, example: string): void {
  if (nodes.nodes.length === want) return;
  const has = nodes.nodes.length;
  cur.report(nodes.range, 'node-count', `${what} connects ${want} nodes; this has ${has === 0 ? 'none' : has}`, `write it like ${example}`);
}

/** The earlier spelling of `noise off`. */
const NOISELESS: keyof typeof RETIRED = 'noiseless';
/** Words after which a passive's value has ended. */
const PASSIVE_STOP_WORDS = [...PASSIVE_OPTIONS, NOISELESS];

function passive(cur: Cursor, part: PassiveKind, designator: Ident, nodes: NodeList): PassiveStatement {
  const { letter, unit, example, options: words, optionText } = PASSIVES[part];
  const article = PART_CLASSES[letter].article;
  checkCount(cur, nodes, 2, article, `${designator.name} [a b] ${example}`);
  const v = value(cur, `${designator.name}’s value`, PASSIVE_STOP_WORDS, `${article}’s value is in ${unit}, like ${example}`);
  const options: PartOption[] = [];
  const seen = new Map<string, SourceRange>();
  const note = (kind: string, range: SourceRange) => {
    const before = seen.get(kind);
    if (before !== undefined) {
      cur.report(range, 'duplicate-option', kind === 'tolerance' ? `${designator.name} has a tolerance already` : `${designator.name} has ${kind} already`, 'give each option once');
    }
    seen.set(kind, range);
  };
  const allowed = (t: Token, option: string): boolean => {
    if (words.includes(option)) return true;
    const owner = (Object.keys(PASSIVES) as PassiveKind[]).find((k) => PASSIVES[k].options.includes(option)) ?? 'resistor';
    cur.report(t.range, 'wrong-option', `${option} is an option of ${PART_CLASSES[PASSIVES[owner].letter].article}, not of ${article}`, `${article} takes ${optionText}`);
    return false;
  };
  while (!cur.atEnd()) {
    const t = cur.peek() as Token;
    if (t.kind === 'punct' && t.punct === '±') {
      cur.next();
      const tol = value(cur, 'the tolerance after ±', [], 'write it like ±1%');
      if (tol === null) continue;
      note('tolerance', merge(t.range, tol.range));
      options.push({ kind: 'tolerance', value: tol, range: merge(t.range, tol.range) });
      continue;
    }
    if (t.kind === 'number' && t.unit === '%') {
      const tol = value(cur, 'the tolerance') as Value;
      note('tolerance', t.range);
      options.push({ kind: 'tolerance', value: tol, range: t.range });
      continue;
    }
    if (t.kind === 'name' && t.text === 'tol') {
      cur.next();
      cur.eat('±');
      const tol = value(cur, 'the tolerance after tol', [], 'write it like tol 1%');
      if (tol === null) continue;
      const range = merge(t.range, tol.range);
      note('tolerance', range);
      options.push({ kind: 'tolerance', value: tol, range });
      continue;
    }
    if (t.kind === 'name' && (t.text === 'noise' || t.text === NOISELESS)) {
      cur.next();
      let range = t.range;
      if (t.text === NOISELESS) {
        retired(cur, t.range, t.text, RETIRED.noiseless);
      } else {
        const off = cur.peek();
        if (off === undefined || off.kind !== 'name' || off.text !== NOISE_OFF) {
          cur.report(off?.range ?? t.range, 'bad-option', 'noise takes the word off', `a resistor without thermal noise is written noise ${NOISE_OFF}`);
          if (off !== undefined && off.kind === 'name') cur.next();
          continue;
        }
        cur.next();
        range = merge(t.range, off.range);
      }
      if (allowed(t, 'noise')) {
        note('noise off', range);
        options.push({ kind: 'noise-off', range });
      }
      continue;
    }
    if (t.kind === 'name' && (t.text === 'esr' || t.text === 'esl' || t.text === 'dcr')) {
      cur.next();
      const ok = allowed(t, t.text);
      const amount = value(cur, `the value after ${t.text}`, PASSIVE_STOP_WORDS, t.text === 'esl' ? 'esl is in H, like esl 1n' : `${t.text} is in Ω, like ${t.text} 20m`);
      if (amount === null || !ok) continue;
      const kind = t.text;
      const range = merge(t.range, amount.range);
      note(kind, range);
      options.push({ kind, value: amount, range });
      continue;
    }
    unknownOption(cur, t, designator.name, words, optionText, article);
  }
  return { kind: 'passive', part, designator, nodes, value: v, options, range: cur.whole() };
}

function unknownOption(cur: Cursor, t: Token, designator: string, words: readonly string[], list: string, article: string): never {
  if (t.kind === 'number' || (t.kind === 'punct' && t.punct === '(')) {
    cur.error(t.range, 'unexpected-token', `\`${show(t)}\` is one value too many: ${designator} has its value already`, `a tolerance is written ±5% or 5%; ${article} takes ${list}`);
  }
  if (t.kind === 'name') {
    const near = didYouMean(t.text, words);
    cur.error(t.range, 'unknown-option', `\`${t.text}\` is not an option of ${designator}`, suggestionHint(near, `${article} takes ${list}`), near.fix);
  }
  return cur.error(t.range, 'unexpected-token', `unexpected \`${show(t)}\` in ${designator}`, `${article} takes ${list}`);
}

const OPAMP_OPTION_LIST = OPAMP_OPTION_WORDS.join(', ');
const RETIRED_OPAMP_OPTIONS: Readonly<Record<string, OpAmpOptionName>> = { en: RETIRED.en, in: RETIRED.in };

function opamp(cur: Cursor, designator: Ident, nodes: NodeList): OpAmpStatement {
  checkCount(cur, nodes, 3, 'an op-amp', `${designator.name} [p n out] opamp (non-inverting, inverting, output)`);
  const word = cur.peek();
  if (word === undefined || word.kind !== 'name' || word.text !== OPAMP_WORD) {
    const hint = `write ${designator.name} [p n out] opamp, then any of ${OPAMP_OPTION_LIST}`;
    if (word !== undefined && word.kind === 'name') {
      const near = didYouMean(word.text, [OPAMP_WORD]);
      if (near.fix !== undefined) cur.error(word.range, 'missing-opamp', `\`${word.text}\` should be opamp`, hint, near.fix);
      cur.error(word.range, 'missing-opamp', `\`${word.text}\` is not a kind of U part: a U part is an opamp, described by its options`, hint);
    }
    cur.error(word?.range ?? nodes.range, 'missing-opamp', `${designator.name} needs the word opamp after its nodes`, hint);
  }
  cur.next();
  const options: OpAmpStatement['options'] = [];
  while (!cur.atEnd()) {
    const t = cur.peek() as Token;
    const name = t.kind === 'name' ? ((OPAMP_OPTION_WORDS as string[]).includes(t.text) ? (t.text as OpAmpOptionName) : RETIRED_OPAMP_OPTIONS[t.text]) : undefined;
    if (name !== undefined) {
      cur.next();
      if (name !== t.text) retired(cur, t.range, t.text, name);
      const amount = value(cur, `the value after ${t.text}`, OPAMP_OPTION_WORDS, `${name} is in ${OPAMP_OPTIONS[name]}`);
      if (amount === null) continue;
      const range = merge(t.range, amount.range);
      if (options.some((o) => o.name === name)) cur.report(range, 'duplicate-option', `${designator.name} has ${name} already`, 'give each option once');
      else options.push({ name, value: amount, range });
      continue;
    }
    unknownOption(cur, t, designator.name, OPAMP_OPTION_WORDS, OPAMP_OPTION_LIST, 'an op-amp');
  }
  return { kind: 'opamp', designator, nodes, options, range: cur.whole() };
}

function controlled(cur: Cursor, designator: Ident, nodes: NodeList): ControlledStatement | null {
  const word = cur.peek();
  const hint = 'an A part is one of: A1 [o+ o- c+ c-] vgain K, A1 [o+ o- c+ c-] gm S, A1 [o+ o-] igain K of R1, A1 [o+ o-] rm Ω of R1';
  if (word === undefined || word.kind !== 'name' || !(CONTROLLED_MODE_WORDS as string[]).includes(word.text)) {
    if (word !== undefined && word.kind === 'name') {
      const near = didYouMean(word.text, CONTROLLED_MODE_WORDS);
      cur.error(word.range, 'missing-mode', `\`${word.text}\` is not a kind of controlled source`, suggestionHint(near, hint), near.fix);
    }
    cur.error(word?.range ?? nodes.range, 'missing-mode', `${designator.name} needs vgain, gm, igain or rm after its nodes`, hint);
  }
  cur.next();
  const mode = word.text as ControlledMode;
  const fourNode = mode === 'vgain' || mode === 'gm';
  checkCount(
    cur,
    nodes,
    fourNode ? 4 : 2,
    fourNode ? `a voltage-controlled source (${mode})` : `a current-controlled source (${mode})`,
    fourNode ? `${designator.name} [o+ o- c+ c-] ${mode} ${mode === 'gm' ? '1m' : '10'}` : `${designator.name} [o+ o-] ${mode} ${mode === 'rm' ? '1k' : '10'} of R1`,
  );
  const what = { vgain: 'the gain after vgain', gm: 'the transconductance after gm', igain: 'the gain after igain', rm: 'the transresistance after rm' }[mode];
  const v = value(cur, what, ['of'], { vgain: 'vgain is in V/V or dB', gm: 'gm is in S', igain: 'igain is in A/A or dB', rm: 'rm is in Ω' }[mode]);
  let control: Ident | null = null;
  if (!fourNode) {
    if (cur.eat('of') === undefined) {
      cur.report(cur.here(), 'missing-control', `${mode} needs the part whose current controls it`, `write ${designator.name} [o+ o-] ${mode} ${mode === 'rm' ? '1k' : '10'} of R1`);
    } else {
      control = ident(cur, 'the controlling part after of', `${mode} 10 of R1`);
    }
  }
  cur.finish(`${designator.name}`, hint);
  return { kind: 'controlled', designator, nodes, mode, value: v, control, range: cur.whole() };
}

function coupleStatement(cur: Cursor): CoupleStatement {
  const keyword = cur.next() as Token;
  const l1 = ident(cur, 'the first inductor', 'couple L1 L2 0.99');
  const l2 = ident(cur, 'the second inductor', 'couple L1 L2 0.99');
  const k = value(cur, 'the coupling factor', [], 'write couple L1 L2 K, with 0 < K ≤ 1');
  cur.finish('the coupling factor', 'write couple L1 L2 K');
  return { kind: 'couple', l1, l2, k, range: merge(keyword.range, cur.whole()) };
}

function blockHeader(cur: Cursor): BlockStatement {
  const keyword = cur.next() as Token;
  const name = ident(cur, 'the block’s name', 'block lowpass [in out] (R, C = 10n)');
  if (!cur.isPunct('[')) {
    cur.error(cur.here(), 'missing-nodes', `block ${name.name} needs its pins in brackets`, `write block ${name.name} [in out]`);
  }
  const pins = nodeList(cur);
  const params: BlockParam[] = [];
  if (cur.isPunct('(')) {
    const open = cur.next() as Token;
    while (!cur.atEnd() && !cur.isPunct(')')) {
      const p = ident(cur, 'a parameter name', '(R, C = 10n)');
      let def: Value | null = null;
      if (cur.eat('=') !== undefined) def = value(cur, `the default of ${p.name}`);
      params.push({ name: p, default: def });
      if (cur.isPunct(')')) break;
      if (cur.eat(',') === undefined) cur.error(cur.here(), 'unexpected-token', `expected \`,\` or \`)\` after ${p.name}`, 'parameters are separated by commas: (R, C = 10n)');
    }
    if (cur.eat(')') === undefined) cur.error(open.range, 'unclosed-parenthesis', 'this `(` is never closed', 'the parameter list ends with `)`');
  }
  cur.finish(`block ${name.name}`, 'a block line is block NAME [pins] (parameters)');
  return { kind: 'block', name, pins, params, body: [], range: merge(keyword.range, cur.whole()), endRange: null };
}

function useStatement(cur: Cursor): UseStatement {
  const keyword = cur.next() as Token;
  const block = ident(cur, 'the block’s name', 'use lowpass as B1 [in out]');
  cur.expect('as', 'missing-as', `\`as\` is missing after use ${block.name}`, `write use ${block.name} as B1 [nodes]`);
  const instanceToken = cur.peek();
  const instance = ident(cur, 'the instance’s designator', `use ${block.name} as B1 [in out]`);
  checkDesignator(cur, instanceToken as Token, INSTANCE_LETTER);
  if (!cur.isPunct('[')) cur.error(cur.here(), 'missing-nodes', `${instance.name} needs its nodes in brackets`, `write use ${block.name} as ${instance.name} [in out]`);
  const nodes = nodeList(cur);
  const args: UseStatement['args'] = [];
  if (cur.isPunct('(')) {
    const open = cur.next() as Token;
    while (!cur.atEnd() && !cur.isPunct(')')) {
      const p = ident(cur, 'a parameter name', '(R = 10k)');
      cur.expect('=', 'missing-equals', `\`=\` is missing after ${p.name}`, `write (${p.name} = VALUE)`);
      const v = value(cur, `the value of ${p.name}`);
      args.push({ name: p, value: v });
      if (cur.isPunct(')')) break;
      if (cur.eat(',') === undefined) cur.error(cur.here(), 'unexpected-token', `expected \`,\` or \`)\` after the value of ${p.name}`, 'values are separated by commas: (R = 10k, C = 1n)');
    }
    if (cur.eat(')') === undefined) cur.error(open.range, 'unclosed-parenthesis', 'this `(` is never closed', 'the list of values ends with `)`');
  }
  cur.finish(instance.name, `write use ${block.name} as ${instance.name} [nodes] (NAME = VALUE, …)`);
  return { kind: 'use', block, instance, nodes, args, range: merge(keyword.range, cur.whole()) };
}

function driveStatement(cur: Cursor): DriveStatement {
  const keyword = cur.next() as Token;
  let source: DriveStatement['source'] = 'voltage';
  // `drive current [p n]` is a current drive; `drive current` alone drives a node named current.
  if (cur.isWord('current') && cur.peek(1) !== undefined) {
    cur.next();
    source = 'current';
  }
  let nodes: Ident[];
  let nodesRange: SourceRange;
  if (cur.isPunct('[')) {
    const list = nodeList(cur);
    if (list.nodes.length !== 2) {
      cur.report(list.range, 'node-count', `a drive in brackets names 2 nodes; this has ${list.nodes.length === 0 ? 'none' : list.nodes.length}`, 'write drive [p n], or drive NODE for a drive from gnd');
    }
    nodes = list.nodes;
    nodesRange = list.range;
  } else {
    const node = nodeName(cur, 'the driven node');
    nodes = [node];
    nodesRange = node.range;
  }
  let amplitude: Value | null = null;
  let phase: Value | null = null;
  if (!cur.atEnd() && !cur.isWord('phase')) amplitude = value(cur, 'the amplitude', ['phase']);
  if (source === 'current' && amplitude === null && cur.atEnd()) {
    cur.report(cur.here(), 'missing-value', 'a current drive needs its amplitude in A', 'write drive current [p n] 1m');
  }
  if (cur.eat('phase') !== undefined) phase = value(cur, 'the phase', [], 'write phase 90 (degrees)');
  cur.finish('the drive', source === 'voltage' ? 'write drive NODE [AMPLITUDE] [phase DEG]' : 'write drive current [p n] AMPLITUDE [phase DEG]');
  return { kind: 'drive', source, nodes, nodesRange, amplitude, phase, range: merge(keyword.range, cur.whole()) };
}

/** The words of a trace expression in canonical spacing. */
export function traceText(e: TraceExpr): string {
  switch (e.kind) {
    case 'node':
      return e.node.name;
    case 'difference':
      return `${e.p.name} - ${e.n.name}`;
    case 'ratio':
      return `${e.num.name} / ${e.den.name}`;
    case 'current':
      return `current ${e.element.name}`;
    case 'impedance':
      return e.n === null ? `impedance ${e.p.name}` : `impedance [${e.p.name} ${e.n.name}]`;
  }
}

function traceExpr(cur: Cursor, mode: ShowMode): { expr: TraceExpr; range: SourceRange } {
  const start = cur.peek();
  if (start === undefined) {
    return cur.error(cur.here(), 'missing-trace', 'what to show is missing', 'write show NODE, show NODE - NODE, show NODE / NODE, show current R1 or show impedance NODE');
  }
  let expr: TraceExpr;
  if (cur.isWord('current') && cur.peek(1) !== undefined) {
    cur.next();
    expr = { kind: 'current', element: ident(cur, 'the part after current', 'show current R1') };
  } else if (cur.isWord('impedance') && cur.peek(1) !== undefined) {
    cur.next();
    if (cur.isPunct('[')) {
      const list = nodeList(cur);
      if (list.nodes.length < 1 || list.nodes.length > 2) {
        cur.error(list.range, 'node-count', `impedance in brackets names 2 nodes; this has ${list.nodes.length === 0 ? 'none' : list.nodes.length}`, 'write show impedance [a b], or show impedance NODE for the impedance to gnd');
      }
      expr = { kind: 'impedance', p: list.nodes[0], n: list.nodes[1] ?? null, bracketed: true };
    } else {
      expr = { kind: 'impedance', p: nodeName(cur, 'the node after impedance'), n: null, bracketed: false };
    }
  } else {
    const a = nodeName(cur, 'the node to show');
    if (cur.isPunct('-') || cur.isPunct('/')) {
      const op = cur.next() as Token;
      const b = nodeName(cur, `the node after ${op.text}`);
      expr = op.punct === '-' ? { kind: 'difference', p: a, n: b } : { kind: 'ratio', num: a, den: b };
    } else {
      expr = { kind: 'node', node: a };
    }
  }
  const range = merge(start.range, cur.tokens[cur.pos - 1].range);
  const allowed: Record<ShowMode, TraceExpr['kind'][]> = {
    plain: ['node', 'difference', 'ratio', 'current', 'impedance'],
    loop: ['node', 'difference', 'ratio'],
    step: ['node', 'difference', 'ratio', 'current'],
    noise: ['node'],
  };
  if (!allowed[mode].includes(expr.kind)) {
    const hint = {
      plain: '',
      loop: 'a loop gain is a node, a difference or a ratio of node voltages: show loop out / in',
      step: 'a step response is of a node, a difference, a ratio or a current: show step out',
      noise: 'output noise is shown at one node: show noise out',
    }[mode];
    cur.error(range, 'bad-trace', `show ${mode} cannot show ${traceText(expr)}`, hint);
  }
  return { expr, range };
}

function showStatement(cur: Cursor): ShowStatement {
  const keyword = cur.next() as Token;
  let label: ShowStatement['label'] = null;
  const takeLabel = () => {
    const t = cur.peek();
    if (t !== undefined && t.kind === 'string') {
      cur.next();
      if (label !== null) cur.report(t.range, 'unexpected-token', 'this trace has a label already');
      if (t.text.trim() === '') cur.report(t.range, 'empty-label', 'a label cannot be empty', 'write a few words between the quotes, or leave the label out');
      label = { text: t.text.trim(), range: t.range };
    }
  };
  takeLabel();
  let mode: ShowMode = 'plain';
  for (const m of ['loop', 'step', 'noise'] as const) {
    if (cur.isWord(m) && cur.peek(1) !== undefined && !cur.isPunct('-', 1) && !cur.isPunct('/', 1)) {
      cur.next();
      mode = m;
      break;
    }
  }
  takeLabel();
  const { expr, range } = traceExpr(cur, mode);
  cur.finish(`the trace`, 'a show line shows one thing: write a second show line for another trace');
  return { kind: 'show', label, mode, expr, exprText: traceText(expr), exprRange: range, range: merge(keyword.range, cur.whole()) };
}

function sweepStatement(cur: Cursor): SweepStatement {
  const keyword = cur.next() as Token;
  const hint = 'write sweep 10 .. 100k, sweep 10 .. 100k, 50/decade, sweep 0 .. 10k, 101 linear or sweep at 1k, 2k, 5k';
  if (cur.eat('at') !== undefined) {
    const frequencies: Value[] = [];
    for (;;) {
      const f = value(cur, 'a frequency after at');
      if (f === null) break;
      frequencies.push(f);
      if (cur.eat(',') === undefined) break;
    }
    cur.finish('the list of frequencies', 'separate the frequencies with commas: sweep at 1k, 2k, 5k');
    return { kind: 'sweep', form: 'list', frequencies, range: merge(keyword.range, cur.whole()) };
  }
  const from = value(cur, 'the start frequency');
  if (from === null) throw new StatementError('sweep');
  if (!cur.isPunct('..')) cur.error(cur.here(), 'missing-range', 'a sweep range is written with `..` between its ends', hint);
  cur.next();
  const to = value(cur, 'the stop frequency');
  if (to === null) throw new StatementError('sweep');
  if (cur.eat(',') === undefined) {
    cur.finish('the sweep range', hint);
    return { kind: 'sweep', form: 'log', from, to, perDecade: null, range: merge(keyword.range, cur.whole()) };
  }
  const count = value(cur, 'the count of points');
  if (count === null) throw new StatementError('sweep');
  if (cur.eat('linear') !== undefined) {
    cur.finish('the sweep', hint);
    return { kind: 'sweep', form: 'linear', from, to, points: count, range: merge(keyword.range, cur.whole()) };
  }
  if (cur.eat('/') !== undefined) {
    const unit = cur.peek();
    if (unit !== undefined && unit.kind === 'name' && unit.text === 'decade') {
      cur.next();
    } else if (unit !== undefined && unit.kind === 'name' && ['dec', 'decades', 'dekade', 'decad', 'decde'].includes(unit.text)) {
      cur.report(unit.range, 'bad-sweep', `\`${unit.text}\` should be decade`, 'write N/decade', { title: 'Replace with decade', replacement: 'decade' });
      cur.next();
    } else {
      cur.error(cur.here(), 'bad-sweep', 'a log sweep’s density is written N/decade', hint);
    }
    cur.finish('the sweep', hint);
    return { kind: 'sweep', form: 'log', from, to, perDecade: count, range: merge(keyword.range, cur.whole()) };
  }
  return cur.error(cur.here(), 'bad-sweep', 'after the comma comes N/decade or N linear', hint);
}

function timeStatement(cur: Cursor): TimeStatement {
  const keyword = cur.next() as Token;
  const from = value(cur, 'the start time');
  if (from === null) throw new StatementError('time');
  cur.expect('..', 'missing-range', 'a time window is written with `..` between its ends', 'write time 0 .. 10m, or time 0 .. 10m, 1000 points');
  const to = value(cur, 'the end time');
  if (to === null) throw new StatementError('time');
  let points: Value | null = null;
  if (cur.eat(',') !== undefined) {
    points = value(cur, 'the count of points');
    cur.expect('points', 'bad-time', 'after the comma comes N points', 'write time 0 .. 10m, 1000 points');
  }
  cur.finish('the time window', 'write time 0 .. 10m, or time 0 .. 10m, 1000 points');
  return { kind: 'time', from, to, points, range: merge(keyword.range, cur.whole()) };
}

function temperatureStatement(cur: Cursor): TemperatureStatement {
  const keyword = cur.next() as Token;
  const v = value(cur, 'the temperature', [], TEMPERATURE_HINT);
  if (v === null) throw new StatementError('temperature');
  cur.finish('the temperature', TEMPERATURE_HINT);
  return { kind: 'temperature', value: v, range: merge(keyword.range, cur.whole()) };
}

/** `spread N draws [seed S]` or `spread extremes`. */
function spreadStatement(cur: Cursor): SpreadStatement {
  const keyword = cur.next() as Token;
  const first = cur.peek();
  if (first !== undefined && first.kind === 'name' && cur.peek(1) === undefined && !cur.isWord('extremes')) {
    const near = didYouMean(first.text, ['extremes']);
    if (near.fix !== undefined) cur.error(first.range, 'bad-spread', `\`${first.text}\` is not a kind of spread`, suggestionHint(near, SPREAD_HINT), near.fix);
  }
  if (cur.eat('extremes') !== undefined) {
    cur.finish('extremes', SPREAD_HINT);
    return { kind: 'spread', mode: 'extremes', draws: null, seed: null, range: merge(keyword.range, cur.whole()) };
  }
  const draws = value(cur, 'the count of draws', ['draws', 'seed', 'extremes'], SPREAD_HINT);
  if (draws === null) throw new StatementError('spread');
  if (cur.eat('draws') === undefined) {
    const t = cur.peek();
    const near = t !== undefined && t.kind === 'name' ? didYouMean(t.text, ['draws']) : undefined;
    if (t !== undefined && near?.fix !== undefined) cur.error(t.range, 'bad-spread', `\`${t.text}\` should be draws`, SPREAD_HINT, near.fix);
    const end = draws.range.endColumn;
    cur.error(t?.range ?? draws.range, 'bad-spread', 'the count of draws is followed by the word draws', SPREAD_HINT, {
      title: 'Add draws',
      replacement: ' draws',
      range: { line: draws.range.line, column: end, endColumn: end },
    });
  }
  let seed: Value | null = null;
  if (cur.eat('seed') !== undefined) seed = value(cur, 'the seed', [], SPREAD_HINT);
  cur.finish('the spread', SPREAD_HINT);
  return { kind: 'spread', mode: 'draws', draws, seed, range: merge(keyword.range, cur.whole()) };
}

/**
 * `tolerance montecarlo N [seed S]` and `tolerance worstcase`, the earlier forms of
 * `spread`: an error whose quick fix rewrites the line; read as the spread it stands for.
 */
function retiredToleranceStatement(cur: Cursor): SpreadStatement {
  cur.next();
  const word = cur.next();
  const range = cur.whole();
  const source = (v: Value) => cur.line.text.slice(v.range.column - 1, v.range.endColumn - 1);
  const report = (replacement?: string) =>
    cur.report(range, 'retired-word', '`tolerance` is an earlier form of the language', replacement === undefined ? SPREAD_HINT : `write ${replacement}`, replacement === undefined ? undefined : { title: `Replace with ${replacement}`, replacement });
  if (word !== undefined && word.kind === 'name' && word.text === 'worstcase') {
    report(`${RETIRED.tolerance} ${RETIRED.worstcase}`);
    return { kind: 'spread', mode: 'extremes', draws: null, seed: null, range };
  }
  if (word === undefined || word.kind !== 'name' || word.text !== 'montecarlo') {
    report();
    throw new StatementError('tolerance');
  }
  const diagnosticCount = cur.diagnostics.length;
  const draws = value(cur, 'the count of draws', ['seed']);
  const seed = cur.eat('seed') !== undefined ? value(cur, 'the seed') : null;
  if (draws === null || !cur.atEnd() || cur.diagnostics.length > diagnosticCount) {
    report();
    throw new StatementError('tolerance');
  }
  report(`${RETIRED.tolerance} ${source(draws)} ${RETIRED.montecarlo}${seed === null ? '' : ` seed ${source(seed)}`}`);
  return { kind: 'spread', mode: 'draws', draws, seed, range };
}

const OPS: Partial<Record<Punct, { op: '>=' | '<=' | '='; fix?: string }>> = {
  '>=': { op: '>=' },
  '<=': { op: '<=' },
  '=': { op: '=' },
  '==': { op: '=', fix: '=' },
  '>': { op: '>=', fix: '>=' },
  '<': { op: '<=', fix: '<=' },
};

function isOp(t: Token | undefined): boolean {
  return t !== undefined && t.kind === 'punct' && t.punct !== undefined && OPS[t.punct] !== undefined;
}

function requireStatement(cur: Cursor): RequireStatement {
  const keyword = cur.next() as Token;
  const hint = 'write require TARGET MEASURE OP VALUE, like require out gain >= -3 dB over 10 .. 1k';
  const tokens = cur.tokens;
  // The measure is the first measure word after the target that is followed by an operator.
  let m = -1;
  for (let i = cur.pos; i < tokens.length; i++) {
    if (tokens[i].kind === 'name' && (MEASURE_WORDS as string[]).includes(tokens[i].text) && isOp(tokens[i + 1])) {
      m = i;
      break;
    }
  }
  if (m < 0) {
    for (let i = cur.pos + 1; i < tokens.length; i++) {
      const t = tokens[i];
      if (isOp(tokens[i + 1]) && t.kind === 'name') {
        const near = didYouMean(t.text, MEASURE_WORDS);
        cur.error(t.range, 'unknown-measure', `\`${t.text}\` is not a measure`, suggestionHint(near, `the measures are ${MEASURE_LIST}.`, `The measures are ${MEASURE_LIST}.`), near.fix);
      }
    }
    if (cur.atEnd()) cur.error(keyword.range, 'missing-target', 'what to require is missing', hint);
    cur.error(cur.whole(), 'missing-measure', 'this requirement has no measure and comparison', `${hint}; the measures are ${MEASURE_LIST}`);
  }
  const targetTokens = tokens.slice(cur.pos, m);
  if (targetTokens.length === 0) cur.error(tokens[m].range, 'missing-target', 'the trace this requirement is about is missing', hint);
  const target = requireTarget(targetTokens);
  cur.pos = m;
  const measureToken = cur.next() as Token;
  const measure = { name: measureToken.text as MeasureName, range: measureToken.range };
  const opToken = cur.next() as Token;
  const opInfo = OPS[opToken.punct as Punct] as { op: '>=' | '<=' | '='; fix?: string };
  if (opInfo.fix !== undefined) {
    cur.report(opToken.range, 'bad-operator', `\`${opToken.text}\` is not a comparison here`, `the comparisons are >=, <= and = VALUE ± TOL`, {
      title: `Replace with ${opInfo.fix}`,
      replacement: opInfo.fix,
    });
  }
  const v = value(cur, 'the value to compare with', ['over', 'at']);
  if (v === null) throw new StatementError('require');
  let tolerance: Value | null = null;
  if (cur.eat('±') !== undefined) {
    tolerance = value(cur, 'the tolerance after ±');
    if (opInfo.op !== '=') cur.report(tolerance?.range ?? opToken.range, 'bad-tolerance', `a tolerance goes with =, not with ${opInfo.op}`, 'write = VALUE ± TOL, or drop the tolerance');
  } else if (opInfo.op === '=') {
    cur.report(v.range, 'missing-tolerance', '= needs a tolerance', `write = ${v.kind === 'number' ? v.text : 'VALUE'} ± 2% or give an absolute tolerance`);
  }
  let over: RequireStatement['over'] = null;
  let at: Value | null = null;
  const overToken = cur.eat('over');
  if (overToken !== undefined) {
    let from: Value | null = null;
    let to: Value | null = null;
    if (!cur.isPunct('..')) from = value(cur, 'the start of the range');
    if (from !== null || cur.isPunct('..')) {
      cur.expect('..', 'missing-range', 'a range is written F1 .. F2, F1 .. or .. F2', 'write over 10 .. 1k');
      if (!cur.atEnd()) to = value(cur, 'the end of the range');
      else if (from === null) cur.report(cur.here(), 'missing-range', 'a range needs at least one end', 'write over 10 .. 1k');
    }
    over = { from, to, range: merge(overToken.range, cur.tokens[cur.pos - 1].range) };
  } else if (cur.eat('at') !== undefined) {
    at = value(cur, 'the frequency after at');
  }
  cur.finish('the requirement', hint);
  const whole = cur.whole();
  const text = cur.line.text.slice(whole.column - 1, whole.endColumn - 1).trim();
  return { kind: 'require', target, measure, op: { op: opInfo.op, range: opToken.range }, value: v, tolerance, over, at, text, range: merge(keyword.range, whole) };
}

/** The target's words in the same canonical form as a `show` line's (`loop out / in`). */
function requireTarget(tokens: Token[]): RequireTarget {
  const range = merge(tokens[0].range, tokens[tokens.length - 1].range);
  if (tokens.length === 1 && tokens[0].kind === 'string') return { text: tokens[0].text.trim(), quoted: true, range };
  const words = tokens.map((t) => {
    if (t.kind === 'punct' && (t.punct === '-' || t.punct === '/')) return ` ${t.punct} `;
    if (t.kind === 'punct' && t.punct === '[') return ' [';
    if (t.kind === 'punct' && t.punct === ']') return ']';
    return ` ${t.text}`;
  });
  const text = words.join('').replace(/\s+/g, ' ').replace(/\[ /g, '[').trim();
  return { text, quoted: false, range };
}
