/** Whole-network checks, once every line is read: a drive for the traces, a path to ground for every node, nodes that touch one part. */
import type { TraceSpec } from '../circuit.js';
import type { DriveStatement, ShowStatement } from '../ast.js';
import { GROUND } from '../vocabulary.js';
import { CASCADE, GROUND_LOOKALIKE } from './context.js';
import type { Elaboration, NodeInfo } from './context.js';
import { labelOf } from './show.js';

/** Beyond this many, nodes that touch only one part are counted in one warning. */
const MAX_DANGLING = 100;

/** Checks that need the whole cell read: a drive for the traces that need one, something shown, and (when nothing else is wrong) connectivity. */
export function wholeCellChecks(cx: Elaboration, shows: ShowStatement[], traces: (TraceSpec | null)[], drives: DriveStatement[]): void {
  if (cx.program.incomplete) return;
  const parts = cx.program.statements.filter(
    (s) => s.kind === 'passive' || s.kind === 'opamp' || s.kind === 'controlled' || s.kind === 'transformer' || s.kind === 'break' || s.kind === 'use',
  );
  // An impedance and a loop opened at a loop break bring their own test source.
  const needsDrive = shows.filter((s, i) => traces[i]?.kind !== 'impedance' && s.expr.kind !== 'impedance' && s.expr.kind !== 'break');
  if (drives.length === 0 && needsDrive.length > 0) {
    const st = needsDrive[0];
    cx.error(
      st.range,
      'no-drive',
      `this cell has no drive, so ${labelOf(st)} has nothing to be compared with`,
      'add a drive line, like drive in (1 V between in and gnd)',
    );
  }
  if (shows.length === 0 && parts.length > 0) {
    cx.warn(parts[0].range, 'no-trace', 'this cell shows nothing', 'add a show line, like show out');
  }
  if (cx.diagnostics.some((d) => d.severity === 'error' && d.code !== CASCADE)) return;
  connectivity(cx, shows);
}

function connectivity(cx: Elaboration, shows: ShowStatement[]): void {
  const count = cx.nodes.length;
  const parent = Array.from({ length: count }, (_, i) => i);
  const find = (x: number): number => {
    while (parent[x] !== x) {
      parent[x] = parent[parent[x]];
      x = parent[x];
    }
    return x;
  };
  const join = (a: number, b: number) => {
    const ra = find(a);
    const rb = find(b);
    if (ra !== rb) parent[ra] = rb;
  };
  for (const e of cx.elements) {
    switch (e.kind) {
      case 'resistor':
      case 'capacitor':
      case 'inductor':
        join(e.a, e.b);
        break;
      case 'opamp':
        join(e.o, 0);
        break;
      case 'vcvs':
      case 'ccvs':
        join(e.op, e.on);
        break;
      case 'loop-break':
        join(e.from, e.to);
        break;
      case 'transfer':
        join(e.op, e.on);
        break;
      case 'transformer':
        // Each winding's voltage is set through the other, as a source's is; its common mode is not.
        join(e.p1, e.p2);
        join(e.s1, e.s2);
        break;
      default:
        break;
    }
  }
  if (cx.drive !== null && cx.drive.kind === 'voltage') join(cx.drive.p, cx.drive.n);

  const ground = find(0);
  const floating = new Map<number, number[]>();
  for (let i = 1; i < count; i++) {
    const r = find(i);
    if (r === ground) continue;
    const group = floating.get(r) ?? [];
    group.push(i);
    floating.set(r, group);
  }
  const reported = new Set<string>();
  for (const group of floating.values()) {
    const first = cx.nodes[group[0]];
    const key = `${first.range.line}:${first.range.column}`;
    if (reported.has(key)) continue;
    reported.add(key);
    const names = group.map((i) => cx.nodes[i].name);
    const list = names.length <= 5 ? joinWords(names) : `${names.slice(0, 4).join(', ')} and ${names.length - 4} more`;
    cx.error(
      first.range,
      'no-path-to-ground',
      names.length === 1 ? `node ${names[0]} has no path to gnd` : `nodes ${list} have no path to gnd`,
      `connect ${names.length === 1 ? 'it' : 'them'} to gnd through parts, a voltage source or an op-amp output; op-amp inputs, control pins and current sources do not make a path`,
    );
  }

  const shown = new Set<string>();
  for (const s of shows) for (const n of nodesOf(s)) shown.add(n);
  const names = cx.nodes.map((n) => n.name);
  let dangling = 0;
  for (let i = 1; i < count; i++) {
    const node = cx.nodes[i];
    if (node.touches.size !== 1 || shown.has(node.name) || floating.has(find(i)) || GROUND_LOOKALIKE.test(node.name)) continue;
    const key = `${node.range.line}:${node.range.column}`;
    if (reported.has(key)) continue;
    reported.add(key);
    if (++dangling > MAX_DANGLING) continue;
    const [only] = [...node.touches];
    const near = cx.near(
      node.name,
      names.filter((n) => n !== node.name && n !== GROUND),
    );
    const onlyLocal = node.block !== null && only.includes('.') ? only.slice(only.lastIndexOf('.') + 1) : only;
    cx.warn(
      node.range,
      'dangling-node',
      node.block === null ? `node ${node.name} connects only to ${only}` : `node ${node.local} of block ${node.block} connects only to ${onlyLocal}`,
      near.question !== undefined ? `a misspelt node name? ${near.question}` : 'a node usually joins two or more parts; check the spelling',
      node.block === null ? near.fix : undefined,
    );
  }
  if (dangling > MAX_DANGLING) {
    const first = cx.nodes.find((n, i) => i > 0 && n.touches.size === 1) as NodeInfo;
    cx.warn(
      first.range,
      'dangling-node',
      `${(dangling - MAX_DANGLING).toLocaleString('en-US')} more nodes connect to only one part`,
      'the first ' + MAX_DANGLING + ' are marked where they are written',
    );
  }
}

function nodesOf(st: ShowStatement): string[] {
  const e = st.expr;
  switch (e.kind) {
    case 'node':
      return [e.node.name];
    case 'difference':
      return [e.p.name, e.n.name];
    case 'ratio':
      return [e.num.name, e.den.name];
    case 'impedance':
      return e.n === null ? [e.p.name] : [e.p.name, e.n.name];
    case 'sum':
      return e.terms.map((t) => t.node.name);
    case 'current':
    case 'break':
      return [];
  }
}

function joinWords(names: string[]): string {
  if (names.length <= 1) return names.join('');
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}
