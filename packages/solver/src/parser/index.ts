/**
 * The cell language's parser: a cursor over one line's tokens (`cursor.ts`) and one function
 * per statement (`values.ts`, `parts.ts`, `statements.ts`); this module walks the lines and
 * hands each to its statement. It never throws: every problem becomes a diagnostic, and a
 * statement that fails part-way is skipped (or kept with what was read).
 */
import type { Diagnostic } from '../result.js';
import { lex } from '../lexer.js';
import type { Line, Token } from '../lexer.js';
import type { BlockStatement, Program, Statement } from '../ast.js';
import { LINE_STARTS, PART_CLASSES, PART_LETTERS, STATEMENT_WORDS, TOP_LEVEL_ONLY } from '../vocabulary.js';
import type { PartClassLetter } from '../vocabulary.js';
import { didYouMean, suggest, suggestionHint } from '../suggest.js';
import { internalError, replaceWith, tidyDiagnostics } from '../diagnostic.js';
import { planRenames } from '../modernize.js';
import type { RenamePlan } from '../modernize.js';
import { Cursor, StatementError, orList, show } from './cursor.js';
import { blockHeader, coupleStatement, partStatement, useStatement } from './parts.js';
import {
  driveStatement,
  letStatement,
  requireStatement,
  retiredToleranceStatement,
  showStatement,
  spreadStatement,
  sweepStatement,
  temperatureStatement,
  timeStatement,
} from './statements.js';
import { varyStatement } from './vary.js';

const STATEMENT_LIST = STATEMENT_WORDS.filter((w) => w !== 'end').join(', ');
const PART_LIST = orList(PART_LETTERS.map((l) => `${l} (${PART_CLASSES[l].kind})`));

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
          cur.report(
            first.range,
            'nested-block',
            'a block cannot be defined inside another block',
            `end block ${block.name.name} first, then define ${header.name.name} on its own`,
          );
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
        cur.report(
          first.range,
          'not-in-block',
          `\`${first.text}\` belongs outside blocks`,
          'a block holds parts, couple, use and let lines; put this line after the block’s end',
        );
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
      cur.diagnostics.push(internalError(e, cur.whole()));
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
      case 'vary':
        return varyStatement(cur);
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
    return cur.error(
      first.range,
      'unknown-statement',
      `\`${word}\` is not a statement`,
      suggestionHint(near, `the statements are ${STATEMENT_LIST}`),
      near.fix,
    );
  }
  const upper = word[0].toUpperCase();
  if (bracket && word[0] !== upper && partLetter(upper) !== null) {
    const fixed = upper + word.slice(1);
    return cur.error(
      first.range,
      'unknown-statement',
      `\`${word}\` is not a statement or a part`,
      `designators start with a capital letter: ${fixed}`,
      replaceWith(fixed),
    );
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
    const hint = word.includes('.')
      ? 'a name with a dot is a part inside a block instance; give this part a designator of its own, like R7'
      : (hints[upper] ?? 'an impedance is built from R, C and L parts; a sub-network is a block placed with use');
    return cur.error(first.range, 'unknown-part-kind', `\`${word}\` is not a kind of part: a designator starts with ${PART_LIST}`, hint);
  }
  return cur.error(
    first.range,
    'unknown-statement',
    `\`${word}\` is not a statement`,
    `the statements are ${STATEMENT_LIST}; parts start with ${orList(PART_LETTERS)}`,
  );
}

// ---------------------------------------------------------------------------------------
