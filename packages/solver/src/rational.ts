/**
 * Ratios of polynomials in s, for transfer-function sources: arithmetic on coefficient
 * lists (ascending powers of s), and an expression tree read as one such ratio.
 */
import type { SourceRange } from './circuit.js';
import type { ExprNode } from './expr-parser.js';
import { LAPLACE_VARIABLE } from './vocabulary.js';

/** Coefficients in ascending powers of s: [1, 2] is 1 + 2s. */
export type Polynomial = number[];

export interface Rational {
  num: Polynomial;
  den: Polynomial;
}

/** The highest power a transfer function may have. */
export const MAX_DEGREE = 20;

/** Drops exact zeros at the top; the zero polynomial is []. */
export function trim(p: Polynomial): Polynomial {
  let n = p.length;
  while (n > 0 && p[n - 1] === 0) n--;
  return p.slice(0, n);
}

export function degree(p: Polynomial): number {
  return trim(p).length - 1;
}

export function add(a: Polynomial, b: Polynomial, sign = 1): Polynomial {
  const out = new Array<number>(Math.max(a.length, b.length)).fill(0);
  a.forEach((c, k) => (out[k] += c));
  b.forEach((c, k) => (out[k] += sign * c));
  return trim(out);
}

export function multiply(a: Polynomial, b: Polynomial): Polynomial {
  if (a.length === 0 || b.length === 0) return [];
  const out = new Array<number>(a.length + b.length - 1).fill(0);
  a.forEach((x, i) => b.forEach((y, j) => (out[i + j] += x * y)));
  return trim(out);
}

/** A problem with where it is; the caller turns it into a diagnostic. */
export interface RationalProblem {
  range: SourceRange;
  message: string;
  hint?: string;
}

/**
 * Reads a tree as a ratio of polynomials in s. `constant` gives the value of a subtree
 * that does not mention s (null: its problem has been reported, and so the whole fails
 * quietly). Never throws.
 */
export function rationalOf(tree: ExprNode, constant: (node: ExprNode) => number | null): Rational | RationalProblem | null {
  const mentions = (node: ExprNode): boolean => {
    switch (node.kind) {
      case 'number':
        return false;
      case 'name':
        return node.name === LAPLACE_VARIABLE;
      case 'unary':
        return mentions(node.operand);
      case 'binary':
        return mentions(node.left) || mentions(node.right);
      case 'call':
        return node.args.some(mentions);
    }
  };
  const tooHigh = (r: Rational, range: SourceRange): RationalProblem | Rational =>
    Math.max(degree(r.num), degree(r.den)) > MAX_DEGREE
      ? { range, message: `this transfer function is of a degree above ${MAX_DEGREE} in ${LAPLACE_VARIABLE}`, hint: 'split it into several sources in cascade' }
      : r;
  const walk = (node: ExprNode): Rational | RationalProblem | null => {
    if (!mentions(node)) {
      const c = constant(node);
      return c === null ? null : { num: trim([c]), den: [1] };
    }
    switch (node.kind) {
      case 'name':
        return { num: [0, 1], den: [1] };
      case 'call':
        return {
          range: node.range,
          message: `${node.name}(…) of ${LAPLACE_VARIABLE} is not a ratio of polynomials`,
          hint: `a transfer function uses ${LAPLACE_VARIABLE} with + - * / and whole powers only`,
        };
      case 'unary': {
        const r = walk(node.operand);
        if (r === null || 'message' in r) return r;
        return node.operator === '-' ? { num: r.num.map((c) => -c), den: r.den } : r;
      }
      case 'binary': {
        if (node.operator === '^') return power(node);
        const a = walk(node.left);
        if (a === null || 'message' in a) return a;
        const b = walk(node.right);
        if (b === null || 'message' in b) return b;
        let r: Rational;
        if (node.operator === '+' || node.operator === '-') {
          r = { num: add(multiply(a.num, b.den), multiply(b.num, a.den), node.operator === '-' ? -1 : 1), den: multiply(a.den, b.den) };
        } else if (node.operator === '*') {
          r = { num: multiply(a.num, b.num), den: multiply(a.den, b.den) };
        } else {
          if (b.num.length === 0) return { range: node.right.range, message: 'this divides by 0 at every frequency' };
          r = { num: multiply(a.num, b.den), den: multiply(a.den, b.num) };
        }
        return tooHigh(r, node.range);
      }
      case 'number':
        return { num: trim([node.value]), den: [1] };
    }
  };
  const power = (node: ExprNode & { kind: 'binary' }): Rational | RationalProblem | null => {
    if (mentions(node.right))
      return { range: node.right.range, message: `a power of ${LAPLACE_VARIABLE} is a whole number, not an expression in ${LAPLACE_VARIABLE}` };
    const n = constant(node.right);
    if (n === null) return null;
    if (!Number.isInteger(n) || Math.abs(n) > MAX_DEGREE) {
      return { range: node.right.range, message: `a power in a transfer function is a whole number from −${MAX_DEGREE} to ${MAX_DEGREE}; it is ${n}` };
    }
    const base = walk(node.left);
    if (base === null || 'message' in base) return base;
    if (n < 0 && base.num.length === 0) return { range: node.range, message: 'this divides by 0 at every frequency' };
    let r: Rational = { num: [1], den: [1] };
    for (let k = 0; k < Math.abs(n); k++) r = { num: multiply(r.num, base.num), den: multiply(r.den, base.den) };
    return tooHigh(n < 0 ? { num: r.den, den: r.num } : r, node.range);
  };
  return walk(tree);
}
