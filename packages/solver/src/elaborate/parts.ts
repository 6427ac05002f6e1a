/** Parts and blocks: each part line checked and added to the network, and each `use` of a block expanded in its own scope. */
import type { Capacitor, Element, Inductor, Resistor, SourceRange } from '../circuit.js';
import type { BlockStatement, CoupleStatement, OpAmpStatement, PassiveKind, PassiveStatement, Statement, UseStatement, Value } from '../ast.js';
import type { Quantity } from '../expr.js';
import { suggestionHint } from '../suggest.js';
import { formatSi } from '../units.js';
import { GROUND, PART_CLASSES, PASSIVES } from '../vocabulary.js';
import type { Unit } from '../vocabulary.js';
import type { Elaboration, Scope } from './context.js';
import { addElement, checkTwoTerminal, fromDb, whereIn } from './elements.js';
import { controlled, loopBreak, transformer } from './sources.js';
import { bound, checkNamespace, evaluate, letStatement, read } from './values.js';
import type { Slot } from './values.js';

const articleOfPassive = (part: PassiveKind) => PART_CLASSES[PASSIVES[part].letter].article;

/** Records every block by name; a second block of the same name is an error. */
export function registerBlocks(cx: Elaboration): void {
  for (const st of cx.program.statements) {
    if (st.kind !== 'block') continue;
    if (st.name.name === '') continue;
    const before = cx.blocks.get(st.name.name);
    if (before !== undefined) {
      cx.error(
        st.name.range,
        'duplicate-block',
        `there is a block named ${st.name.name} already, on line ${before.range.line}`,
        'give this block another name',
      );
      continue;
    }
    cx.blocks.set(st.name.name, st);
  }
}

/** Whether the network has more parts than allowed once its blocks are expanded (reported). */
export function tooLarge(cx: Elaboration): boolean {
  const statements = cx.program.statements;
  const parts = countParts(cx, statements, []);
  if (parts > cx.maxParts) {
    // Point at the use line that brings in the most parts.
    let first = statements[0];
    let most = -1;
    for (const st of statements) {
      const n = st.kind === 'use' ? countParts(cx, [st], []) : -1;
      if (n > most) [first, most] = [st, n];
    }
    cx.error(
      first.range,
      'network-too-large',
      `the network has ${parts.toLocaleString('en-US')} parts after its blocks are expanded; the limit is ${cx.maxParts.toLocaleString('en-US')}`,
      'split the network into smaller cells, or use fewer block instances',
    );
    return true;
  }
  return false;
}

/** A block that no `use` line places. */
export function warnUnusedBlocks(cx: Elaboration): void {
  for (const block of cx.blocks.values()) {
    if (!cx.usedBlocks.has(block.name.name))
      cx.warn(
        block.name.range,
        'unused-block',
        `block ${block.name.name} is never used`,
        `place it with use ${block.name.name} as B1 [${block.pins.nodes.map((p) => p.name).join(' ')}]`,
      );
  }
}

function countParts(cx: Elaboration, body: Statement[], stack: string[]): number {
  let count = 0;
  for (const st of body) {
    if (st.kind === 'passive' || st.kind === 'opamp' || st.kind === 'controlled' || st.kind === 'transformer' || st.kind === 'break' || st.kind === 'couple')
      count++;
    if (st.kind === 'use') {
      const block = cx.blocks.get(st.block.name);
      if (block === undefined || stack.includes(block.name.name)) continue;
      count += countParts(cx, block.body, [...stack, block.name.name]);
      if (count > cx.maxParts) return count;
    }
  }
  return count;
}

/** Adds the part (or the expanded block) a statement of `scope` stands for; other statements are skipped. */
export function partStatement(cx: Elaboration, scope: Scope, st: Statement): void {
  switch (st.kind) {
    case 'passive':
      return passive(cx, scope, st);
    case 'opamp':
      return opamp(cx, scope, st);
    case 'controlled':
      return controlled(cx, scope, st);
    case 'transformer':
      return transformer(cx, scope, st);
    case 'break':
      return loopBreak(cx, scope, st);
    case 'couple':
      return couple(cx, scope, st);
    case 'use':
      return use(cx, scope, st);
    default:
      return;
  }
}

function passive(cx: Elaboration, scope: Scope, st: PassiveStatement): void {
  const name = scope.prefix + st.designator.name;
  const line = st.range.line;
  if (st.nodes.nodes.length !== 2) return;
  const a = cx.node(scope, st.nodes.nodes[0], name, scope.prefix === '');
  const b = cx.node(scope, st.nodes.nodes[1], name, scope.prefix === '');
  if (st.value === null) return;
  const { unit, example } = PASSIVES[st.part];
  const article = articleOfPassive(st.part);
  const where = whereIn(cx, scope);
  const value = read(cx, scope, st.value, line, { says: `${article}’s value is in ${unit}`, units: [unit], example }, where);
  if (value === null) return;
  if (
    !bound(
      cx,
      st.value,
      value > 0,
      `${st.designator.name}’s value must be more than 0 ${unit}; it is ${formatSi(value, unit)}${where}`,
      `${article}’s value is positive, like ${example}`,
    )
  )
    return;
  let tolerance: number | undefined;
  let esr = 0;
  let esl = 0;
  let dcr = 0;
  let noiseless = false;
  let ok = true;
  for (const o of st.options) {
    if (o.kind === 'noise-off') {
      noiseless = true;
      continue;
    }
    if (o.kind === 'tolerance') {
      const t = toleranceOf(cx, scope, o.value, line, st.part, value, where);
      if (t === null) ok = false;
      else tolerance = t;
      continue;
    }
    const u: Unit = o.kind === 'esl' ? 'H' : 'Ω';
    const x = read(cx, scope, o.value, line, { says: `${o.kind} is in ${u}`, units: [u], example: o.kind === 'esl' ? '1n' : '20m' }, where);
    if (x === null || !bound(cx, o.value, x >= 0, `${o.kind} cannot be negative; it is ${formatSi(x, u)}${where}`)) {
      ok = false;
      continue;
    }
    if (o.kind === 'esr') esr = x;
    else if (o.kind === 'esl') esl = x;
    else dcr = x;
  }
  if (!ok) return;
  const base = { name, range: st.range, ...(tolerance !== undefined ? { tolerance } : {}) };
  let element: Resistor | Capacitor | Inductor;
  if (st.part === 'resistor') element = { ...base, kind: 'resistor', a, b, value, noiseless };
  else if (st.part === 'capacitor') element = { ...base, kind: 'capacitor', a, b, value, esr, esl };
  else element = { ...base, kind: 'inductor', a, b, value, dcr };
  if (a === b)
    cx.warn(st.nodes.range, 'shorted-part', `${st.designator.name} has both ends on node ${st.nodes.nodes[0].name}, so it does nothing`, 'check its nodes');
  addElement(cx, element, st.designator);
}

/** A part's tolerance as a fraction: `±1%` → 0.01; `±0.25p` on a 10 pF part → 0.025. */
function toleranceOf(cx: Elaboration, scope: Scope, v: Value, line: number, part: PassiveKind, partValue: number, where: string): number | null {
  const q = evaluate(cx, scope, v, line);
  if (q === null) return null;
  const unit = PASSIVES[part].unit;
  let fraction: number;
  // A prefixed number without a unit (±0.25p) is in the part's unit; a plain one (±5) is ambiguous.
  const prefixedNumber = v.kind === 'number' && v.prefixed === true && q.unit === null;
  if (q.unit === '%') fraction = q.value / 100;
  else if (q.unit === unit || prefixedNumber) fraction = q.value / partValue;
  else {
    const range = v.kind === 'number' && v.unitRange !== undefined ? v.unitRange : v.range;
    if (q.unit === null || q.unit === 'compound') {
      const example = { resistor: '±10 Ω', capacitor: '±0.25pF', inductor: '±1µH' }[part];
      const fix =
        v.kind === 'number'
          ? { title: `Read as ${v.text}%`, replacement: '%', range: { line: v.range.line, column: v.range.endColumn, endColumn: v.range.endColumn } }
          : undefined;
      cx.error(
        v.range,
        'tolerance-unit',
        'a tolerance needs % or the part’s unit',
        `write ±${v.kind === 'number' ? v.text : 'N'}% for a percentage, or an amount in ${unit}, like ${example}`,
        fix,
      );
    } else {
      cx.error(range, 'unit-mismatch', `${articleOfPassive(part)}’s tolerance is in % or ${unit}`, `write it like ±1%`);
    }
    return null;
  }
  if (fraction < 0) {
    cx.error(v.range, 'value-out-of-range', `a tolerance cannot be negative${where}`, 'write it like ±1%');
    return null;
  }
  if (fraction >= 1) {
    cx.error(
      v.range,
      'value-out-of-range',
      `a tolerance of ${formatSi(fraction * 100, '%')} or more leaves nothing of the part${where}`,
      'a tolerance is below 100%, like ±5%',
    );
    return null;
  }
  return fraction;
}

function opamp(cx: Elaboration, scope: Scope, st: OpAmpStatement): void {
  const name = scope.prefix + st.designator.name;
  const line = st.range.line;
  if (st.nodes.nodes.length !== 3) return;
  const p = cx.node(scope, st.nodes.nodes[0], name, scope.prefix === '');
  const n = cx.node(scope, st.nodes.nodes[1], name, scope.prefix === '');
  const o = cx.node(scope, st.nodes.nodes[2], name, scope.prefix === '');
  const where = whereIn(cx, scope);
  const slots: Record<string, Slot & { min: 'positive' | 'nonnegative' }> = {
    gain: { says: 'an op-amp’s gain is in V/V or dB', units: ['dB'], convert: fromDb, min: 'positive', example: '100dB' },
    gbw: { says: 'gbw is a frequency, in Hz', units: ['Hz'], min: 'positive', example: '1M' },
    pole2: { says: 'pole2 is a frequency, in Hz', units: ['Hz'], min: 'positive', example: '10M' },
    zout: { says: 'zout is in Ω', units: ['Ω'], min: 'nonnegative', example: '50' },
    vnoise: { says: 'vnoise is a noise density in V/√Hz', units: ['V'], min: 'nonnegative', example: '10n' },
    inoise: { says: 'inoise is a noise density in A/√Hz', units: ['A'], min: 'nonnegative', example: '1p' },
  };
  const values: Partial<Record<string, number>> = {};
  let ok = true;
  for (const opt of st.options) {
    const slot = slots[opt.name];
    const x = read(cx, scope, opt.value, line, slot, where);
    if (x === null) {
      ok = false;
      continue;
    }
    const fine = slot.min === 'positive' ? x > 0 : x >= 0;
    if (
      !bound(
        cx,
        opt.value,
        fine,
        `${opt.name} must be ${slot.min === 'positive' ? 'more than 0' : 'at least 0'}; it is ${formatSi(x, opt.name === 'gain' ? '' : slot.units[0])}${where}`,
      )
    ) {
      ok = false;
      continue;
    }
    values[opt.name] = x;
  }
  if (!ok) return;
  if (values.pole2 !== undefined && values.gbw === undefined) {
    const at = st.options.find((o) => o.name === 'pole2') as OpAmpStatement['options'][number];
    cx.error(
      at.range,
      'missing-gbw',
      `pole2 is ${st.designator.name}’s second pole, so it needs the first: give gbw too${where}`,
      `write gain 100dB gbw 1M pole2 10M`,
    );
    return;
  }
  const element: Element = { kind: 'opamp', name, range: st.range, p, n, o, zout: values.zout ?? 0 };
  if (values.gain !== undefined) element.gain = values.gain;
  if (values.gbw !== undefined) element.gbw = values.gbw;
  if (values.pole2 !== undefined) element.pole2 = values.pole2;
  if (values.vnoise !== undefined) element.en = values.vnoise;
  if (values.inoise !== undefined) element.inoise = values.inoise;
  addElement(cx, element, st.designator);
}

function couple(cx: Elaboration, scope: Scope, st: CoupleStatement): void {
  const line = st.range.line;
  const where = whereIn(cx, scope);
  const k = st.k === null ? null : read(cx, scope, st.k, line, { says: 'a coupling factor is a plain number', units: [], example: '0.99' }, where);
  if (
    st.k !== null &&
    k !== null &&
    !bound(
      cx,
      st.k,
      k > 0 && k <= 1,
      `a coupling factor is more than 0 and at most 1; it is ${formatSi(k)}${where}`,
      'tightly wound transformers are near 0.99',
    )
  )
    return;
  if (k === null) return;
  const l1 = scope.prefix + st.l1.name;
  const l2 = scope.prefix + st.l2.name;
  if (st.l1.name === st.l2.name) {
    cx.error(st.l2.range, 'bad-coupling', `an inductor cannot be coupled to itself`, 'name two different inductors: couple L1 L2 0.99');
    return;
  }
  const name = `${l1}~${l2}`;
  const reversed = `${l2}~${l1}`;
  if (cx.elementNames.has(name) || cx.elementNames.has(reversed)) {
    cx.error(st.range, 'duplicate-coupling', `${st.l1.name} and ${st.l2.name} are coupled already`, 'give each pair one couple line');
    return;
  }
  const element: Element = { kind: 'coupling', name, range: st.range, l1, l2, k };
  cx.elementNames.set(name, { kind: 'coupling', range: st.range, line });
  cx.elements.push(element);
  cx.pending.push(() => {
    checkTwoTerminal(cx, scope, st.l1, l1, 'couple', 'inductor');
    checkTwoTerminal(cx, scope, st.l2, l2, 'couple', 'inductor');
  });
}

function use(cx: Elaboration, scope: Scope, st: UseStatement): void {
  const block = cx.blocks.get(st.block.name);
  if (block === undefined) {
    if (cx.program.brokenWords.has(st.block.name)) return;
    const names = [...cx.blocks.keys()];
    const near = cx.near(st.block.name, names);
    const otherwise = names.length > 0 ? `the blocks are ${names.join(', ')}` : 'define it with block NAME [pins] … end';
    cx.error(st.block.range, 'unknown-block', `there is no block named ${st.block.name}`, suggestionHint(near, undefined, otherwise), near.fix);
    return;
  }
  cx.usedBlocks.add(block.name.name);
  if (scope.stack.includes(block.name.name) || scope.block?.name.name === block.name.name) {
    cx.error(
      st.block.range,
      'recursive-block',
      `block ${block.name.name} cannot use itself`,
      'a block may use other blocks, but not itself, directly or through another block',
    );
    return;
  }
  if (st.nodes.nodes.length !== block.pins.nodes.length) {
    const pins = block.pins.nodes.map((p) => p.name).join(' ');
    cx.error(
      st.nodes.range,
      'node-count',
      `block ${block.name.name} has ${block.pins.nodes.length} pin${block.pins.nodes.length === 1 ? '' : 's'} [${pins}]; this connects ${st.nodes.nodes.length}`,
      `write use ${block.name.name} as ${st.instance.name} [${pins}] with your nodes in that order`,
    );
    return;
  }
  const instance = scope.prefix + st.instance.name;
  const line = st.range.line;
  // The values passed in, read where the use line stands.
  const given = new Map<string, { q: Quantity | null; range: SourceRange }>();
  for (const arg of st.args) {
    if (!block.params.some((p) => p.name.name === arg.name.name)) {
      const names = block.params.map((p) => p.name.name);
      const near = cx.near(arg.name.name, names);
      const otherwise = names.length > 0 ? `its parameters are ${names.join(', ')}` : 'it takes no parameters';
      cx.error(
        arg.name.range,
        'unknown-parameter',
        `block ${block.name.name} has no parameter named ${arg.name.name}`,
        suggestionHint(near, undefined, otherwise),
        near.fix,
      );
      continue;
    }
    if (given.has(arg.name.name)) {
      cx.error(arg.name.range, 'duplicate-argument', `${arg.name.name} is given twice`, 'give each parameter once');
      continue;
    }
    given.set(arg.name.name, { q: arg.value === null ? null : evaluate(cx, scope, arg.value, line), range: arg.name.range });
  }
  const inner = cx.scope(instance + '.', instance, block, cx.top, block.body);
  inner.stack = [...scope.stack, block.name.name];
  if (!cx.checkedBlocks.has(block.name.name)) {
    cx.checkedBlocks.add(block.name.name);
    checkNamespace(cx, inner, block.body);
    checkPins(cx, block);
  }
  let ok = true;
  for (const p of block.params) {
    const g = given.get(p.name.name);
    if (g !== undefined) {
      if (g.q === null) ok = false;
      else inner.params.set(p.name.name, { ...g.q, line: block.range.line - 0.5, range: p.name.range });
      continue;
    }
    if (p.default === null) {
      cx.error(
        st.instance.range,
        'missing-argument',
        `${st.instance.name} needs a value for ${p.name.name}: block ${block.name.name} gives it no default`,
        `add it, like use ${block.name.name} as ${st.instance.name} [${st.nodes.nodes.map((n) => n.name).join(' ')}] (${p.name.name} = …)`,
      );
      ok = false;
      continue;
    }
    const q = evaluate(cx, inner, p.default, block.range.line + 0.5);
    if (q === null) ok = false;
    else inner.params.set(p.name.name, { ...q, line: block.range.line, range: p.name.range });
  }
  if (!ok) return;
  block.pins.nodes.forEach((pin, i) => {
    if (pin.name === GROUND || inner.pins.has(pin.name)) return;
    inner.pins.set(pin.name, cx.node(scope, st.nodes.nodes[i], null, scope.prefix === ''));
  });
  for (const node of st.nodes.nodes) cx.node(scope, node, null);
  for (const s of block.body) if (s.kind === 'let') letStatement(cx, inner, s);
  for (const s of block.body) partStatement(cx, inner, s);
  cx.elementNames.set(instance, { kind: 'instance', range: st.instance.range, line });
}

function checkPins(cx: Elaboration, block: BlockStatement): void {
  const seen = new Set<string>();
  for (const pin of block.pins.nodes) {
    if (pin.name === GROUND) {
      cx.error(pin.range, 'bad-pin', `a block’s pin cannot be gnd`, 'inside a block, gnd is the ground of the whole network already');
    } else if (seen.has(pin.name)) {
      cx.error(pin.range, 'bad-pin', `pin ${pin.name} is listed twice`, 'give each pin once');
    }
    seen.add(pin.name);
  }
}
