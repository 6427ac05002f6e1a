/**
 * Reads an expression's tokens (the lexer's, so SI prefixes, IEC forms, units and dotted
 * names arrive already read) into a small tree, by recursive descent over four levels:
 *
 *   sum     = product { (+ | -) product }          left to right
 *   product = unary { (* | /) unary }              left to right
 *   unary   = (- | +) unary | power
 *   power   = primary [ ^ unary ]                  right to left: 2^3^2 = 2^9
 *   primary = number [unit] | name | function ( sum { , sum } ) | ( sum )
 *
 * so `^` binds tighter than a sign (`-2^2` = −4) and its exponent may carry one (`2^-1`),
 * as in common mathematical notation. Every node keeps its source range, and each problem
 * is a diagnostic at the token(s) where it is. Values are not computed here (expr.ts does).
 */
import type { SourceRange } from './circuit.js';
import type { Diagnostic } from './result.js';
import type { FixSpec } from './diagnostic.js';
import type { Punct, Token } from './lexer.js';
import type { FunctionName, Unit } from './vocabulary.js';
import { separateUnit } from './lexer.js';
import { diagnostic } from './diagnostic.js';
import { didYouMean, suggestionHint } from './suggest.js';
import { FUNCTIONS, FUNCTION_WORDS, isFunctionName } from './vocabulary.js';

export type BinaryOperator = '+' | '-' | '*' | '/' | '^';

export type ExprNode =
  | { kind: 'number'; value: number; unit: Unit | null; range: SourceRange }
  | { kind: 'name'; name: string; range: SourceRange }
  | { kind: 'call'; name: FunctionName; args: ExprNode[]; nameRange: SourceRange; range: SourceRange }
  | { kind: 'unary'; operator: '-' | '+'; operand: ExprNode; range: SourceRange }
  | { kind: 'binary'; operator: BinaryOperator; left: ExprNode; right: ExprNode; range: SourceRange };

export type NameNode = Extract<ExprNode, { kind: 'name' }>;

/** A tree, or why there is none. No diagnostics when the lexer has already reported a bad token. */
export type ParsedExpression = { ok: true; tree: ExprNode } | { ok: false; diagnostics: Diagnostic[] };

const FUNCTION_LIST = FUNCTION_WORDS.join(', ');
const WHAT_EXPRESSIONS_USE = 'expressions use + - * / ^, parentheses, numbers, parameter names and functions';

/** Ends the parse at its first problem; never leaves this module. */
class Problem extends Error {
  constructor(readonly diagnostic: Diagnostic) {
    super(diagnostic.message);
  }
}

function problem(range: SourceRange, message: string, options: { hint?: string; fix?: FixSpec; code?: string } = {}): Problem {
  return new Problem(diagnostic(range, options.code ?? 'bad-expression', message, options));
}

function spanning(a: SourceRange, b: SourceRange): SourceRange {
  return { line: a.line, column: Math.min(a.column, b.column), endColumn: Math.max(a.endColumn, b.endColumn) };
}

function isPunct(t: Token | undefined, ...puncts: Punct[]): boolean {
  return t !== undefined && t.kind === 'punct' && t.punct !== undefined && puncts.includes(t.punct);
}

/**
 * Parses an expression's tokens; `range` is the whole expression's (for an empty one).
 * Never throws.
 */
export function parseExpression(tokens: readonly Token[], range: SourceRange): ParsedExpression {
  if (tokens.some((t) => t.kind === 'error' || t.bad === true)) return { ok: false, diagnostics: [] };
  if (tokens.length === 0) {
    return { ok: false, diagnostics: [nothingInside(range).diagnostic] };
  }
  try {
    return { ok: true, tree: new Reader(tokens).whole() };
  } catch (e) {
    if (e instanceof Problem) return { ok: false, diagnostics: [e.diagnostic] };
    throw e;
  }
}

/** The parameter names a tree uses, in reading order (constants included). */
export function namesIn(tree: ExprNode): NameNode[] {
  switch (tree.kind) {
    case 'number':
      return [];
    case 'name':
      return [tree];
    case 'call':
      return tree.args.flatMap(namesIn);
    case 'unary':
      return namesIn(tree.operand);
    case 'binary':
      return [...namesIn(tree.left), ...namesIn(tree.right)];
  }
}

class Reader {
  private pos = 0;

  constructor(private readonly tokens: readonly Token[]) {}

  whole(): ExprNode {
    const tree = this.sum();
    const rest = this.tokens[this.pos];
    if (rest !== undefined) throw this.unexpected(rest);
    return tree;
  }

  private peek(ahead = 0): Token | undefined {
    return this.tokens[this.pos + ahead];
  }

  private take(...puncts: Punct[]): Token | undefined {
    const t = this.peek();
    if (!isPunct(t, ...puncts)) return undefined;
    this.pos++;
    return t;
  }

  private sum(): ExprNode {
    let left = this.product();
    for (let op = this.take('+', '-'); op !== undefined; op = this.take('+', '-')) left = binary(op, left, this.product());
    return left;
  }

  private product(): ExprNode {
    let left = this.unary();
    for (let op = this.take('*', '/'); op !== undefined; op = this.take('*', '/')) left = binary(op, left, this.unary());
    return left;
  }

  private unary(): ExprNode {
    const sign = this.take('-', '+');
    if (sign === undefined) return this.power();
    const operand = this.unary();
    return { kind: 'unary', operator: sign.punct as '-' | '+', operand, range: spanning(sign.range, operand.range) };
  }

  private power(): ExprNode {
    const base = this.primary();
    const op = this.take('^');
    return op === undefined ? base : binary(op, base, this.unary());
  }

  private primary(): ExprNode {
    const t = this.peek();
    if (t === undefined) {
      throw problem(this.tokens[this.tokens.length - 1].range, 'this expression ends too early: a value is missing', { hint: WHAT_EXPRESSIONS_USE });
    }
    if (t.kind === 'number') {
      this.pos++;
      return this.number(t);
    }
    if (t.kind === 'name') {
      this.pos++;
      if (isPunct(this.peek(), '(')) return this.call(t);
      if (isFunctionName(t.text)) throw problem(t.range, `${t.text} is a function: write ${t.text}(x)`);
      return { kind: 'name', name: t.text, range: t.range };
    }
    if (isPunct(t, '(')) {
      this.pos++;
      const empty = this.take(')');
      if (empty !== undefined) throw nothingInside(spanning(t.range, empty.range));
      const inner = this.sum();
      const close = this.close(t);
      return { ...inner, range: spanning(t.range, close.range) };
    }
    if (isPunct(t, '+', '-', '*', '/', '^', ')', ',')) throw problem(t.range, 'a value is missing here', { hint: WHAT_EXPRESSIONS_USE });
    throw cannotAppear(t);
  }

  /** A number, with a unit standing apart after it (`1 kHz`, `10 Ω`) taken in. */
  private number(t: Token): ExprNode {
    const value = t.value ?? NaN;
    const unit = t.unit ?? null;
    const u = this.peek();
    // `1 kHz(…)` would be a call, not a unit.
    const apart = isPunct(this.peek(1), '(') ? null : separateUnit(u);
    if (apart === null || u === undefined) return { kind: 'number', value, unit, range: t.range };
    if (unit !== null) throw problem(u.range, `\`${t.text}\` already has a unit; \`${u.text}\` is one too many`);
    if (apart.prefixed && t.prefixed === true) {
      throw problem(u.range, `\`${t.text}\` has an SI prefix already; \`${u.text}\` would add a second`, { hint: `write ${t.text}${apart.unit}` });
    }
    this.pos++;
    return { kind: 'number', value: value * apart.multiplier, unit: apart.unit, range: spanning(t.range, u.range) };
  }

  private call(name: Token): ExprNode {
    if (!isFunctionName(name.text)) {
      const near = didYouMean(name.text, FUNCTION_WORDS);
      throw problem(name.range, `\`${name.text}\` is not a function the language knows`, {
        code: 'unknown-function',
        hint: suggestionHint(near, `the functions are ${FUNCTION_LIST}`),
        fix: near.fix,
      });
    }
    const open = this.peek() as Token;
    this.pos++;
    const args: ExprNode[] = [];
    let close = this.take(')');
    while (close === undefined) {
      args.push(this.sum());
      if (this.take(',') === undefined) close = this.close(open);
    }
    const arity = FUNCTIONS[name.text];
    if (arity === 1 && args.length !== 1) {
      throw problem(name.range, `${name.text} takes one value; this gives it ${args.length === 0 ? 'none' : args.length}`);
    }
    if (arity === 'many' && args.length === 0) throw problem(name.range, `${name.text} needs at least one value`);
    return { kind: 'call', name: name.text, args, nameRange: name.range, range: spanning(name.range, close.range) };
  }

  /** The `)` that closes `open`. */
  private close(open: Token): Token {
    const t = this.take(')');
    if (t !== undefined) return t;
    const next = this.peek();
    if (next === undefined) {
      throw problem(open.range, 'this `(` is never closed', {
        code: 'unclosed-parenthesis',
        hint: 'an expression in parentheses ends with `)` on the same line',
      });
    }
    throw this.unexpected(next);
  }

  /** `t` follows a complete value where an operator, `,` or `)` belongs. */
  private unexpected(t: Token): Problem {
    if (t.kind === 'number' || t.kind === 'name' || isPunct(t, '(')) {
      const before = this.tokens[this.pos - 1];
      return problem(t.range, `two values side by side: \`${before.text}\` and \`${t.text}\``, {
        hint: 'put an operator between them, such as * for a product',
      });
    }
    if (isPunct(t, ',')) return problem(t.range, 'a comma only separates the arguments of a function, as in min(a, b)');
    if (isPunct(t, ')')) return problem(t.range, 'this `)` has no `(` to close');
    return cannotAppear(t);
  }
}

function binary(op: Token, left: ExprNode, right: ExprNode): ExprNode {
  return { kind: 'binary', operator: op.punct as BinaryOperator, left, right, range: spanning(left.range, right.range) };
}

function nothingInside(range: SourceRange): Problem {
  return problem(range, 'the parentheses hold nothing', { hint: 'write an expression inside them, like (2*Cb)' });
}

function cannotAppear(t: Token): Problem {
  return problem(t.range, `\`${t.text}\` cannot appear in an expression`, { hint: WHAT_EXPRESSIONS_USE });
}
