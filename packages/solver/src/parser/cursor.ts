/**
 * The parser's cursor over one line's tokens (`next`, `eat`, `expect`, `error`): a problem
 * becomes a diagnostic, and `error` stops the statement with a `StatementError` that only
 * the line reader catches.
 */
import type { SourceRange } from '../circuit.js';
import type { Diagnostic } from '../result.js';
import type { Line, Punct, Token } from '../lexer.js';
import { diagnostic } from '../diagnostic.js';
import type { FixSpec } from '../diagnostic.js';
import type { RenamePlan } from '../modernize.js';

/** `a, b or c` (or `a, b and c`). */
export function orList(words: readonly string[], last: 'or' | 'and' = 'or'): string {
  return words.length <= 1 ? words.join('') : `${words.slice(0, -1).join(', ')} ${last} ${words[words.length - 1]}`;
}

/** Stops a statement's parse after its diagnostic has been made; never leaves the parser. */
export class StatementError extends Error {}

export function merge(a: SourceRange, b: SourceRange): SourceRange {
  return { line: a.line, column: Math.min(a.column, b.column), endColumn: Math.max(a.endColumn, b.endColumn) };
}

export function show(t: Token): string {
  return t.kind === 'string' ? `"${t.text}"` : t.text;
}

/** A cursor over one line's tokens. */
export class Cursor {
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
