/**
 * Expressions in values: `(2*Cb)`, `let f0 = 1/(2*pi*R*C)`. expr-parser.ts reads the
 * lexer's tokens into a tree (so SI prefixes, IEC forms and dotted names are read once, by
 * the lexer); this module looks its names up and computes it over the language's short list
 * of operators and functions. Units written on numbers are carried along so that a value's
 * unit can be checked where it is used.
 */
import type { SourceRange } from './circuit.js';
import type { Diagnostic } from './result.js';
import { lex } from './lexer.js';
import type { Token } from './lexer.js';
import type { Unit } from './vocabulary.js';
import { diagnostic } from './diagnostic.js';
import { namesIn, parseExpression } from './expr-parser.js';
import type { ExprNode } from './expr-parser.js';
import { CONSTANTS, isConstantName } from './vocabulary.js';
import type { FunctionName } from './vocabulary.js';

/** A value's unit: known, none (a plain number), or a product the language does not track. */
export type ExprUnit = Unit | null | 'compound';

export interface Quantity {
  value: number;
  unit: ExprUnit;
}

/** Looks a name up: its value, or the diagnostic that says why it has none. */
export type Resolve = (name: string, range: SourceRange) => Quantity | Diagnostic;

/** What each function of the vocabulary computes. */
const APPLY: Readonly<Record<FunctionName, (args: number[]) => number>> = {
  sqrt: ([x]) => Math.sqrt(x),
  exp: ([x]) => Math.exp(x),
  ln: ([x]) => Math.log(x),
  log10: ([x]) => Math.log10(x),
  sin: ([x]) => Math.sin(x),
  cos: ([x]) => Math.cos(x),
  tan: ([x]) => Math.tan(x),
  atan: ([x]) => Math.atan(x),
  abs: ([x]) => Math.abs(x),
  min: (xs) => Math.min(...xs),
  max: (xs) => Math.max(...xs),
};

export type Evaluation = { ok: true; quantity: Quantity } | { ok: false; diagnostics: Diagnostic[] };

/**
 * Evaluates an expression's tokens. `range` is the whole expression's (for problems that
 * belong to no one token). Never throws.
 */
export function evaluateTokens(tokens: readonly Token[], range: SourceRange, resolve: Resolve): Evaluation {
  try {
    return evaluateUnsafe(tokens, range, resolve);
  } catch (e) {
    const why = e instanceof Error ? e.message : String(e);
    return { ok: false, diagnostics: [diagnostic(range, 'bad-expression', `this expression cannot be evaluated (${why})`)] };
  }
}

function evaluateUnsafe(tokens: readonly Token[], range: SourceRange, resolve: Resolve): Evaluation {
  const parsed = parseExpression(tokens, range);
  if (!parsed.ok) return parsed;
  // Every name is looked up first, so that all the undefined ones are reported together.
  const known = new Map<ExprNode, Quantity>();
  const unresolved: Diagnostic[] = [];
  for (const n of namesIn(parsed.tree)) {
    const found = isConstantName(n.name) ? { value: CONSTANTS[n.name], unit: null } : resolve(n.name, n.range);
    if ('code' in found) unresolved.push(found);
    else known.set(n, { ...found });
  }
  if (unresolved.length > 0) return { ok: false, diagnostics: unresolved };
  const q = compute(parsed.tree, known);
  return 'code' in q ? { ok: false, diagnostics: [q] } : { ok: true, quantity: q };
}

/**
 * The node's value and unit, or the first problem met in reading order. A value that is
 * not finite is a problem where it first appears, even if the whole would come out finite
 * (`1/(1/0)`): a division by zero anywhere is a mistake to point at, not a number to use.
 */
function compute(node: ExprNode, known: ReadonlyMap<ExprNode, Quantity>): Quantity | Diagnostic {
  switch (node.kind) {
    case 'number':
      return finite(node, [], { value: node.value, unit: node.unit });
    case 'name': {
      const q = known.get(node);
      if (q === undefined) throw new Error(`the name ${node.name} was not looked up`);
      return finite(node, [], q);
    }
    case 'unary': {
      const a = compute(node.operand, known);
      if ('code' in a) return a;
      return node.operator === '-' ? { value: -a.value, unit: a.unit } : a;
    }
    case 'binary': {
      const a = compute(node.left, known);
      if ('code' in a) return a;
      const b = compute(node.right, known);
      if ('code' in b) return b;
      const q = combine(node, a, b);
      return 'code' in q ? q : finite(node, [a.value, b.value], q);
    }
    case 'call': {
      const qs: Quantity[] = [];
      for (const arg of node.args) {
        const q = compute(arg, known);
        if ('code' in q) return q;
        qs.push(q);
      }
      const q = apply(node, qs);
      return 'code' in q
        ? q
        : finite(
            node,
            qs.map((x) => x.value),
            q,
          );
    }
  }
}

/** `q` if its value is finite; else why not, at `node`, whose operands were finite. */
function finite(node: ExprNode, operands: readonly number[], q: Quantity): Quantity | Diagnostic {
  if (Number.isFinite(q.value)) return q;
  return diagnostic(node.range, 'bad-expression', whyNotFinite(node, operands, q.value));
}

function whyNotFinite(node: ExprNode, [a, b]: readonly number[], value: number): string {
  if (node.kind === 'binary' && node.operator === '/' && b === 0) {
    return a === 0 ? 'this expression has no value (zero divided by zero)' : 'this expression is infinite (a division by zero?)';
  }
  if (node.kind === 'binary' && node.operator === '^') {
    if (a === 0 && b < 0) return 'this expression is infinite (zero to a negative power)';
    if (Number.isNaN(value)) return 'this expression has no value (a fractional power of a negative number)';
  }
  if (node.kind === 'call' && (node.name === 'ln' || node.name === 'log10') && a === 0) return 'this expression is infinite (the logarithm of zero)';
  if (Number.isNaN(value)) return 'this expression has no value (a square root or logarithm of a negative number?)';
  return 'this expression is too large to compute (beyond ±1.8e308)';
}

function describeUnit(u: ExprUnit): string {
  return u === null ? 'a plain number' : u === 'compound' ? 'a product of units' : u;
}

/** One operator applied, with the unit of its result. */
function combine(node: Extract<ExprNode, { kind: 'binary' }>, a: Quantity, b: Quantity): Quantity | Diagnostic {
  switch (node.operator) {
    case '+':
    case '-': {
      const unit = sameUnit(a.unit, b.unit);
      if (unit === undefined) {
        const verb = node.operator === '+' ? 'add' : 'subtract';
        return diagnostic(node.range, 'unit-mismatch', `cannot ${verb} ${describeUnit(a.unit)} and ${describeUnit(b.unit)}`);
      }
      return { value: node.operator === '+' ? a.value + b.value : a.value - b.value, unit };
    }
    case '*':
      return { value: a.value * b.value, unit: a.unit === null ? b.unit : b.unit === null ? a.unit : 'compound' };
    case '/': {
      const unit = b.unit === null ? a.unit : a.unit !== null && a.unit === b.unit && a.unit !== 'compound' ? null : 'compound';
      return { value: a.value / b.value, unit };
    }
    case '^':
      return { value: a.value ** b.value, unit: a.unit === null ? null : 'compound' };
  }
}

/** One function applied, with the unit of its result. */
function apply(node: Extract<ExprNode, { kind: 'call' }>, qs: Quantity[]): Quantity | Diagnostic {
  const name = node.name;
  const value = APPLY[name](qs.map((q) => q.value));
  if (name === 'abs' || name === 'min' || name === 'max') {
    let unit: ExprUnit | undefined = qs[0].unit;
    for (const q of qs.slice(1)) unit = unit === undefined ? undefined : sameUnit(unit, q.unit);
    if (unit === undefined) return diagnostic(node.nameRange, 'unit-mismatch', `${name} compares values in different units`);
    return { value, unit };
  }
  return { value, unit: name === 'sqrt' && qs[0].unit !== null ? 'compound' : null };
}

/** The unit of a sum: the same on both sides, or taken from the side that has one. */
function sameUnit(a: ExprUnit, b: ExprUnit): ExprUnit | undefined {
  if (a === null) return b;
  if (b === null) return a;
  if (a === 'compound' || b === 'compound') return 'compound';
  return a === b ? a : undefined;
}

/**
 * Evaluates an expression written as text, for tools and tests: `evaluateExpression('2*pi*1k')`.
 * Names are looked up in `params`. Returns the value, or the first problem in plain words.
 */
export function evaluateExpression(text: string, params: Readonly<Record<string, number>> = {}): { value: number; unit: ExprUnit } | { error: string } {
  try {
    const lexed = lex(text);
    if (lexed.diagnostics.length > 0) return { error: lexed.diagnostics[0].message };
    const tokens = lexed.lines.flatMap((l) => l.tokens);
    const range: SourceRange = { line: 1, column: 1, endColumn: Math.max(1, text.length) + 1 };
    const result = evaluateTokens(tokens, range, (name, r) =>
      Object.prototype.hasOwnProperty.call(params, name)
        ? { value: params[name], unit: null }
        : diagnostic(r, 'undefined-name', `there is no parameter named \`${name}\``),
    );
    if (result.ok) return { value: result.quantity.value, unit: result.quantity.unit };
    return { error: result.diagnostics[0]?.message ?? 'this expression cannot be read' };
  } catch (e) {
    return { error: e instanceof Error ? e.message : String(e) };
  }
}
