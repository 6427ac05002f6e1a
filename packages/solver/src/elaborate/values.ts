/** Names and values: the namespace of parameters and designators, `let`, and values read in their units. */
import type { SourceRange } from '../circuit.js';
import type { Diagnostic } from '../result.js';
import type { Ident, LetStatement, Statement, Value } from '../ast.js';
import { evaluateTokens } from '../expr.js';
import type { Quantity } from '../expr.js';
import { diagnostic, replaceWith } from '../diagnostic.js';
import { suggestionHint } from '../suggest.js';
import { formatSi } from '../units.js';
import { CONSTANTS, GROUND, isConstantName, isFunctionName } from '../vocabulary.js';
import type { Unit } from '../vocabulary.js';
import { CASCADE, designatorOf } from './context.js';
import type { Elaboration, Scope } from './context.js';

const QUANTITY_OF: Partial<Record<Unit, string>> = {
  Ω: 'a resistance',
  F: 'a capacitance',
  H: 'an inductance',
  Hz: 'a frequency',
  V: 'a voltage',
  A: 'a current',
  s: 'a time',
  S: 'a conductance',
  dB: 'a level in dB',
  deg: 'an angle',
  '%': 'a percentage',
  K: 'a temperature',
  '°C': 'a temperature',
};

/** How a value is read where it stands: which units fit and how it converts. */
export interface Slot {
  /** "a capacitor's value is in F" */
  says: string;
  units: readonly Unit[];
  /** Turns a value written in `unit` (null: none written) into the slot's base unit. */
  convert?: (value: number, unit: Unit | null) => number;
  /** The unit for messages about the converted value. */
  unit?: string;
  /** An example for the hint. */
  example?: string;
}

/** Parameters and designators share one namespace; a parameter must not take a reserved name. */
export function checkNamespace(cx: Elaboration, scope: Scope, body: Statement[]): void {
  const params = scope.block?.params ?? [];
  for (const p of params) {
    const d = scope.designators.get(p.name.name);
    if (d !== undefined)
      cx.error(
        p.name.range,
        'name-clash',
        `${p.name.name} is the designator of a part on line ${d.line}; a parameter needs a name of its own`,
        'rename the parameter or the part',
      );
    reservedName(cx, p.name);
  }
  const seenParams = new Set<string>();
  for (const p of params) {
    if (seenParams.has(p.name.name))
      cx.error(p.name.range, 'redefined-name', `block ${scope.block?.name.name} has a parameter named ${p.name.name} already`, 'give each parameter once');
    seenParams.add(p.name.name);
  }
  const designators = new Map<string, number>();
  for (const st of body) {
    const d = designatorOf(st);
    if (d === null) continue;
    const before = designators.get(d.ident.name);
    if (before !== undefined) {
      cx.error(
        d.ident.range,
        'duplicate-designator',
        `there is a part named ${d.ident.name} already, on line ${before}`,
        'every part needs a designator of its own',
      );
    } else {
      designators.set(d.ident.name, d.ident.range.line);
    }
  }
  const lets = new Map<string, number>();
  for (const st of body) {
    if (st.kind !== 'let') continue;
    const name = st.name.name;
    if (reservedName(cx, st.name)) continue;
    const d = scope.designators.get(name);
    if (d !== undefined) {
      cx.error(
        st.name.range,
        'name-clash',
        `${name} is the designator of a part on line ${d.line}; a parameter needs a name of its own`,
        'rename the parameter or the part',
      );
      continue;
    }
    if (seenParams.has(name)) {
      cx.error(
        st.name.range,
        'redefined-name',
        `${name} is a parameter of block ${scope.block?.name.name} already; a parameter cannot be set twice`,
        'choose another name',
      );
      continue;
    }
    const before = lets.get(name);
    if (before !== undefined) {
      cx.error(
        st.name.range,
        'redefined-name',
        `${name} is defined already, on line ${before}; a parameter cannot be set twice`,
        'choose another name, or change the first definition',
      );
      continue;
    }
    lets.set(name, st.name.range.line);
  }
}

/** True (with an error) when a parameter would hide a constant, a function or ground. */
function reservedName(cx: Elaboration, name: Ident): boolean {
  const n = name.name;
  if (isConstantName(n) || isFunctionName(n) || n === GROUND) {
    const what = isConstantName(n) ? 'a built-in constant' : isFunctionName(n) ? 'a built-in function' : 'the ground node';
    cx.error(name.range, 'reserved-name', `${n} is ${what}; a parameter needs another name`, 'choose another name');
    return true;
  }
  return false;
}

/** Gives a `let` parameter its value, unless its name or value was reported. */
export function letStatement(cx: Elaboration, scope: Scope, st: LetStatement): void {
  const name = st.name.name;
  if (scope.params.has(name) || scope.lets.get(name) !== st.range.line) return;
  if (isConstantName(name) || isFunctionName(name) || name === GROUND || scope.designators.has(name)) return;
  if (scope.block?.params.some((p) => p.name.name === name)) return;
  if (st.value === null) return;
  const q = evaluate(cx, scope, st.value, st.range.line, name);
  if (q === null) return;
  // A variant keeps the unit the line is written in and takes the value its `vary` line gives.
  const value = (scope === cx.top ? cx.overrides.get(name) : undefined) ?? q.value;
  scope.params.set(name, { value, unit: q.unit, line: st.range.line, range: st.name.range });
}

/** Looks a parameter up as seen from `line`, or says why it cannot be used. */
function resolve(cx: Elaboration, scope: Scope, name: string, range: SourceRange, line: number, defining?: string): Quantity | Diagnostic {
  const own = scope.params.get(name);
  if (own !== undefined && own.line < line) return own;
  if (scope.parent !== null && scope.block !== null) {
    const outer = scope.parent.params.get(name);
    if (outer !== undefined && outer.line < scope.block.range.line && !scope.lets.has(name)) return outer;
  }
  if (name === defining) return diagnostic(range, 'undefined-name', `${name} cannot be used in its own definition`);
  // A let that clashes with a designator has been reported on its own line.
  if (scope.lets.has(name) && scope.designators.has(name)) return diagnostic(range, CASCADE, name);
  const later = scope.lets.get(name);
  if (later !== undefined && later >= line) {
    return diagnostic(range, 'defined-later', `${name} is defined later, on line ${later}; a parameter must be defined above the line that uses it`, {
      hint: `move let ${name} = … above this line`,
    });
  }
  if (later !== undefined || own !== undefined) {
    // Defined above but its value failed: that error has been reported already.
    return diagnostic(range, 'undefined-name', `${name} has no value because of the error in its definition`);
  }
  if (scope.parent !== null && scope.block !== null && scope.parent.lets.has(name)) {
    const at = scope.parent.lets.get(name) as number;
    if (at > scope.block.range.line) {
      return diagnostic(
        range,
        'defined-later',
        `${name} is defined on line ${at}, below block ${scope.block.name.name}; a block sees the parameters defined above it`,
        { hint: `move let ${name} = … above the block` },
      );
    }
  }
  const d = scope.designators.get(name) ?? scope.parent?.designators.get(name);
  if (d !== undefined)
    return diagnostic(range, 'not-a-parameter', `${name} is a part (line ${d.line}), not a parameter`, {
      hint: 'a value is a number, a parameter defined with let, or an expression in parentheses',
    });
  if (cx.program.brokenWords.has(name)) return diagnostic(range, CASCADE, name);
  const visible = cx.suggestBudget > 0 ? visibleParams(cx, scope, line) : [];
  const near = cx.near(name, visible);
  const otherwise =
    visible.length > 0
      ? `the parameters here are ${visible.slice(0, 8).join(', ')}${visible.length > 8 ? ', …' : ''}`
      : cx.suggestBudget > 0
        ? 'define it first with let NAME = VALUE'
        : undefined;
  return diagnostic(range, 'undefined-name', `there is no parameter named ${name}`, { hint: suggestionHint(near, undefined, otherwise), fix: near.fix });
}

function visibleParams(cx: Elaboration, scope: Scope, line: number): string[] {
  const names = [...scope.params.entries()].filter(([, p]) => p.line < line).map(([n]) => n);
  if (scope.parent !== null && scope.block !== null) {
    const blockLine = scope.block.range.line;
    names.push(...[...scope.parent.params.entries()].filter(([, p]) => p.line < blockLine).map(([n]) => n));
  }
  return names;
}

/** A value as a number with its unit; null when it has none (the reason is reported). */
export function evaluate(cx: Elaboration, scope: Scope, v: Value, line: number, defining?: string): Quantity | null {
  switch (v.kind) {
    case 'number':
      return Number.isFinite(v.value) && v.bad !== true ? { value: v.value, unit: v.unit } : null;
    case 'name': {
      if (isConstantName(v.name)) return { value: CONSTANTS[v.name], unit: null };
      const r = resolve(cx, scope, v.name, v.range, line, defining);
      if ('code' in r) {
        cx.diagnostics.push(r);
        return null;
      }
      return r;
    }
    case 'expr': {
      const result = evaluateTokens(v.tokens, v.range, (name, range) => resolve(cx, scope, name, range, line, defining));
      if (!result.ok) {
        cx.diagnostics.push(...result.diagnostics);
        return null;
      }
      return result.quantity;
    }
  }
}

/**
 * A value read for a slot: its unit checked and converted. `owner` names the part or
 * line in messages. Null when it has no usable value (the reason is reported).
 */
export function read(cx: Elaboration, scope: Scope, v: Value, line: number, slot: Slot, where = ''): number | null {
  const q = evaluate(cx, scope, v, line);
  if (q === null) return null;
  const unit = q.unit === 'compound' || q.unit === null ? null : q.unit;
  if (unit === null || slot.units.includes(unit)) {
    const x = slot.convert ? slot.convert(q.value, unit) : q.value;
    // A conversion can leave the numbers a computer holds (10 000 dB is 10^500).
    if (Number.isFinite(x)) return x;
    cx.error(
      v.range,
      'value-out-of-range',
      `${v.kind === 'number' ? `\`${v.text}\`` : 'this value'} is too large to compute (beyond ±1.8e308)${where}`,
      'write a smaller value',
    );
    return null;
  }
  const range = v.kind === 'number' && v.unitRange !== undefined ? v.unitRange : v.range;
  const written = v.kind === 'number' ? `\`${v.text}\`` : v.kind === 'name' ? `${v.name} (in ${unit})` : `this expression (in ${unit})`;
  if (unit === 'K' && v.kind === 'number' && v.unitRange !== undefined && !slot.units.includes('K')) {
    cx.error(range, 'unit-mismatch', `\`K\` is kelvin, not kilo`, 'use k for kilo', replaceWith('k'));
    return null;
  }
  const quantity = QUANTITY_OF[unit] ?? unit;
  const example = slot.example !== undefined ? `, like ${slot.example}` : '';
  cx.error(
    range,
    'unit-mismatch',
    `${slot.says}${where}`,
    `${written} is ${quantity}; write the value with ${slot.units.length > 0 ? slot.units.join(' or ') + ' or ' : ''}no unit${example}`,
  );
  return null;
}

/** Reports a value outside its allowed range; returns whether it is fine. */
export function bound(cx: Elaboration, v: Value, ok: boolean, message: string, hint?: string): boolean {
  if (!ok) cx.error(v.range, 'value-out-of-range', message, hint);
  return ok;
}

/** A whole number from `min` to `max`, or null (with the reason reported). */
export function integer(cx: Elaboration, scope: Scope, v: Value, line: number, what: string, min: number, max: number): number | null {
  const n = read(cx, scope, v, line, { says: `${what} is a plain count`, units: [] });
  if (n === null) return null;
  if (!Number.isInteger(n) || n < min) {
    cx.error(v.range, 'value-out-of-range', `${what} must be a whole number of at least ${min}; it is ${formatCount(n)}`);
    return null;
  }
  if (n > max) {
    cx.error(v.range, 'value-out-of-range', `${what} is ${formatCount(n)}; the limit is ${max.toLocaleString('en-US')}`);
    return null;
  }
  return n;
}

/** A count for a message: whole numbers with thousands separators. */
export function formatCount(n: number): string {
  return Number.isInteger(n) ? n.toLocaleString('en-US') : formatSi(n);
}

/** A value as written, for a quick fix that moves it. */
export function sourceText(v: Value): string {
  switch (v.kind) {
    case 'number':
      return v.text;
    case 'name':
      return v.name;
    case 'expr':
      return v.range.endColumn - v.range.column === v.text.length ? v.text : `(${v.text})`;
  }
}
