/** What every part's elaboration shares: registering an element under its designator, where it stands, and checks of a part named by another line. */
import type { Element } from '../circuit.js';
import type { Ident } from '../ast.js';
import { suggestionHint } from '../suggest.js';
import type { Unit } from '../vocabulary.js';
import type { Elaboration, Scope } from './context.js';

/** A gain written in dB as a ratio; a plain number as it is. */
export const fromDb = (v: number, u: Unit | null) => (u === 'dB' ? 10 ** (v / 20) : v);

/** Registers an element under its full designator. */
export function addElement(cx: Elaboration, element: Element, designator: Ident): void {
  const before = cx.elementNames.get(element.name);
  if (before !== undefined) {
    // Two names that collide only after flattening (a dotted top-level name, say).
    cx.error(
      designator.range,
      'duplicate-designator',
      `there is a part named ${element.name} already, on line ${before.line}`,
      'every part needs a designator of its own',
    );
    return;
  }
  cx.elementNames.set(element.name, { kind: element.kind, range: designator.range, line: designator.range.line });
  cx.elements.push(element);
}

export function whereIn(cx: Elaboration, scope: Scope): string {
  return scope.instance === '' ? '' : ` (in ${scope.instance})`;
}

/** A part named by `of Rx`, `couple` or `show current` must be a resistor, capacitor or inductor. */
export function checkTwoTerminal(cx: Elaboration, scope: Scope, id: Ident, full: string, what: string, only?: 'inductor'): boolean {
  const e = cx.elementNames.get(full);
  if (e === undefined) {
    if (scope.designators.has(id.name) || cx.program.brokenWords.has(id.name)) return false; // its own line had an error
    const names =
      cx.suggestBudget <= 0
        ? []
        : [...cx.elementNames.entries()]
            .filter(([n, x]) => n.startsWith(scope.prefix) && (only === undefined ? ['resistor', 'capacitor', 'inductor'].includes(x.kind) : x.kind === only))
            .map(([n]) => n.slice(scope.prefix.length));
    const near = cx.near(id.name, names);
    const otherwise = `${what} names ${only === 'inductor' ? 'an inductor' : 'a resistor, capacitor or inductor'} of this network`;
    cx.error(
      id.range,
      'unknown-part',
      `there is no part named ${id.name}${scope.block !== null ? ` in block ${scope.block.name.name}` : ''}`,
      suggestionHint(near, undefined, otherwise),
      near.fix,
    );
    return false;
  }
  const fits = only === undefined ? e.kind === 'resistor' || e.kind === 'capacitor' || e.kind === 'inductor' : e.kind === only;
  if (!fits) {
    cx.error(
      id.range,
      'wrong-part-kind',
      `${id.name} is ${articleOf(e.kind)}; ${what} names ${only === 'inductor' ? 'an inductor' : 'a resistor, capacitor or inductor'}`,
    );
    return false;
  }
  return true;
}

function articleOf(kind: Element['kind'] | 'instance'): string {
  const names: Record<Element['kind'] | 'instance', string> = {
    instance: 'a block instance',
    coupling: 'a coupling',
    resistor: 'a resistor',
    capacitor: 'a capacitor',
    inductor: 'an inductor',
    opamp: 'an op-amp',
    vcvs: 'a controlled source',
    vccs: 'a controlled source',
    cccs: 'a controlled source',
    ccvs: 'a controlled source',
    transformer: 'a transformer',
    'loop-break': 'a loop break',
    transfer: 'a controlled source',
  };
  return names[kind];
}
