/** `show` lines: what each trace reads, and its label. */
import type { Probe, TraceKind, TraceSpec } from '../circuit.js';
import type { ShowStatement, SumTerm } from '../ast.js';
import type { Elaboration } from './context.js';
import { checkTwoTerminal } from './elements.js';
import { read } from './values.js';
import { suggestionHint } from '../suggest.js';

/** The trace a `show` line reads, or null (with the reason reported). */
export function showStatement(cx: Elaboration, st: ShowStatement): TraceSpec | null {
  const e = st.expr;
  let probe: Probe | null = null;
  switch (e.kind) {
    case 'node': {
      const p = cx.existingNode(e.node);
      if (p === null) return null;
      if (p === 0) {
        cx.error(e.node.range, 'bad-trace', 'gnd is 0 V by definition, so there is nothing to show', 'show another node');
        return null;
      }
      probe = { kind: 'voltage', p, n: 0 };
      break;
    }
    case 'difference': {
      const p = cx.existingNode(e.p);
      const n = cx.existingNode(e.n);
      if (p === null || n === null) return null;
      if (p === n) {
        cx.error(st.exprRange, 'bad-trace', `${e.p.name} - ${e.n.name} is 0 by definition`, 'show the difference of two different nodes');
        return null;
      }
      probe = { kind: 'voltage', p, n };
      break;
    }
    case 'ratio': {
      const num = cx.existingNode(e.num);
      const den = cx.existingNode(e.den);
      if (num === null || den === null) return null;
      if (den === 0) {
        cx.error(e.den.range, 'bad-trace', 'the ratio divides by V(gnd), which is 0', 'divide by the voltage of another node');
        return null;
      }
      probe = { kind: 'ratio', num, den };
      break;
    }
    case 'current': {
      const full = e.element.name;
      if (!cx.elementNames.has(full) && cx.top.designators.has(full)) return null;
      if (!checkTwoTerminal(cx, cx.top, e.element, full, 'show current')) return null;
      probe = { kind: 'current', element: full };
      break;
    }
    case 'impedance': {
      const p = cx.existingNode(e.p);
      const n = e.n === null ? 0 : cx.existingNode(e.n);
      if (p === null || n === null) return null;
      if (p === n) {
        cx.error(
          st.exprRange,
          'bad-trace',
          p === 0 ? 'the impedance from gnd to gnd is 0 by definition' : `the impedance between ${e.p.name} and itself is 0 by definition`,
          'name two different nodes',
        );
        return null;
      }
      probe = { kind: 'impedance', p, n };
      break;
    }
    case 'sum':
      probe = sumProbe(cx, st, e.terms);
      if (probe === null) return null;
      break;
    case 'break': {
      const part = cx.elementNames.get(e.element.name);
      if (part === undefined) {
        if (cx.top.designators.has(e.element.name) || cx.program.brokenWords.has(e.element.name)) return null; // its own line had an error
        const names = [...cx.elementNames].filter(([, x]) => x.kind === 'loop-break').map(([n]) => n);
        const near = cx.near(e.element.name, names);
        cx.error(
          e.element.range,
          'unknown-part',
          `there is no part named ${e.element.name}`,
          suggestionHint(near, undefined, 'add a loop break in the loop, like J1 [out n] break'),
          near.fix,
        );
        return null;
      }
      if (part.kind !== 'loop-break') {
        cx.error(
          e.element.range,
          'wrong-part-kind',
          `${e.element.name} is not a loop break; show loop at names a J part`,
          'add a loop break in the loop, like J1 [out n] break',
        );
        return null;
      }
      probe = { kind: 'loop-break', element: e.element.name };
      break;
    }
  }
  const current = cx.drive?.kind === 'current';
  let kind: TraceKind;
  let unit: string;
  switch (st.mode) {
    case 'loop':
      kind = 'loop';
      unit = e.kind === 'ratio' || !current ? 'V/V' : 'V/A';
      break;
    case 'noise':
      kind = 'noise';
      unit = 'V/√Hz';
      cx.warn(st.range, 'not-available', 'noise results are not available yet: this trace is checked but not computed', 'a later version adds output noise');
      break;
    case 'step':
      // The response to a step of the drive's own amplitude: in V or A, not per unit of drive.
      kind = 'step';
      unit = e.kind === 'ratio' ? 'V/V' : e.kind === 'current' ? 'A' : 'V';
      break;
    default:
      if (e.kind === 'impedance') {
        kind = 'impedance';
        unit = 'Ω';
      } else if (e.kind === 'current') {
        kind = 'current';
        unit = current ? 'A/A' : 'A/V';
      } else if (e.kind === 'ratio') {
        kind = 'ratio';
        unit = 'V/V';
      } else {
        kind = current ? 'transimpedance' : 'ratio';
        unit = current ? 'V/A' : 'V/V';
      }
  }
  const label = st.label?.text ?? (st.mode === 'plain' ? st.exprText : `${st.mode} ${st.exprText}`);
  return { label, expr: st.exprText, kind, probe, unit, range: st.range };
}

/**
 * A sum of node voltages with constant factors: the factors read as plain numbers,
 * terms on one node merged, terms on gnd dropped. A sum that is 0 by definition is an error.
 */
function sumProbe(cx: Elaboration, st: ShowStatement, terms: SumTerm[]): Probe | null {
  const factors = new Map<number, number>();
  let ok = true;
  for (const term of terms) {
    const node = cx.existingNode(term.node);
    const factor =
      term.factor === null ? 1 : read(cx, cx.top, term.factor, st.range.line, { says: 'a factor of a sum is a plain number', units: [], example: '0.5' });
    if (node === null || factor === null) {
      ok = false;
      continue;
    }
    if (node !== 0) factors.set(node, (factors.get(node) ?? 0) + term.sign * factor);
  }
  if (!ok) return null;
  const kept = [...factors].filter(([, factor]) => factor !== 0).map(([node, factor]) => ({ node, factor }));
  if (kept.length === 0) {
    cx.error(st.exprRange, 'bad-trace', `${st.exprText} is 0 by definition`, 'its terms cancel or stand on gnd: show a sum whose factors do not cancel');
    return null;
  }
  return { kind: 'sum', terms: kept };
}

/** Two traces with the same label. */
export function checkLabels(cx: Elaboration, shows: ShowStatement[], traces: (TraceSpec | null)[]): void {
  const seen = new Map<string, number>();
  traces.forEach((t, i) => {
    if (t === null) return;
    const before = seen.get(t.label);
    if (before !== undefined) {
      const st = shows[i];
      cx.error(
        st.label?.range ?? st.exprRange,
        'duplicate-label',
        `a trace called ${t.label} is shown already, on line ${before}`,
        st.label === null ? `give one of them a label: show "${t.label} 2" ${st.exprText}` : 'give each trace a label of its own',
      );
      return;
    }
    seen.set(t.label, t.range.line);
  });
}

/** A trace’s label as written or as its show line names it. */
export function labelOf(st: ShowStatement): string {
  return st.label?.text ?? (st.mode === 'plain' ? st.exprText : `${st.mode} ${st.exprText}`);
}
