/** The transfer-function forms of an A part: `transfer EXPR` (a ratio of polynomials in s) and `poles … [zeros …] [gain K]`. */
import type { ResponseRoot, ResponseSpec, Value } from '../ast.js';
import { LAPLACE_VARIABLE, RESPONSE_WORDS } from '../vocabulary.js';
import { StatementError, merge } from './cursor.js';
import type { Cursor } from './cursor.js';
import { value } from './values.js';

const [ZEROS, Q, GAIN] = RESPONSE_WORDS;

/** `transfer EXPR`: the rest of the line is one expression in s, with or without parentheses (as in `let`). */
export function transferExpr(cur: Cursor, designator: string): ResponseSpec {
  const hint = `write ${designator} [o+ o- c+ c-] transfer 1/(1 + ${LAPLACE_VARIABLE}/(2*pi*1k)), a ratio of polynomials in ${LAPLACE_VARIABLE} (rad/s)`;
  const rest = cur.tokens.slice(cur.pos);
  if (rest.length === 0) return { form: 'transfer', expr: value(cur, 'the transfer function after transfer', [], hint) };
  const save = cur.pos;
  const count = cur.diagnostics.length;
  const single = value(cur, 'the transfer function');
  if (single !== null && cur.atEnd()) return { form: 'transfer', expr: single };
  cur.pos = save;
  cur.diagnostics.length = count;
  const last = rest[rest.length - 1];
  const range = merge(rest[0].range, last.range);
  const expr: Value = { kind: 'expr', tokens: rest, text: cur.line.text.slice(range.column - 1, range.endColumn - 1), range };
  cur.pos = cur.tokens.length;
  return { form: 'transfer', expr };
}

/** `poles F [q Q], … [zeros F [q Q], …] [gain K]`. */
export function polesAndZeros(cur: Cursor, designator: string): ResponseSpec {
  const hint = `write ${designator} [o+ o- c+ c-] poles 1k q 0.7, 20k zeros 5k gain 20dB: frequencies in Hz, a Q for a pair, the gain at 0 Hz`;
  const poles = roots(cur, 'a pole', hint);
  let zeros: ResponseRoot[] = [];
  let gain: Value | null = null;
  if (cur.eat(ZEROS) !== undefined) zeros = roots(cur, 'a zero', hint);
  if (cur.eat(GAIN) !== undefined) gain = value(cur, 'the gain after gain', [], hint);
  cur.finish('the transfer function', hint);
  return { form: 'poles', poles, zeros, gain };
}

function roots(cur: Cursor, what: string, hint: string): ResponseRoot[] {
  const list: ResponseRoot[] = [];
  for (;;) {
    const f = value(cur, `${what}’s frequency`, RESPONSE_WORDS, hint);
    if (f === null) throw new StatementError(what);
    let q: Value | null = null;
    if (cur.eat(Q) !== undefined) q = value(cur, `the Q after ${Q}`, RESPONSE_WORDS, hint);
    list.push({ f, q });
    if (cur.eat(',') === undefined) return list;
  }
}
