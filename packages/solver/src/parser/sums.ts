/** Sums and scales of traces in a `show` line (`out + a`, `2 * out`, `out - 0.5 * a`), and the canonical words of a trace. */
import type { SumTerm, TraceExpr, Value } from '../ast.js';
import type { Token } from '../lexer.js';
import type { Cursor } from './cursor.js';
import { show } from './cursor.js';
import { nodeName, value } from './values.js';

const SUM_HINT = 'a sum of traces is written like show out + a, show 2 * out or show out - 0.5 * a';

const isPunctToken = (t: Token, p: string): boolean => t.kind === 'punct' && t.punct === p;

/**
 * Whether the rest of the line is a sum rather than a node, a difference or a ratio: it
 * has a `+` or a `*`, starts with a sign, or has more than one `-`.
 */
export function isSum(cur: Cursor): boolean {
  const rest = cur.tokens.slice(cur.pos);
  if (rest.length === 0) return false;
  if (isPunctToken(rest[0], '-') || isPunctToken(rest[0], '+')) return true;
  return rest.some((t) => isPunctToken(t, '+') || isPunctToken(t, '*')) || rest.filter((t) => isPunctToken(t, '-')).length > 1;
}

/** `± [FACTOR *] NODE { ± [FACTOR *] NODE }`, where a factor is a number, a parameter or an expression in parentheses. */
export function sumExpr(cur: Cursor): TraceExpr {
  const start = cur.pos;
  const terms: SumTerm[] = [];
  let sign: 1 | -1 = 1;
  if (cur.isPunct('-') || cur.isPunct('+')) sign = (cur.next() as Token).punct === '-' ? -1 : 1;
  for (;;) {
    let factor: Value | null = null;
    const t = cur.peek();
    if (t === undefined) cur.error(cur.here(), 'missing-node', `a node is missing after ${show(cur.tokens[cur.pos - 1])}`, SUM_HINT);
    const after = cur.peek(2);
    if (t.kind === 'name' && cur.isPunct('*', 1) && after !== undefined && (after.kind === 'number' || isPunctToken(after, '('))) {
      cur.error((cur.peek(1) as Token).range, 'bad-trace', 'write the factor before the node, like 2 * out', SUM_HINT);
    }
    if (t.kind !== 'name' || cur.isPunct('*', 1)) {
      factor = value(cur, 'the factor', [], SUM_HINT);
      if (factor === null) cur.error(cur.here(), 'bad-trace', 'a term of a sum is a node, or a factor times a node', SUM_HINT);
      cur.expect('*', 'bad-trace', 'a factor multiplies a node: write it like 2 * out', SUM_HINT);
    }
    const node = nodeName(cur, 'the node after *');
    terms.push({ sign, factor, node });
    const op = cur.peek();
    if (op === undefined) break;
    if (isPunctToken(op, '+') || isPunctToken(op, '-')) {
      cur.next();
      sign = op.punct === '-' ? -1 : 1;
      continue;
    }
    if (isPunctToken(op, '*')) cur.error(op.range, 'bad-trace', 'write the factor before the node, like 2 * out', SUM_HINT);
    if (isPunctToken(op, '/')) cur.error(op.range, 'bad-trace', 'a sum cannot be divided: a ratio is of two nodes, like show out / in', SUM_HINT);
    break;
  }
  return { kind: 'sum', terms, text: canonicalWords(cur.tokens.slice(start, cur.pos)) };
}

/**
 * A trace's words in canonical spacing, as a `show` line and a requirement's target both
 * write them: operators spaced (`out - 0.5 * a`), brackets and parentheses tight (`[a b]`,
 * `(R2 / R1)`).
 */
export function canonicalWords(tokens: readonly Token[]): string {
  const words = tokens.map((t) => {
    if (t.kind === 'punct' && (t.punct === '-' || t.punct === '/' || t.punct === '+' || t.punct === '*')) return ` ${t.punct} `;
    if (t.kind === 'punct' && (t.punct === '[' || t.punct === '(')) return ` ${t.punct}`;
    if (t.kind === 'punct' && (t.punct === ']' || t.punct === ')')) return t.punct;
    return ` ${t.text}`;
  });
  return words
    .join('')
    .replace(/\s+/g, ' ')
    .replace(/([[(]) /g, '$1')
    .trim();
}
