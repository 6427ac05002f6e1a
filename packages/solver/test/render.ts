/**
 * A compact, readable text form of what `compile` returns, for the fixture files in
 * test/cases: each diagnostic on one line (with its hint and fix indented below), then a
 * summary of the circuit when there is one.
 */
import type { Circuit, Element, Probe } from '../src/circuit.js';
import type { Diagnostic } from '../src/result.js';
import { formatSi } from '../src/units.js';

const num = (v: number) => formatSi(v, '', 6);

export function renderDiagnostic(d: Diagnostic): string[] {
  const lines = [`${d.line}:${d.column}-${d.endColumn} ${d.severity} ${d.code}: ${d.message}`];
  if (d.hint !== undefined) lines.push(`  hint: ${d.hint}`);
  if (d.fix !== undefined) lines.push(`  fix: ${d.fix.line}:${d.fix.column}-${d.fix.endColumn} ${JSON.stringify(d.fix.replacement)} (${d.fix.title})`);
  return lines;
}

export function renderCircuit(c: Circuit): string[] {
  const node = (i: number) => c.nodeNames[i] ?? `?${i}`;
  const nodes = (...xs: number[]) => `[${xs.map(node).join(' ')}]`;
  const out = [`nodes: ${c.nodeNames.join(' ')}`];
  for (const e of c.elements) out.push(renderElement(e, nodes));
  if (c.drive !== null) {
    const d = c.drive;
    out.push(`drive ${d.kind} ${nodes(d.p, d.n)} ${num(d.amplitude)}${d.phaseDeg !== 0 ? ` phase ${num(d.phaseDeg)}` : ''}`);
  }
  for (const t of c.traces) {
    out.push(`trace ${JSON.stringify(t.label)} ${t.kind} ${t.unit} ${renderProbe(t.probe, node)} expr ${JSON.stringify(t.expr)}`);
  }
  if (c.sweep !== null) {
    const s = c.sweep;
    if (s.kind === 'log') out.push(`sweep log ${num(s.from)} .. ${num(s.to)} ${num(s.perDecade)}/decade`);
    else if (s.kind === 'linear') out.push(`sweep linear ${num(s.from)} .. ${num(s.to)} ${s.points} points`);
    else out.push(`sweep at ${s.frequencies.map(num).join(', ')}`);
  }
  for (const r of c.requirements) {
    let line = `require line ${r.range.line} trace ${r.trace} ${r.measure} ${r.op} ${num(r.value)}`;
    if (r.tolerance !== undefined) line += r.tolerance.relative ? ` ± ${num(r.tolerance.amount * 100)}%` : ` ± ${num(r.tolerance.amount)}`;
    if (r.over !== undefined)
      line += ` over ${r.over.from === undefined ? '' : num(r.over.from) + ' '}..${r.over.to === undefined ? '' : ' ' + num(r.over.to)}`;
    if (r.at !== undefined) line += ` at ${num(r.at)}`;
    out.push(`${line} text ${JSON.stringify(r.text)}`);
  }
  if (c.tolerance !== null) {
    const t = c.tolerance;
    out.push(`tolerance ${t.kind}${t.draws !== undefined ? ` ${t.draws}` : ''}${t.seed !== undefined ? ` seed ${t.seed}` : ''}`);
  }
  if (c.temperature !== 300) out.push(`temperature ${num(c.temperature)} K`);
  if (c.time !== null) out.push(`time ${num(c.time.from)} .. ${num(c.time.to)}${c.time.points !== undefined ? ` ${c.time.points} points` : ''}`);
  return out;
}

function renderProbe(p: Probe, node: (i: number) => string): string {
  switch (p.kind) {
    case 'voltage':
      return `V(${node(p.p)}, ${node(p.n)})`;
    case 'ratio':
      return `V(${node(p.num)}) / V(${node(p.den)})`;
    case 'current':
      return `I(${p.element})`;
    case 'impedance':
      return `Z(${node(p.p)}, ${node(p.n)})`;
    case 'loop-break':
      return `T(${p.element})`;
    case 'sum':
      return p.terms.map((t) => `${num(t.factor)}·V(${node(t.node)})`).join(' + ');
  }
}

function renderElement(e: Element, nodes: (...xs: number[]) => string): string {
  const tol = 'tolerance' in e && e.tolerance !== undefined ? ` tol ${num(e.tolerance * 100)}%` : '';
  switch (e.kind) {
    case 'transfer':
      return `${e.name} transfer ${nodes(e.op, e.on, e.cp, e.cn)} num ${e.num.map(num).join(' ')} den ${e.den.map(num).join(' ')}`;
    case 'loop-break':
      return `${e.name} loop-break ${nodes(e.from, e.to)}`;
    case 'transformer':
      return `${e.name} transformer ${nodes(e.p1, e.p2, e.s1, e.s2)} turns ${num(e.turns)}`;
    case 'resistor':
      return `${e.name} resistor ${nodes(e.a, e.b)} ${num(e.value)}${tol}${e.noiseless ? ' noise off' : ''}`;
    case 'capacitor':
      return `${e.name} capacitor ${nodes(e.a, e.b)} ${num(e.value)}${tol}${e.esr !== 0 ? ` esr ${num(e.esr)}` : ''}${e.esl !== 0 ? ` esl ${num(e.esl)}` : ''}`;
    case 'inductor':
      return `${e.name} inductor ${nodes(e.a, e.b)} ${num(e.value)}${tol}${e.dcr !== 0 ? ` dcr ${num(e.dcr)}` : ''}`;
    case 'coupling':
      return `${e.name} coupling ${e.l1} ${e.l2} k ${num(e.k)}`;
    case 'opamp': {
      const opts = [
        e.gain !== undefined ? `gain ${num(e.gain)}` : '',
        e.gbw !== undefined ? `gbw ${num(e.gbw)}` : '',
        e.pole2 !== undefined ? `pole2 ${num(e.pole2)}` : '',
        e.zout !== 0 ? `zout ${num(e.zout)}` : '',
        e.en !== undefined ? `en ${num(e.en)}` : '',
        e.inoise !== undefined ? `in ${num(e.inoise)}` : '',
      ].filter((s) => s !== '');
      return `${e.name} opamp ${nodes(e.p, e.n, e.o)}${opts.length > 0 ? ' ' + opts.join(' ') : ' ideal'}`;
    }
    case 'vcvs':
      return `${e.name} vcvs ${nodes(e.op, e.on, e.cp, e.cn)} gain ${num(e.gain)}`;
    case 'vccs':
      return `${e.name} vccs ${nodes(e.op, e.on, e.cp, e.cn)} gm ${num(e.gm)}`;
    case 'cccs':
      return `${e.name} cccs ${nodes(e.op, e.on)} gain ${num(e.gain)} of ${e.control}`;
    case 'ccvs':
      return `${e.name} ccvs ${nodes(e.op, e.on)} rm ${num(e.rm)} of ${e.control}`;
  }
}

/** Everything `compile` said, as the fixture files write it. */
export function render(result: { circuit: Circuit | null; diagnostics: Diagnostic[] }): string {
  const lines = result.diagnostics.flatMap(renderDiagnostic);
  if (result.circuit !== null) lines.push('circuit:', ...renderCircuit(result.circuit).map((l) => '  ' + l));
  else lines.push('no circuit');
  return lines.join('\n');
}
