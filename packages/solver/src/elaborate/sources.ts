/** Sources and links: controlled sources (transfer functions included), ideal transformers and loop breaks. */
import type { Element } from '../circuit.js';
import type { BreakStatement, ControlledStatement, TransformerStatement } from '../ast.js';
import { formatSi } from '../units.js';
import { GROUND } from '../vocabulary.js';
import type { Elaboration, Scope } from './context.js';
import { addElement, checkTwoTerminal, fromDb, whereIn } from './elements.js';
import { transferSource } from './transfer.js';
import { bound, read } from './values.js';
import type { Slot } from './values.js';

/** A controlled source: a gain, a transconductance, a current-controlled source or a transfer function. */
export function controlled(cx: Elaboration, scope: Scope, st: ControlledStatement): void {
  const name = scope.prefix + st.designator.name;
  const line = st.range.line;
  const four = st.mode === 'vgain' || st.mode === 'gm' || st.response !== undefined;
  if (st.nodes.nodes.length !== (four ? 4 : 2)) return;
  const nodes = st.nodes.nodes.map((id) => cx.node(scope, id, name, scope.prefix === ''));
  const where = whereIn(cx, scope);
  if (st.response !== undefined) {
    const element = transferSource(cx, scope, { ...st, response: st.response }, name, nodes, where);
    if (element !== null) addElement(cx, element, st.designator);
    return;
  }
  if (st.value === null) return;
  const slots: Record<string, Slot> = {
    vgain: { says: 'vgain is a voltage gain, in V/V or dB', units: ['dB'], convert: fromDb, example: '10' },
    gm: { says: 'gm is a transconductance, in S', units: ['S'], example: '1m' },
    igain: { says: 'igain is a current gain, in A/A or dB', units: ['dB'], convert: fromDb, example: '10' },
    rm: { says: 'rm is a transresistance, in Ω', units: ['Ω'], example: '1k' },
  };
  const x = read(cx, scope, st.value, line, slots[st.mode], where);
  if (x === null) return;
  const [op, on] = nodes;
  if (four) {
    const [, , cp, cn] = nodes;
    const element: Element =
      st.mode === 'vgain' ? { kind: 'vcvs', name, range: st.range, op, on, cp, cn, gain: x } : { kind: 'vccs', name, range: st.range, op, on, cp, cn, gm: x };
    addElement(cx, element, st.designator);
    return;
  }
  if (st.control === null) return;
  const control = st.control;
  const controlName = scope.prefix + control.name;
  const element: Element =
    st.mode === 'igain'
      ? { kind: 'cccs', name, range: st.range, op, on, control: controlName, gain: x }
      : { kind: 'ccvs', name, range: st.range, op, on, control: controlName, rm: x };
  addElement(cx, element, st.designator);
  cx.pending.push(() => checkTwoTerminal(cx, scope, control, controlName, `${st.mode} of`));
}

/** An ideal transformer: four nodes, and a turns ratio above 0. */
export function transformer(cx: Elaboration, scope: Scope, st: TransformerStatement): void {
  const name = scope.prefix + st.designator.name;
  if (st.nodes.nodes.length !== 4 || st.turns === null) return;
  const [p1, p2, s1, s2] = st.nodes.nodes.map((id) => cx.node(scope, id, name, scope.prefix === ''));
  const where = whereIn(cx, scope);
  const turns = read(cx, scope, st.turns, st.range.line, { says: 'a turns ratio is a plain number', units: [], example: '2' }, where);
  if (turns === null) return;
  const hint = 'turns is the secondary’s turns per primary turn, like 10 for a 1:10 step-up or 0.1 for 10:1; to reverse a winding, swap its two nodes';
  if (!bound(cx, st.turns, turns > 0, `a turns ratio must be more than 0; it is ${formatSi(turns)}${where}`, hint)) return;
  const [a, , c] = st.nodes.nodes;
  if (p1 === p2 || s1 === s2) {
    const x = p1 === p2 ? a : c;
    cx.error(st.nodes.range, 'shorted-part', `${st.designator.name} has both ends of a winding on node ${x.name}`, 'a winding joins two different nodes');
    return;
  }
  addElement(cx, { kind: 'transformer', name, range: st.range, p1, p2, s1, s2, turns }, st.designator);
}

/** A loop break: two different nodes, neither of them gnd (the loop's voltages are read on both sides). */
export function loopBreak(cx: Elaboration, scope: Scope, st: BreakStatement): void {
  const name = scope.prefix + st.designator.name;
  if (st.nodes.nodes.length !== 2) return;
  const [from, to] = st.nodes.nodes.map((id) => cx.node(scope, id, name, scope.prefix === ''));
  const onGround = st.nodes.nodes.find((id) => id.name === GROUND);
  if (onGround !== undefined) {
    cx.error(
      onGround.range,
      'bad-break',
      `a loop break cannot have an end on gnd: the loop is read as voltages on both its sides`,
      'put it in the wire the loop’s signal runs along, like [out n]',
    );
    return;
  }
  if (from === to) {
    cx.error(st.nodes.range, 'shorted-part', `${st.designator.name} has both ends on node ${st.nodes.nodes[0].name}`, 'a loop break joins two different nodes');
    return;
  }
  addElement(cx, { kind: 'loop-break', name, range: st.range, from, to }, st.designator);
}
