/**
 * Transfer-function sources, `A1 [o+ o- c+ c-] transfer H(s)` and `A1 [o+ o- c+ c-] poles …`:
 * the function read as a ratio of polynomials in s and checked (a denominator that is 0, a
 * pole that is not a frequency above 0 Hz).
 */
import type { ControlledStatement, ResponseRoot, ResponseSpec, Value } from '../ast.js';
import type { Element, SourceRange } from '../circuit.js';
import type { ExprNode } from '../expr-parser.js';
import { parseExpression } from '../expr-parser.js';
import { multiply, rationalOf, trim } from '../rational.js';
import type { Polynomial, Rational } from '../rational.js';
import { formatSi } from '../units.js';
import { LAPLACE_VARIABLE } from '../vocabulary.js';
import type { Elaboration, Scope } from './context.js';
import { fromDb } from './elements.js';
import { bound, evaluate, read } from './values.js';

const TWO_PI = 2 * Math.PI;

/** The source's element, or null (with the reason reported). */
export function transferSource(
  cx: Elaboration,
  scope: Scope,
  st: ControlledStatement & { response: ResponseSpec },
  name: string,
  nodes: number[],
  where: string,
): Element | null {
  const h =
    st.response.form === 'transfer' ? fromExpression(cx, scope, st.response.expr, st.range.line) : fromRoots(cx, scope, st.response, st.range.line, where);
  if (h === null) return null;
  const [op, on, cp, cn] = nodes;
  return { kind: 'transfer', name, range: st.range, op, on, cp, cn, num: h.num, den: h.den };
}

function fromExpression(cx: Elaboration, scope: Scope, v: Value | null, line: number): Rational | null {
  if (v === null) return null;
  if (v.kind !== 'expr') {
    // One number or name: a constant gain, or s alone.
    if (v.kind === 'name' && v.name === LAPLACE_VARIABLE) return { num: [0, 1], den: [1] };
    const k = read(cx, scope, v, line, { says: 'a constant transfer function is a gain, in V/V or dB', units: ['dB'], convert: fromDb, example: '10' });
    return k === null ? null : checked(cx, { num: trim([k]), den: [1] }, v.range);
  }
  const parsed = parseExpression(v.tokens, v.range);
  if (!parsed.ok) {
    cx.diagnostics.push(...parsed.diagnostics);
    return null;
  }
  // A part of the expression without s is an ordinary value: read it from its own tokens.
  const constant = (node: ExprNode): number | null => {
    const tokens = v.tokens.filter((t) => t.range.column >= node.range.column && t.range.endColumn <= node.range.endColumn);
    const q = evaluate(cx, scope, { kind: 'expr', tokens, text: '', range: node.range }, line);
    return q === null ? null : q.value;
  };
  if (scope.params.has(LAPLACE_VARIABLE) || scope.lets.has(LAPLACE_VARIABLE)) {
    cx.warn(
      v.range,
      'laplace-name',
      `${LAPLACE_VARIABLE} in a transfer function is the complex frequency, not the parameter ${LAPLACE_VARIABLE}`,
      'rename the parameter to use it here',
    );
  }
  const r = rationalOf(parsed.tree, constant);
  if (r === null) return null;
  if ('message' in r) {
    cx.error(r.range, 'bad-transfer', r.message, r.hint);
    return null;
  }
  return checked(cx, r, v.range);
}

/** A ratio whose denominator is not 0; numerator 0 is allowed but worth a word. */
function checked(cx: Elaboration, r: Rational, range: SourceRange): Rational | null {
  if (r.den.length === 0) {
    cx.error(range, 'bad-transfer', 'the denominator of this transfer function is 0', 'a transfer function divides by a polynomial in s that is not 0');
    return null;
  }
  if (!r.num.concat(r.den).every(Number.isFinite)) {
    cx.error(range, 'bad-transfer', 'a coefficient of this transfer function is too large for a number', 'scale s, say by writing s/(2*pi*1k)');
    return null;
  }
  if (r.num.length === 0) cx.warn(range, 'zero-transfer', 'this transfer function is 0 at every frequency', 'check its numerator');
  return r;
}

/**
 * `poles …, zeros …, gain K`: a real pole at F is 1/(1 + s/2πF), a pair at F with Q is
 * 1/(1 + s/(2πF·Q) + (s/2πF)²); zeros likewise upside down, a negative F in the right half
 * plane; K is the gain at 0 Hz.
 */
function fromRoots(cx: Elaboration, scope: Scope, r: ResponseSpec & { form: 'poles' }, line: number, where: string): Rational | null {
  let ok = true;
  const factor = (root: ResponseRoot, kind: 'pole' | 'zero'): Polynomial => {
    const f = read(cx, scope, root.f, line, { says: `a ${kind} is a frequency, in Hz`, units: ['Hz'], example: '1k' }, where);
    const q = root.q === null ? null : read(cx, scope, root.q, line, { says: 'a Q is a plain number', units: [], example: '0.707' }, where);
    if (f === null || (root.q !== null && q === null)) {
      ok = false;
      return [1];
    }
    const fine =
      kind === 'pole'
        ? bound(
            cx,
            root.f,
            f > 0,
            `a pole’s frequency must be more than 0 Hz; it is ${formatSi(f, 'Hz')}${where}`,
            'for a pole at 0 Hz (an integrator), write transfer with s',
          )
        : bound(
            cx,
            root.f,
            f !== 0,
            `a zero’s frequency cannot be 0 Hz${where}`,
            'for a zero at 0 Hz (a differentiator), write transfer with s; a negative frequency is a right-half-plane zero',
          );
    if (
      !fine ||
      (root.q !== null &&
        q !== null &&
        !bound(cx, root.q, q > 0, `a Q must be more than 0; it is ${formatSi(q)}${where}`, 'a Q of 0.707 is a Butterworth pair'))
    ) {
      ok = false;
      return [1];
    }
    const w = TWO_PI * f;
    return q === null ? [1, 1 / w] : [1, 1 / (w * q), 1 / (w * w)];
  };
  const num = r.zeros.reduce((p, z) => multiply(p, factor(z, 'zero')), [1] as Polynomial);
  const den = r.poles.reduce((p, z) => multiply(p, factor(z, 'pole')), [1] as Polynomial);
  let gain = 1;
  if (r.gain !== null) {
    const g = read(cx, scope, r.gain, line, { says: 'the gain at 0 Hz is in V/V or dB', units: ['dB'], convert: fromDb, example: '20dB' }, where);
    if (g === null || !bound(cx, r.gain, g !== 0, `the gain at 0 Hz cannot be 0${where}`)) ok = false;
    else gain = g;
  }
  if (!ok) return null;
  return { num: num.map((c) => c * gain), den };
}
