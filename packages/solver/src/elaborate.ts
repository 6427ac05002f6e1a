/**
 * From the cell as written to the network the numerical core solves: parameters resolved
 * in order, blocks flattened (instance-private nodes `B1.x`, designators `B1.R3`), nodes
 * numbered (0 is gnd), units and values checked per part, connectivity checked, and every
 * `show` and `require` mapped to what it reads. Never throws.
 */
import type {
  Capacitor,
  Circuit,
  Drive,
  Element,
  Inductor,
  Measure,
  NodeIndex,
  Probe,
  RequirementSpec,
  Resistor,
  SourceRange,
  SweepSpec,
  ToleranceSpec,
  TraceKind,
  TraceSpec,
} from './circuit.js';
import type { Diagnostic } from './result.js';
import type {
  BlockStatement,
  ControlledStatement,
  CoupleStatement,
  DriveStatement,
  Ident,
  LetStatement,
  OpAmpStatement,
  PassiveKind,
  PassiveStatement,
  Program,
  RequireStatement,
  ShowStatement,
  SpreadStatement,
  Statement,
  SweepStatement,
  TemperatureStatement,
  TimeStatement,
  UseStatement,
  Value,
} from './ast.js';
import { evaluateTokens } from './expr.js';
import type { ExprUnit, Quantity } from './expr.js';
import { diagnostic } from './diagnostic.js';
import type { FixSpec } from './diagnostic.js';
import { didYouMean, suggestionHint } from './suggest.js';
import type { Suggestion } from './suggest.js';
import { formatSi } from './units.js';
import { CONSTANTS, DEFAULT_TEMPERATURE, GROUND, MEASURES, PART_CLASSES, PASSIVES, isFunctionName } from './vocabulary.js';
import type { Unit } from './vocabulary.js';
import { internalError } from './diagnostic.js';

export interface ElaborateOptions {
  /** Most frequency points a sweep may have (default 20 000). */
  maxPoints?: number;
  /** Most parts a network may have after blocks are flattened (default 500 000). */
  maxParts?: number;
}

export const DEFAULT_MAX_POINTS = 20_000;
export const DEFAULT_MAX_PARTS = 500_000;
const MAX_DRAWS = 100_000;
/** Beyond this many, nodes that touch only one part are counted in one warning. */
const MAX_DANGLING = 100;
/** Node names that look like ground but are not (`GND`, `ground`): warned about once. */
const GROUND_LOOKALIKE = /^(gnd|ground|agnd|0v)$/i;
/** A problem that only echoes an error on a line that could not be read; never shown. */
const CASCADE = 'cascade';

/** Turns a parsed cell into a circuit. The circuit is null when any error was found. */
export function elaborate(program: Program, options: ElaborateOptions = {}): { circuit: Circuit | null; diagnostics: Diagnostic[] } {
  try {
    const e = new Elaborator(program, options);
    return e.run();
  } catch (err) {
    return { circuit: null, diagnostics: [internalError(err)] };
  }
}

// ---------------------------------------------------------------------------------------
// Scopes: parameters, designators, nodes

interface Param {
  value: number;
  unit: ExprUnit;
  /** Line of its definition; visible to lines after it. */
  line: number;
  range: SourceRange;
}

interface Scope {
  /** '' at the top, 'B1.' inside instance B1. */
  prefix: string;
  /** The instance's designator ('' at the top level) and its block's name. */
  instance: string;
  block: BlockStatement | null;
  params: Map<string, Param>;
  /** Every `let` of this scope, by name: the first definition's line. */
  lets: Map<string, number>;
  /** Every designator written in this scope, with its line and kind. */
  designators: Map<string, { line: number; kind: string; range: SourceRange }>;
  /** Pins of the block, mapped to the nodes they connect to. */
  pins: Map<string, NodeIndex>;
  /** The top level, seen from inside a block (parameters defined above the block line). */
  parent: Scope | null;
  /** Block names already being expanded (to catch a block that uses itself). */
  stack: string[];
}

interface NodeInfo {
  name: string;
  /** Where it is first written. */
  range: SourceRange;
  /** The name as written, and the block it belongs to, for a block's private node. */
  local: string;
  block: string | null;
  /** Parts (and the drive) that touch it. */
  touches: Set<string>;
}

const articleOfPassive = (part: PassiveKind) => PART_CLASSES[PASSIVES[part].letter].article;
const QUANTITY_OF: Partial<Record<Unit, string>> = {
  'Ω': 'a resistance',
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
interface Slot {
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

const fromDb = (v: number, u: Unit | null) => (u === 'dB' ? 10 ** (v / 20) : v);

class Elaborator {
  private readonly diagnostics: Diagnostic[] = [];
  private readonly maxPoints: number;
  private readonly maxParts: number;
  private readonly nodes: NodeInfo[] = [];
  private readonly nodeIndex = new Map<string, NodeIndex>();
  private readonly elements: Element[] = [];
  private readonly elementNames = new Map<string, { kind: Element['kind'] | 'instance'; range: SourceRange; line: number }>();
  private readonly blocks = new Map<string, BlockStatement>();
  private readonly usedBlocks = new Set<string>();
  /** Checks that need every element first: controlling parts and couplings. */
  private readonly pending: (() => void)[] = [];
  /** Blocks whose namespace and pins have been checked (once, however often they are used). */
  private readonly checkedBlocks = new Set<string>();
  private drive: Drive | null = null;
  private suggestBudget = 200_000;
  private driveLine = 0;
  private readonly top: Scope;

  constructor(
    private readonly program: Program,
    options: ElaborateOptions,
  ) {
    this.maxPoints = options.maxPoints ?? DEFAULT_MAX_POINTS;
    this.maxParts = options.maxParts ?? DEFAULT_MAX_PARTS;
    this.nodes.push({ name: 'gnd', range: { line: 1, column: 1, endColumn: 1 }, local: 'gnd', block: null, touches: new Set() });
    this.nodeIndex.set('gnd', 0);
    this.top = this.scope('', '', null, null, program.statements);
  }

  private error(range: SourceRange, code: string, message: string, hint?: string, fix?: FixSpec): void {
    this.diagnostics.push(diagnostic(range, code, message, { hint, fix }));
  }

  private warn(range: SourceRange, code: string, message: string, hint?: string, fix?: FixSpec): void {
    this.diagnostics.push(diagnostic(range, code, message, { hint, fix, severity: 'warning' }));
  }

  /**
   * "Did you mean", within a budget: a cell with thousands of misspellings still
   * elaborates quickly, and the first problems keep their suggestions.
   */
  private near(name: string, candidates: string[]): Suggestion {
    if (this.suggestBudget <= 0) return didYouMean(name, []);
    this.suggestBudget -= candidates.length;
    return didYouMean(name, candidates);
  }

  private scope(prefix: string, instance: string, block: BlockStatement | null, parent: Scope | null, body: Statement[]): Scope {
    const s: Scope = { prefix, instance, block, params: new Map(), lets: new Map(), designators: new Map(), pins: new Map(), parent, stack: parent ? [...parent.stack] : [] };
    for (const st of body) {
      if (st.kind === 'let' && !s.lets.has(st.name.name)) s.lets.set(st.name.name, st.range.line);
      const d = designatorOf(st);
      if (d !== null && !s.designators.has(d.ident.name)) s.designators.set(d.ident.name, { line: d.ident.range.line, kind: d.kind, range: d.ident.range });
    }
    return s;
  }

  run(): { circuit: Circuit | null; diagnostics: Diagnostic[] } {
    const statements = this.program.statements;
    for (const st of statements) {
      if (st.kind !== 'block') continue;
      if (st.name.name === '') continue;
      const before = this.blocks.get(st.name.name);
      if (before !== undefined) {
        this.error(st.name.range, 'duplicate-block', `there is a block named ${st.name.name} already, on line ${before.range.line}`, 'give this block another name');
        continue;
      }
      this.blocks.set(st.name.name, st);
    }
    this.checkNamespace(this.top, statements);
    for (const st of statements) if (st.kind === 'let') this.letStatement(this.top, st);

    const parts = this.countParts(statements, []);
    if (parts > this.maxParts) {
      // Point at the use line that brings in the most parts.
      let first = statements[0];
      let most = -1;
      for (const st of statements) {
        const n = st.kind === 'use' ? this.countParts([st], []) : -1;
        if (n > most) [first, most] = [st, n];
      }
      this.error(first.range, 'network-too-large', `the network has ${parts.toLocaleString('en-US')} parts after its blocks are expanded; the limit is ${this.maxParts.toLocaleString('en-US')}`, 'split the network into smaller cells, or use fewer block instances');
      return { circuit: null, diagnostics: this.diagnostics };
    }

    for (const st of statements) this.partStatement(this.top, st);
    for (const check of this.pending) check();
    for (const block of this.blocks.values()) {
      if (!this.usedBlocks.has(block.name.name)) this.warn(block.name.range, 'unused-block', `block ${block.name.name} is never used`, `place it with use ${block.name.name} as B1 [${block.pins.nodes.map((p) => p.name).join(' ')}]`);
    }

    const drives = statements.filter((s): s is DriveStatement => s.kind === 'drive');
    for (const d of drives) this.driveStatement(d);

    const shows = statements.filter((s): s is ShowStatement => s.kind === 'show');
    const traces: (TraceSpec | null)[] = shows.map((s) => this.showStatement(s));
    const goodTraces = traces.filter((t): t is TraceSpec => t !== null);
    this.checkLabels(shows, traces);

    let sweep: SweepSpec | null = null;
    let sweepLine = 0;
    let time: Circuit['time'] = null;
    let timeLine = 0;
    let temperature = DEFAULT_TEMPERATURE;
    let temperatureLine = 0;
    let tolerance: ToleranceSpec | null = null;
    const requirements: RequirementSpec[] = [];
    for (const st of statements) {
      switch (st.kind) {
        case 'sweep':
          if (sweepLine !== 0) {
            this.error(st.range, 'duplicate-sweep', `a cell has one sweep; there is one on line ${sweepLine} already`, 'keep one sweep line');
            break;
          }
          sweepLine = st.range.line;
          sweep = this.sweepStatement(st);
          break;
        case 'time':
          if (timeLine !== 0) {
            this.error(st.range, 'duplicate-time', `a cell has one time window; there is one on line ${timeLine} already`, 'keep one time line');
            break;
          }
          timeLine = st.range.line;
          time = this.timeStatement(st);
          break;
        case 'temperature': {
          if (temperatureLine !== 0) {
            this.error(st.range, 'duplicate-temperature', `a cell has one temperature; there is one on line ${temperatureLine} already`, 'keep one temperature line');
            break;
          }
          temperatureLine = st.range.line;
          temperature = this.temperatureStatement(st) ?? DEFAULT_TEMPERATURE;
          break;
        }
        case 'spread':
          if (tolerance !== null) {
            this.error(st.range, 'duplicate-spread', `a cell has one spread; there is one on line ${tolerance.range.line} already`, 'keep one spread line');
            break;
          }
          tolerance = this.spreadStatement(st);
          break;
        case 'require': {
          const r = this.requireStatement(st, shows, traces);
          if (r !== null) requirements.push(r);
          break;
        }
        default:
          break;
      }
    }

    this.wholeCellChecks(shows, traces, drives);

    const diagnostics = this.diagnostics.filter((d) => d.code !== CASCADE);
    const hasError = this.program.incomplete || diagnostics.some((d) => d.severity === 'error');
    if (hasError) return { circuit: null, diagnostics };
    const circuit: Circuit = {
      nodeNames: this.nodes.map((n) => n.name),
      elements: this.elements,
      drive: this.drive,
      traces: goodTraces,
      sweep,
      requirements,
      tolerance,
      temperature,
      time,
    };
    return { circuit, diagnostics };
  }

  // -------------------------------------------------------------------------------------
  // Names and values

  /** Parameters and designators share one namespace; a parameter must not take a reserved name. */
  private checkNamespace(scope: Scope, body: Statement[]): void {
    const params = scope.block?.params ?? [];
    for (const p of params) {
      const d = scope.designators.get(p.name.name);
      if (d !== undefined) this.error(p.name.range, 'name-clash', `${p.name.name} is the designator of a part on line ${d.line}; a parameter needs a name of its own`, 'rename the parameter or the part');
      this.reservedName(p.name);
    }
    const seenParams = new Set<string>();
    for (const p of params) {
      if (seenParams.has(p.name.name)) this.error(p.name.range, 'redefined-name', `block ${scope.block?.name.name} has a parameter named ${p.name.name} already`, 'give each parameter once');
      seenParams.add(p.name.name);
    }
    const designators = new Map<string, number>();
    for (const st of body) {
      const d = designatorOf(st);
      if (d === null) continue;
      const before = designators.get(d.ident.name);
      if (before !== undefined) {
        this.error(d.ident.range, 'duplicate-designator', `there is a part named ${d.ident.name} already, on line ${before}`, 'every part needs a designator of its own');
      } else {
        designators.set(d.ident.name, d.ident.range.line);
      }
    }
    const lets = new Map<string, number>();
    for (const st of body) {
      if (st.kind !== 'let') continue;
      const name = st.name.name;
      if (this.reservedName(st.name)) continue;
      const d = scope.designators.get(name);
      if (d !== undefined) {
        this.error(st.name.range, 'name-clash', `${name} is the designator of a part on line ${d.line}; a parameter needs a name of its own`, 'rename the parameter or the part');
        continue;
      }
      if (seenParams.has(name)) {
        this.error(st.name.range, 'redefined-name', `${name} is a parameter of block ${scope.block?.name.name} already; a parameter cannot be set twice`, 'choose another name');
        continue;
      }
      const before = lets.get(name);
      if (before !== undefined) {
        this.error(st.name.range, 'redefined-name', `${name} is defined already, on line ${before}; a parameter cannot be set twice`, 'choose another name, or change the first definition');
        continue;
      }
      lets.set(name, st.name.range.line);
    }
  }

  /** True (with an error) when a parameter would hide a constant, a function or ground. */
  private reservedName(name: Ident): boolean {
    const n = name.name;
    if (CONSTANTS[n] !== undefined || isFunctionName(n) || n === GROUND) {
      const what = CONSTANTS[n] !== undefined ? 'a built-in constant' : isFunctionName(n) ? 'a built-in function' : 'the ground node';
      this.error(name.range, 'reserved-name', `${n} is ${what}; a parameter needs another name`, 'choose another name');
      return true;
    }
    return false;
  }

  private letStatement(scope: Scope, st: LetStatement): void {
    const name = st.name.name;
    if (scope.params.has(name) || scope.lets.get(name) !== st.range.line) return;
    if (CONSTANTS[name] !== undefined || isFunctionName(name) || name === GROUND || scope.designators.has(name)) return;
    if (scope.block?.params.some((p) => p.name.name === name)) return;
    if (st.value === null) return;
    const q = this.evaluate(scope, st.value, st.range.line, name);
    if (q === null) return;
    scope.params.set(name, { value: q.value, unit: q.unit, line: st.range.line, range: st.name.range });
  }

  /** Looks a parameter up as seen from `line`, or says why it cannot be used. */
  private resolve(scope: Scope, name: string, range: SourceRange, line: number, defining?: string): Quantity | Diagnostic {
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
      return diagnostic(range, 'defined-later', `${name} is defined later, on line ${later}; a parameter must be defined above the line that uses it`, { hint: `move let ${name} = … above this line` });
    }
    if (later !== undefined || own !== undefined) {
      // Defined above but its value failed: that error has been reported already.
      return diagnostic(range, 'undefined-name', `${name} has no value because of the error in its definition`);
    }
    if (scope.parent !== null && scope.block !== null && scope.parent.lets.has(name)) {
      const at = scope.parent.lets.get(name) as number;
      if (at > scope.block.range.line) {
        return diagnostic(range, 'defined-later', `${name} is defined on line ${at}, below block ${scope.block.name.name}; a block sees the parameters defined above it`, { hint: `move let ${name} = … above the block` });
      }
    }
    const d = scope.designators.get(name) ?? scope.parent?.designators.get(name);
    if (d !== undefined) return diagnostic(range, 'not-a-parameter', `${name} is a part (line ${d.line}), not a parameter`, { hint: 'a value is a number, a parameter defined with let, or an expression in parentheses' });
    if (this.program.brokenWords.has(name)) return diagnostic(range, CASCADE, name);
    const visible = this.suggestBudget > 0 ? this.visibleParams(scope, line) : [];
    const near = this.near(name, visible);
    const otherwise = visible.length > 0 ? `the parameters here are ${visible.slice(0, 8).join(', ')}${visible.length > 8 ? ', …' : ''}` : this.suggestBudget > 0 ? 'define it first with let NAME = VALUE' : undefined;
    return diagnostic(range, 'undefined-name', `there is no parameter named ${name}`, { hint: suggestionHint(near, undefined, otherwise), fix: near.fix });
  }

  private visibleParams(scope: Scope, line: number): string[] {
    const names = [...scope.params.entries()].filter(([, p]) => p.line < line).map(([n]) => n);
    if (scope.parent !== null && scope.block !== null) {
      const blockLine = scope.block.range.line;
      names.push(...[...scope.parent.params.entries()].filter(([, p]) => p.line < blockLine).map(([n]) => n));
    }
    return names;
  }

  /** A value as a number with its unit; null when it has none (the reason is reported). */
  private evaluate(scope: Scope, v: Value, line: number, defining?: string): Quantity | null {
    switch (v.kind) {
      case 'number':
        return Number.isFinite(v.value) && v.bad !== true ? { value: v.value, unit: v.unit } : null;
      case 'name': {
        const c = CONSTANTS[v.name];
        if (c !== undefined) return { value: c, unit: null };
        const r = this.resolve(scope, v.name, v.range, line, defining);
        if ('code' in r) {
          this.diagnostics.push(r);
          return null;
        }
        return r;
      }
      case 'expr': {
        const result = evaluateTokens(v.tokens, v.range, (name, range) => this.resolve(scope, name, range, line, defining));
        if (!result.ok) {
          this.diagnostics.push(...result.diagnostics);
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
  private read(scope: Scope, v: Value, line: number, slot: Slot, where = ''): number | null {
    const q = this.evaluate(scope, v, line);
    if (q === null) return null;
    if (q.unit === 'compound' || q.unit === null) return slot.convert ? slot.convert(q.value, null) : q.value;
    if (slot.units.includes(q.unit)) return slot.convert ? slot.convert(q.value, q.unit) : q.value;
    const range = v.kind === 'number' && v.unitRange !== undefined ? v.unitRange : v.range;
    const written = v.kind === 'number' ? `\`${v.text}\`` : v.kind === 'name' ? `${v.name} (in ${q.unit})` : `this expression (in ${q.unit})`;
    if (q.unit === 'K' && v.kind === 'number' && v.unitRange !== undefined && !slot.units.includes('K')) {
      this.error(range, 'unit-mismatch', `\`K\` is kelvin, not kilo`, 'use k for kilo', { title: 'Replace with k', replacement: 'k' });
      return null;
    }
    const quantity = QUANTITY_OF[q.unit] ?? q.unit;
    const example = slot.example !== undefined ? `, like ${slot.example}` : '';
    this.error(range, 'unit-mismatch', `${slot.says}${where}`, `${written} is ${quantity}; write the value with ${slot.units.length > 0 ? slot.units.join(' or ') + ' or ' : ''}no unit${example}`);
    return null;
  }

  /** Reports a value outside its allowed range; returns whether it is fine. */
  private bound(v: Value, ok: boolean, message: string, hint?: string): boolean {
    if (!ok) this.error(v.range, 'value-out-of-range', message, hint);
    return ok;
  }

  private integer(scope: Scope, v: Value, line: number, what: string, min: number, max: number): number | null {
    const n = this.read(scope, v, line, { says: `${what} is a plain count`, units: [] });
    if (n === null) return null;
    if (!Number.isInteger(n) || n < min) {
      this.error(v.range, 'value-out-of-range', `${what} must be a whole number of at least ${min}; it is ${formatCount(n)}`);
      return null;
    }
    if (n > max) {
      this.error(v.range, 'value-out-of-range', `${what} is ${formatCount(n)}; the limit is ${max.toLocaleString('en-US')}`);
      return null;
    }
    return n;
  }

  // -------------------------------------------------------------------------------------
  // Nodes

  /** The index of a node written in `scope`, created on first use. */
  private node(scope: Scope, id: Ident, toucher: string | null, privateCheck = false): NodeIndex {
    const name = id.name;
    if (name === GROUND) {
      if (toucher !== null) this.nodes[0].touches.add(toucher);
      return 0;
    }
    const pin = scope.pins.get(name);
    let full = name;
    if (pin !== undefined) {
      if (toucher !== null) this.nodes[pin].touches.add(toucher);
      return pin;
    }
    if (scope.prefix !== '') full = scope.prefix + name;
    else if (privateCheck && name.includes('.')) {
      const owner = name.slice(0, name.indexOf('.'));
      const d = scope.designators.get(owner);
      if (d !== undefined && d.kind === 'use') {
        this.error(id.range, 'private-node', `${name} is a node inside block instance ${owner}; it is reached through the instance’s pins`, 'add a pin to the block, or show the node instead of connecting to it');
      }
    }
    let index = this.nodeIndex.get(full);
    if (index === undefined) {
      if (GROUND_LOOKALIKE.test(name)) {
        this.warn(id.range, 'ground-name', `${name} is a node of its own, not ground`, `ground is written ${GROUND}, and names are case-sensitive`, { title: `Replace with ${GROUND}`, replacement: GROUND });
      }
      index = this.nodes.length;
      this.nodes.push({ name: full, range: id.range, local: name, block: scope.block?.name.name ?? null, touches: new Set() });
      this.nodeIndex.set(full, index);
    }
    if (toucher !== null) this.nodes[index].touches.add(toucher);
    return index;
  }

  /** A node named by a trace or requirement: it must exist already. */
  private existingNode(id: Ident): NodeIndex | null {
    if (id.name === GROUND) return 0;
    const index = this.nodeIndex.get(id.name);
    if (index !== undefined) return index;
    if (this.program.brokenWords.has(id.name)) return null;
    const names = this.suggestBudget > 0 ? this.nodes.slice(1).map((n) => n.name) : [];
    const near = this.near(id.name, names);
    const otherwise = names.length > 0 ? `the nodes are ${names.slice(0, 10).join(', ')}${names.length > 10 ? ', …' : ''}` : this.nodes.length > 1 ? undefined : 'no part connects to any node yet';
    this.error(id.range, 'unknown-node', `there is no node named ${id.name} in this network`, suggestionHint(near, undefined, otherwise), near.fix);
    return null;
  }

  // -------------------------------------------------------------------------------------
  // Parts and blocks

  private countParts(body: Statement[], stack: string[]): number {
    let count = 0;
    for (const st of body) {
      if (st.kind === 'passive' || st.kind === 'opamp' || st.kind === 'controlled' || st.kind === 'couple') count++;
      if (st.kind === 'use') {
        const block = this.blocks.get(st.block.name);
        if (block === undefined || stack.includes(block.name.name)) continue;
        count += this.countParts(block.body, [...stack, block.name.name]);
        if (count > this.maxParts) return count;
      }
    }
    return count;
  }

  private partStatement(scope: Scope, st: Statement): void {
    switch (st.kind) {
      case 'passive':
        return this.passive(scope, st);
      case 'opamp':
        return this.opamp(scope, st);
      case 'controlled':
        return this.controlled(scope, st);
      case 'couple':
        return this.couple(scope, st);
      case 'use':
        return this.use(scope, st);
      default:
        return;
    }
  }

  /** Registers an element under its full designator. */
  private add(element: Element, designator: Ident): void {
    const before = this.elementNames.get(element.name);
    if (before !== undefined) {
      // Two names that collide only after flattening (a dotted top-level name, say).
      this.error(designator.range, 'duplicate-designator', `there is a part named ${element.name} already, on line ${before.line}`, 'every part needs a designator of its own');
      return;
    }
    this.elementNames.set(element.name, { kind: element.kind, range: designator.range, line: designator.range.line });
    this.elements.push(element);
  }

  private where(scope: Scope): string {
    return scope.instance === '' ? '' : ` (in ${scope.instance})`;
  }

  private passive(scope: Scope, st: PassiveStatement): void {
    const name = scope.prefix + st.designator.name;
    const line = st.range.line;
    if (st.nodes.nodes.length !== 2) return;
    const a = this.node(scope, st.nodes.nodes[0], name, scope.prefix === '');
    const b = this.node(scope, st.nodes.nodes[1], name, scope.prefix === '');
    if (st.value === null) return;
    const { unit, example } = PASSIVES[st.part];
    const article = articleOfPassive(st.part);
    const where = this.where(scope);
    const value = this.read(scope, st.value, line, { says: `${article}’s value is in ${unit}`, units: [unit], example }, where);
    if (value === null) return;
    if (!this.bound(st.value, value > 0, `${st.designator.name}’s value must be more than 0 ${unit}; it is ${formatSi(value, unit)}${where}`, `${article}’s value is positive, like ${example}`)) return;
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
        const t = this.tolerance(scope, o.value, line, st.part, value, where);
        if (t === null) ok = false;
        else tolerance = t;
        continue;
      }
      const u: Unit = o.kind === 'esl' ? 'H' : 'Ω';
      const x = this.read(scope, o.value, line, { says: `${o.kind} is in ${u}`, units: [u], example: o.kind === 'esl' ? '1n' : '20m' }, where);
      if (x === null || !this.bound(o.value, x >= 0, `${o.kind} cannot be negative; it is ${formatSi(x, u)}${where}`)) {
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
    if (a === b) this.warn(st.nodes.range, 'shorted-part', `${st.designator.name} has both ends on node ${st.nodes.nodes[0].name}, so it does nothing`, 'check its nodes');
    this.add(element, st.designator);
  }

  /** A part's tolerance as a fraction: `±1%` → 0.01; `±0.25p` on a 10 pF part → 0.025. */
  private tolerance(scope: Scope, v: Value, line: number, part: PassiveKind, partValue: number, where: string): number | null {
    const q = this.evaluate(scope, v, line);
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
        const fix = v.kind === 'number' ? { title: `Read as ${v.text}%`, replacement: '%', range: { line: v.range.line, column: v.range.endColumn, endColumn: v.range.endColumn } } : undefined;
        this.error(v.range, 'tolerance-unit', 'a tolerance needs % or the part’s unit', `write ±${v.kind === 'number' ? v.text : 'N'}% for a percentage, or an amount in ${unit}, like ${example}`, fix);
      } else {
        this.error(range, 'unit-mismatch', `${articleOfPassive(part)}’s tolerance is in % or ${unit}`, `write it like ±1%`);
      }
      return null;
    }
    if (fraction < 0) {
      this.error(v.range, 'value-out-of-range', `a tolerance cannot be negative${where}`, 'write it like ±1%');
      return null;
    }
    if (fraction >= 1) {
      this.error(v.range, 'value-out-of-range', `a tolerance of ${formatSi(fraction * 100, '%')} or more leaves nothing of the part${where}`, 'a tolerance is below 100%, like ±5%');
      return null;
    }
    return fraction;
  }

  private opamp(scope: Scope, st: OpAmpStatement): void {
    const name = scope.prefix + st.designator.name;
    const line = st.range.line;
    if (st.nodes.nodes.length !== 3) return;
    const p = this.node(scope, st.nodes.nodes[0], name, scope.prefix === '');
    const n = this.node(scope, st.nodes.nodes[1], name, scope.prefix === '');
    const o = this.node(scope, st.nodes.nodes[2], name, scope.prefix === '');
    const where = this.where(scope);
    const slots: Record<string, Slot & { min: 'positive' | 'nonnegative' }> = {
      gain: { says: 'an op-amp’s gain is in V/V or dB', units: ['dB'], convert: fromDb, min: 'positive', example: '100dB' },
      gbw: { says: 'gbw is a frequency, in Hz', units: ['Hz'], min: 'positive', example: '1M' },
      zout: { says: 'zout is in Ω', units: ['Ω'], min: 'nonnegative', example: '50' },
      vnoise: { says: 'vnoise is a noise density in V/√Hz', units: ['V'], min: 'nonnegative', example: '10n' },
      inoise: { says: 'inoise is a noise density in A/√Hz', units: ['A'], min: 'nonnegative', example: '1p' },
    };
    const values: Partial<Record<string, number>> = {};
    let ok = true;
    for (const opt of st.options) {
      const slot = slots[opt.name];
      const x = this.read(scope, opt.value, line, slot, where);
      if (x === null) {
        ok = false;
        continue;
      }
      const fine = slot.min === 'positive' ? x > 0 : x >= 0;
      if (!this.bound(opt.value, fine, `${opt.name} must be ${slot.min === 'positive' ? 'more than 0' : 'at least 0'}; it is ${formatSi(x, opt.name === 'gain' ? '' : slot.units[0])}${where}`)) {
        ok = false;
        continue;
      }
      values[opt.name] = x;
    }
    if (!ok) return;
    const element: Element = { kind: 'opamp', name, range: st.range, p, n, o, zout: values.zout ?? 0 };
    if (values.gain !== undefined) element.gain = values.gain;
    if (values.gbw !== undefined) element.gbw = values.gbw;
    if (values.vnoise !== undefined) element.en = values.vnoise;
    if (values.inoise !== undefined) element.inoise = values.inoise;
    this.add(element, st.designator);
  }

  private controlled(scope: Scope, st: ControlledStatement): void {
    const name = scope.prefix + st.designator.name;
    const line = st.range.line;
    const four = st.mode === 'vgain' || st.mode === 'gm';
    if (st.nodes.nodes.length !== (four ? 4 : 2)) return;
    const nodes = st.nodes.nodes.map((id) => this.node(scope, id, name, scope.prefix === ''));
    if (st.value === null) return;
    const where = this.where(scope);
    const slots: Record<string, Slot> = {
      vgain: { says: 'vgain is a voltage gain, in V/V or dB', units: ['dB'], convert: fromDb, example: '10' },
      gm: { says: 'gm is a transconductance, in S', units: ['S'], example: '1m' },
      igain: { says: 'igain is a current gain, in A/A or dB', units: ['dB'], convert: fromDb, example: '10' },
      rm: { says: 'rm is a transresistance, in Ω', units: ['Ω'], example: '1k' },
    };
    const x = this.read(scope, st.value, line, slots[st.mode], where);
    if (x === null) return;
    const [op, on] = nodes;
    if (four) {
      const [, , cp, cn] = nodes;
      const element: Element = st.mode === 'vgain' ? { kind: 'vcvs', name, range: st.range, op, on, cp, cn, gain: x } : { kind: 'vccs', name, range: st.range, op, on, cp, cn, gm: x };
      this.add(element, st.designator);
      return;
    }
    if (st.control === null) return;
    const control = st.control;
    const controlName = scope.prefix + control.name;
    const element: Element = st.mode === 'igain' ? { kind: 'cccs', name, range: st.range, op, on, control: controlName, gain: x } : { kind: 'ccvs', name, range: st.range, op, on, control: controlName, rm: x };
    this.add(element, st.designator);
    this.pending.push(() => this.checkTwoTerminal(scope, control, controlName, `${st.mode} of`));
  }

  /** A part named by `of Rx`, `couple` or `show current` must be a resistor, capacitor or inductor. */
  private checkTwoTerminal(scope: Scope, id: Ident, full: string, what: string, only?: 'inductor'): boolean {
    const e = this.elementNames.get(full);
    if (e === undefined) {
      if (scope.designators.has(id.name) || this.program.brokenWords.has(id.name)) return false; // its own line had an error
      const names = this.suggestBudget <= 0 ? [] : [...this.elementNames.entries()]
        .filter(([n, x]) => n.startsWith(scope.prefix) && (only === undefined ? ['resistor', 'capacitor', 'inductor'].includes(x.kind) : x.kind === only))
        .map(([n]) => n.slice(scope.prefix.length));
      const near = this.near(id.name, names);
      const otherwise = `${what} names ${only === 'inductor' ? 'an inductor' : 'a resistor, capacitor or inductor'} of this network`;
      this.error(id.range, 'unknown-part', `there is no part named ${id.name}${scope.block !== null ? ` in block ${scope.block.name.name}` : ''}`, suggestionHint(near, undefined, otherwise), near.fix);
      return false;
    }
    const fits = only === undefined ? e.kind === 'resistor' || e.kind === 'capacitor' || e.kind === 'inductor' : e.kind === only;
    if (!fits) {
      this.error(id.range, 'wrong-part-kind', `${id.name} is ${articleOf(e.kind)}; ${what} names ${only === 'inductor' ? 'an inductor' : 'a resistor, capacitor or inductor'}`);
      return false;
    }
    return true;
  }

  private couple(scope: Scope, st: CoupleStatement): void {
    const line = st.range.line;
    const where = this.where(scope);
    const k = st.k === null ? null : this.read(scope, st.k, line, { says: 'a coupling factor is a plain number', units: [], example: '0.99' }, where);
    if (st.k !== null && k !== null && !this.bound(st.k, k > 0 && k <= 1, `a coupling factor is more than 0 and at most 1; it is ${formatSi(k)}${where}`, 'tightly wound transformers are near 0.99')) return;
    if (k === null) return;
    const l1 = scope.prefix + st.l1.name;
    const l2 = scope.prefix + st.l2.name;
    if (st.l1.name === st.l2.name) {
      this.error(st.l2.range, 'bad-coupling', `an inductor cannot be coupled to itself`, 'name two different inductors: couple L1 L2 0.99');
      return;
    }
    const name = `${l1}~${l2}`;
    const reversed = `${l2}~${l1}`;
    if (this.elementNames.has(name) || this.elementNames.has(reversed)) {
      this.error(st.range, 'duplicate-coupling', `${st.l1.name} and ${st.l2.name} are coupled already`, 'give each pair one couple line');
      return;
    }
    const element: Element = { kind: 'coupling', name, range: st.range, l1, l2, k };
    this.elementNames.set(name, { kind: 'coupling', range: st.range, line });
    this.elements.push(element);
    this.pending.push(() => {
      this.checkTwoTerminal(scope, st.l1, l1, 'couple', 'inductor');
      this.checkTwoTerminal(scope, st.l2, l2, 'couple', 'inductor');
    });
  }

  private use(scope: Scope, st: UseStatement): void {
    const block = this.blocks.get(st.block.name);
    if (block === undefined) {
      if (this.program.brokenWords.has(st.block.name)) return;
      const names = [...this.blocks.keys()];
      const near = this.near(st.block.name, names);
      const otherwise = names.length > 0 ? `the blocks are ${names.join(', ')}` : 'define it with block NAME [pins] … end';
      this.error(st.block.range, 'unknown-block', `there is no block named ${st.block.name}`, suggestionHint(near, undefined, otherwise), near.fix);
      return;
    }
    this.usedBlocks.add(block.name.name);
    if (scope.stack.includes(block.name.name) || scope.block?.name.name === block.name.name) {
      this.error(st.block.range, 'recursive-block', `block ${block.name.name} cannot use itself`, 'a block may use other blocks, but not itself, directly or through another block');
      return;
    }
    if (st.nodes.nodes.length !== block.pins.nodes.length) {
      const pins = block.pins.nodes.map((p) => p.name).join(' ');
      this.error(st.nodes.range, 'node-count', `block ${block.name.name} has ${block.pins.nodes.length} pin${block.pins.nodes.length === 1 ? '' : 's'} [${pins}]; this connects ${st.nodes.nodes.length}`, `write use ${block.name.name} as ${st.instance.name} [${pins}] with your nodes in that order`);
      return;
    }
    const instance = scope.prefix + st.instance.name;
    const line = st.range.line;
    // The values passed in, read where the use line stands.
    const given = new Map<string, { q: Quantity | null; range: SourceRange }>();
    for (const arg of st.args) {
      if (!block.params.some((p) => p.name.name === arg.name.name)) {
        const names = block.params.map((p) => p.name.name);
        const near = this.near(arg.name.name, names);
        const otherwise = names.length > 0 ? `its parameters are ${names.join(', ')}` : 'it takes no parameters';
        this.error(arg.name.range, 'unknown-parameter', `block ${block.name.name} has no parameter named ${arg.name.name}`, suggestionHint(near, undefined, otherwise), near.fix);
        continue;
      }
      if (given.has(arg.name.name)) {
        this.error(arg.name.range, 'duplicate-argument', `${arg.name.name} is given twice`, 'give each parameter once');
        continue;
      }
      given.set(arg.name.name, { q: arg.value === null ? null : this.evaluate(scope, arg.value, line), range: arg.name.range });
    }
    const inner = this.scope(instance + '.', instance, block, this.top, block.body);
    inner.stack = [...scope.stack, block.name.name];
    if (!this.checkedBlocks.has(block.name.name)) {
      this.checkedBlocks.add(block.name.name);
      this.checkNamespace(inner, block.body);
      this.checkPins(block);
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
        this.error(st.instance.range, 'missing-argument', `${st.instance.name} needs a value for ${p.name.name}: block ${block.name.name} gives it no default`, `add it, like use ${block.name.name} as ${st.instance.name} [${st.nodes.nodes.map((n) => n.name).join(' ')}] (${p.name.name} = …)`);
        ok = false;
        continue;
      }
      const q = this.evaluate(inner, p.default, block.range.line + 0.5);
      if (q === null) ok = false;
      else inner.params.set(p.name.name, { ...q, line: block.range.line, range: p.name.range });
    }
    if (!ok) return;
    block.pins.nodes.forEach((pin, i) => {
      if (pin.name === GROUND || inner.pins.has(pin.name)) return;
      inner.pins.set(pin.name, this.node(scope, st.nodes.nodes[i], null, scope.prefix === ''));
    });
    for (const node of st.nodes.nodes) this.node(scope, node, null);
    for (const s of block.body) if (s.kind === 'let') this.letStatement(inner, s);
    for (const s of block.body) this.partStatement(inner, s);
    this.elementNames.set(instance, { kind: 'instance', range: st.instance.range, line });
  }

  private checkPins(block: BlockStatement): void {
    const seen = new Set<string>();
    for (const pin of block.pins.nodes) {
      if (pin.name === GROUND) {
        this.error(pin.range, 'bad-pin', `a block’s pin cannot be gnd`, 'inside a block, gnd is the ground of the whole network already');
      } else if (seen.has(pin.name)) {
        this.error(pin.range, 'bad-pin', `pin ${pin.name} is listed twice`, 'give each pin once');
      }
      seen.add(pin.name);
    }
  }

  // -------------------------------------------------------------------------------------
  // Drive, traces, sweep, requirements

  private driveStatement(st: DriveStatement): void {
    if (this.driveLine !== 0) {
      this.error(st.range, 'duplicate-drive', `a cell has one drive; there is one on line ${this.driveLine} already`, 'keep one drive line; show a different reference with show NODE / NODE');
      return;
    }
    this.driveLine = st.range.line;
    if (st.nodes.length < 1 || st.nodes.length > 2) return;
    const p = this.node(this.top, st.nodes[0], 'the drive', true);
    const n = st.nodes.length === 2 ? this.node(this.top, st.nodes[1], 'the drive', true) : 0;
    if (p === n) {
      this.error(st.nodesRange, 'bad-drive', p === 0 ? 'the drive cannot be applied to gnd' : `the drive’s two ends are the same node, ${st.nodes[0].name}`, 'drive a node from gnd (drive in) or between two nodes (drive [p n])');
      return;
    }
    const voltage = st.source === 'voltage';
    let amplitude = 1;
    if (st.amplitude !== null) {
      const a = this.read(this.top, st.amplitude, st.range.line, voltage ? { says: 'a voltage drive’s amplitude is in V', units: ['V'], example: '1' } : { says: 'a current drive’s amplitude is in A', units: ['A'], example: '1m' });
      if (a === null) return;
      if (!this.bound(st.amplitude, a !== 0, 'the drive’s amplitude cannot be 0', 'traces are per unit of drive; any amplitude other than 0 works')) return;
      amplitude = a;
    } else if (!voltage) {
      return;
    }
    let phaseDeg = 0;
    if (st.phase !== null) {
      const ph = this.read(this.top, st.phase, st.range.line, { says: 'a phase is in degrees', units: ['deg'], example: '90' });
      if (ph === null) return;
      phaseDeg = ph;
    }
    this.drive = { kind: st.source, p, n, amplitude, phaseDeg, range: st.range };
  }

  private showStatement(st: ShowStatement): TraceSpec | null {
    const e = st.expr;
    let probe: Probe | null = null;
    switch (e.kind) {
      case 'node': {
        const p = this.existingNode(e.node);
        if (p === null) return null;
        if (p === 0) {
          this.error(e.node.range, 'bad-trace', 'gnd is 0 V by definition, so there is nothing to show', 'show another node');
          return null;
        }
        probe = { kind: 'voltage', p, n: 0 };
        break;
      }
      case 'difference': {
        const p = this.existingNode(e.p);
        const n = this.existingNode(e.n);
        if (p === null || n === null) return null;
        if (p === n) {
          this.error(st.exprRange, 'bad-trace', `${e.p.name} - ${e.n.name} is 0 by definition`, 'show the difference of two different nodes');
          return null;
        }
        probe = { kind: 'voltage', p, n };
        break;
      }
      case 'ratio': {
        const num = this.existingNode(e.num);
        const den = this.existingNode(e.den);
        if (num === null || den === null) return null;
        if (den === 0) {
          this.error(e.den.range, 'bad-trace', 'the ratio divides by V(gnd), which is 0', 'divide by the voltage of another node');
          return null;
        }
        probe = { kind: 'ratio', num, den };
        break;
      }
      case 'current': {
        const full = e.element.name;
        if (!this.elementNames.has(full) && this.top.designators.has(full)) return null;
        if (!this.checkTwoTerminal(this.top, e.element, full, 'show current')) return null;
        probe = { kind: 'current', element: full };
        break;
      }
      case 'impedance': {
        const p = this.existingNode(e.p);
        const n = e.n === null ? 0 : this.existingNode(e.n);
        if (p === null || n === null) return null;
        if (p === n) {
          this.error(st.exprRange, 'bad-trace', p === 0 ? 'the impedance from gnd to gnd is 0 by definition' : `the impedance between ${e.p.name} and itself is 0 by definition`, 'name two different nodes');
          return null;
        }
        probe = { kind: 'impedance', p, n };
        break;
      }
    }
    const current = this.drive?.kind === 'current';
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
        this.warn(st.range, 'not-available', 'noise results are not available yet: this trace is checked but not computed', 'a later version adds output noise');
        break;
      case 'step':
        kind = 'step';
        unit = e.kind === 'ratio' ? 'V/V' : e.kind === 'current' ? (current ? 'A/A' : 'A/V') : current ? 'V/A' : 'V/V';
        this.warn(st.range, 'not-available', 'step responses are not available yet: this trace is checked but not computed', 'a later version adds the time domain');
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

  private checkLabels(shows: ShowStatement[], traces: (TraceSpec | null)[]): void {
    const seen = new Map<string, number>();
    traces.forEach((t, i) => {
      if (t === null) return;
      const before = seen.get(t.label);
      if (before !== undefined) {
        const st = shows[i];
        this.error(st.label?.range ?? st.exprRange, 'duplicate-label', `a trace called ${t.label} is shown already, on line ${before}`, st.label === null ? `give one of them a label: show "${t.label} 2" ${st.exprText}` : 'give each trace a label of its own');
        return;
      }
      seen.set(t.label, t.range.line);
    });
  }

  private sweepStatement(st: SweepStatement): SweepSpec | null {
    const line = st.range.line;
    const hz: Slot = { says: 'a sweep’s frequencies are in Hz', units: ['Hz'], example: '10k' };
    if (st.form === 'list') {
      if (st.frequencies.length === 0) {
        this.error(st.range, 'sweep-empty', 'this sweep lists no frequencies', 'write sweep at 1k, 2k, 5k');
        return null;
      }
      const fs: number[] = [];
      for (const v of st.frequencies) {
        const f = this.read(this.top, v, line, hz);
        if (f === null) return null;
        if (f < 0) {
          this.error(v.range, 'sweep-non-positive', `a sweep’s frequencies cannot be negative; this is ${formatSi(f, 'Hz')}`, 'list frequencies of 0 Hz (the DC point) or above');
          return null;
        }
        if (fs.length > 0 && f <= fs[fs.length - 1]) {
          this.error(v.range, 'sweep-order', f === fs[fs.length - 1] ? `${formatSi(f, 'Hz')} is listed twice` : `the frequencies of sweep at go up: ${formatSi(f, 'Hz')} comes after ${formatSi(fs[fs.length - 1], 'Hz')}`, 'list them from low to high, each once');
          return null;
        }
        fs.push(f);
      }
      if (fs.length > this.maxPoints) {
        this.error(st.range, 'sweep-too-many', `this sweep has ${fs.length.toLocaleString('en-US')} points; the limit is ${this.maxPoints.toLocaleString('en-US')}`);
        return null;
      }
      if (fs[0] === 0) this.noteDcPoint(st.range);
      return { kind: 'list', frequencies: fs };
    }
    const from = this.read(this.top, st.from, line, hz);
    const to = this.read(this.top, st.to, line, hz);
    if (from === null || to === null) return null;
    if (st.form === 'log') {
      if (from <= 0 || to <= 0) {
        const bad = from <= 0 ? st.from : st.to;
        this.error(bad.range, 'sweep-non-positive', `a log sweep cannot reach ${formatSi(from <= 0 ? from : to, 'Hz')}: its frequencies are above 0 Hz`, 'start at a small positive frequency, like 1, or use a linear sweep: sweep 0 .. 10k, 101 linear');
        return null;
      }
    } else if (from < 0 || to < 0) {
      const bad = from < 0 ? st.from : st.to;
      this.error(bad.range, 'sweep-non-positive', 'a sweep’s frequencies cannot be negative', 'start at 0 or above');
      return null;
    }
    if (to < from) {
      this.error(st.range, 'sweep-reversed', `this sweep runs backwards, from ${formatSi(from, 'Hz')} down to ${formatSi(to, 'Hz')}`, 'write the lower frequency first', {
        title: 'Swap the ends',
        replacement: `${sourceText(st.to)} .. ${sourceText(st.from)}`,
        range: { line, column: st.from.range.column, endColumn: st.to.range.endColumn },
      });
      return null;
    }
    if (to === from) {
      this.error(st.range, 'sweep-empty', `this sweep starts and stops at ${formatSi(from, 'Hz')}, so it is empty`, `for one frequency write sweep at ${sourceText(st.from)}`);
      return null;
    }
    if (st.form === 'linear') {
      const points = this.integer(this.top, st.points, line, 'a linear sweep’s count of points', 2, Number.MAX_SAFE_INTEGER);
      if (points === null) return null;
      if (points > this.maxPoints) {
        this.error(st.points.range, 'sweep-too-many', `this sweep has ${points.toLocaleString('en-US')} points; the limit is ${this.maxPoints.toLocaleString('en-US')}`, 'use fewer points');
        return null;
      }
      if (from === 0) this.noteDcPoint(st.range);
      return { kind: 'linear', from, to, points };
    }
    let perDecade = 100;
    if (st.perDecade !== null) {
      const n = this.read(this.top, st.perDecade, line, { says: 'points per decade is a plain count', units: [] });
      if (n === null) return null;
      if (!(n > 0)) {
        this.error(st.perDecade.range, 'value-out-of-range', `points per decade must be more than 0; it is ${formatCount(n)}`);
        return null;
      }
      perDecade = n;
    }
    const points = Math.ceil(Math.log10(to / from) * perDecade - 1e-9) + 1;
    if (points > this.maxPoints) {
      this.error(st.perDecade?.range ?? st.range, 'sweep-too-many', `this sweep has ${points.toLocaleString('en-US')} points; the limit is ${this.maxPoints.toLocaleString('en-US')}`, 'use fewer points per decade or a narrower range');
      return null;
    }
    return { kind: 'log', from, to, perDecade };
  }

  /** A sweep with the 0 Hz point: solved, and in the results, but a log frequency axis cannot draw it. */
  private noteDcPoint(range: SourceRange): void {
    this.diagnostics.push(
      diagnostic(range, 'dc-point', 'the 0 Hz point is solved, but the plot’s log frequency axis cannot show it', {
        severity: 'info',
        hint: 'its values are in the results and the readouts use it: the low-frequency gain is the gain at 0 Hz',
      }),
    );
  }

  private timeStatement(st: TimeStatement): Circuit['time'] {
    const line = st.range.line;
    const s: Slot = { says: 'a time window is in s', units: ['s'], example: '10m' };
    const from = this.read(this.top, st.from, line, s);
    const to = this.read(this.top, st.to, line, s);
    if (from === null || to === null) return null;
    if (from < 0) {
      this.error(st.from.range, 'time-window', 'a time window starts at 0 s or later', 'write time 0 .. 10m');
      return null;
    }
    if (to <= from) {
      this.error(st.range, 'time-window', to === from ? 'this time window is empty' : `this time window runs backwards, from ${formatSi(from, 's')} to ${formatSi(to, 's')}`, 'write the earlier time first, like time 0 .. 10m');
      return null;
    }
    let points: number | undefined;
    if (st.points !== null) {
      const n = this.integer(this.top, st.points, line, 'the count of time points', 2, this.maxPoints);
      if (n === null) return null;
      points = n;
    }
    this.warn(st.range, 'not-available', 'the time window is not available yet: it is for step responses, which a later version adds', 'the line is checked but has no effect');
    return points === undefined ? { from, to } : { from, to, points };
  }

  private temperatureStatement(st: TemperatureStatement): number | null {
    const t = this.read(this.top, st.value, st.range.line, {
      says: 'a temperature is in K or °C',
      units: ['K', '°C'],
      convert: (v, u) => (u === '°C' ? v + 273.15 : v),
      example: '25°C or 290 K',
    });
    if (t === null) return null;
    if (!this.bound(st.value, t > 0, `a temperature is above absolute zero; this is ${formatSi(t, 'K')}`, 'write it in K (290 K) or °C (25°C)')) return null;
    this.warn(st.range, 'not-available', 'the temperature is not available yet: it is for noise results, which a later version adds', 'the line is checked but has no effect');
    return t;
  }

  private spreadStatement(st: SpreadStatement): ToleranceSpec | null {
    const spec: ToleranceSpec = { kind: st.mode === 'draws' ? 'montecarlo' : 'worstcase', range: st.range };
    if (st.mode === 'draws') {
      if (st.draws === null) return null;
      const draws = this.integer(this.top, st.draws, st.range.line, 'the count of draws', 1, MAX_DRAWS);
      if (draws === null) return null;
      spec.draws = draws;
      if (st.seed !== null) {
        const seed = this.integer(this.top, st.seed, st.range.line, 'the seed', 0, Number.MAX_SAFE_INTEGER);
        if (seed === null) return null;
        spec.seed = seed;
      }
    }
    this.warn(st.range, 'not-available', 'spreads are not available yet: this line is checked but does not change the results', 'a later version adds random draws and the extremes of the tolerance box');
    return spec;
  }

  private requireStatement(st: RequireStatement, shows: ShowStatement[], traces: (TraceSpec | null)[]): RequirementSpec | null {
    const index = this.findTrace(st, shows, traces);
    if (index === null) return null;
    const trace = traces[index] as TraceSpec;
    const measure = st.measure.name as Measure;
    const pointwise = measure === 'gain' || measure === 'phase' || measure === 'delay' || measure === 'magnitude';
    const loopOnly = measure === 'crossover' || measure === 'phase-margin' || measure === 'gain-margin';
    const stepOnly = measure === 'settling' || measure === 'overshoot';
    if (loopOnly && trace.kind !== 'loop') {
      this.error(st.measure.range, 'wrong-measure', `${measure} is measured on a loop gain, and ${trace.label} is not one`, `show the loop gain with show loop EXPR and require it of that trace`);
      return null;
    }
    if (stepOnly && trace.kind !== 'step') {
      this.error(st.measure.range, 'wrong-measure', `${measure} is measured on a step response, and ${trace.label} is not one`, 'show the step response with show step EXPR and require it of that trace');
      return null;
    }
    if (!stepOnly && trace.kind === 'step') {
      this.error(st.measure.range, 'wrong-measure', `${measure} is a frequency-domain measure; ${trace.label} is a step response`, 'a step response takes settling and overshoot');
      return null;
    }
    if ((measure === 'corner' || measure === 'peak') && trace.kind === 'noise') {
      this.error(st.measure.range, 'wrong-measure', `${measure} is not measured on a noise trace`, 'a noise trace takes gain and magnitude');
      return null;
    }
    if (!pointwise && (st.over !== null || st.at !== null)) {
      const range = st.over?.range ?? (st.at as Value).range;
      this.error(range, 'not-pointwise', `${measure} is one number for the whole trace, so it takes no range`, `write require ${st.target.text} ${measure} ${st.op.op} VALUE`);
      return null;
    }
    const slot = measureSlot(measure, trace);
    const line = st.range.line;
    const value = this.read(this.top, st.value, line, slot);
    if (value === null) return null;
    const spec: RequirementSpec = { range: st.range, text: st.text, trace: index, measure, op: st.op.op, value };
    if (st.tolerance !== null && st.op.op === '=') {
      const q = this.evaluate(this.top, st.tolerance, line);
      if (q === null) return null;
      let tolerance: RequirementSpec['tolerance'];
      if (q.unit === '%' && measure !== 'overshoot') tolerance = { amount: q.value / 100, relative: true };
      else {
        const amount = this.read(this.top, st.tolerance, line, { ...slot, says: `the tolerance of ${measure} is in % or ${slot.unit ?? 'the measure’s unit'}` });
        if (amount === null) return null;
        tolerance = { amount, relative: false };
      }
      if (!this.bound(st.tolerance, tolerance.amount > 0, 'a tolerance is more than 0', 'write it like ± 2% or ± 0.5 dB')) return null;
      spec.tolerance = tolerance;
    }
    const hz: Slot = { says: 'a requirement’s frequencies are in Hz', units: ['Hz'], example: '1k' };
    if (st.over !== null) {
      const over: { from?: number; to?: number } = {};
      if (st.over.from !== null) {
        const f = this.read(this.top, st.over.from, line, hz);
        if (f === null) return null;
        if (!this.bound(st.over.from, f >= 0, 'a frequency cannot be negative')) return null;
        over.from = f;
      }
      if (st.over.to !== null) {
        const f = this.read(this.top, st.over.to, line, hz);
        if (f === null) return null;
        if (!this.bound(st.over.to, f > 0, 'the end of the range is above 0 Hz')) return null;
        over.to = f;
      }
      if (over.from !== undefined && over.to !== undefined && over.to <= over.from) {
        const fix = over.to < over.from && st.over.from !== null && st.over.to !== null
          ? { title: 'Swap the ends', replacement: `${sourceText(st.over.to)} .. ${sourceText(st.over.from)}`, range: { line, column: st.over.from.range.column, endColumn: st.over.to.range.endColumn } }
          : undefined;
        this.error(st.over.range, 'range-reversed', over.to === over.from ? 'this range is empty: both ends are the same' : `this range runs backwards, from ${formatSi(over.from, 'Hz')} down to ${formatSi(over.to, 'Hz')}`, over.to === over.from ? `for one frequency write at ${formatSi(over.from, 'Hz')}` : 'write the lower frequency first', fix);
        return null;
      }
      spec.over = over;
    }
    if (st.at !== null) {
      const f = this.read(this.top, st.at, line, hz);
      if (f === null) return null;
      if (!this.bound(st.at, f >= 0, 'a frequency cannot be negative')) return null;
      spec.at = f;
    }
    if (trace.kind === 'step' || trace.kind === 'noise') {
      this.warn(st.range, 'not-available', `requirements on ${trace.kind === 'step' ? 'step responses' : 'noise'} are not available yet: this one is checked but not evaluated`);
    }
    return spec;
  }

  /** The trace a requirement names: by label, then by the show line's words. */
  private findTrace(st: RequireStatement, shows: ShowStatement[], traces: (TraceSpec | null)[]): number | null {
    const text = st.target.text;
    const levels: ((i: number) => boolean)[] = [
      (i) => shows[i].label !== null && shows[i].label?.text === text,
      (i) => shows[i].label === null && (traces[i]?.label ?? labelOf(shows[i])) === text,
      (i) => (shows[i].mode === 'plain' ? shows[i].exprText : `${shows[i].mode} ${shows[i].exprText}`) === text,
      (i) => shows[i].exprText === text,
      (i) => shows[i].mode !== 'plain' && shows[i].mode === text,
    ];
    if (st.target.quoted) levels.splice(2);
    for (const level of levels) {
      const found = shows.map((_, i) => i).filter(level);
      if (found.length === 0) continue;
      if (found.length > 1) {
        this.error(st.target.range, 'ambiguous-target', `${text} could be the trace on line ${shows[found[0]].range.line} or on line ${shows[found[1]].range.line}`, 'give the trace a label in quotes and require it by that label');
        return null;
      }
      const i = found[0];
      if (traces[i] === null) return null; // its show line had an error
      return i;
    }
    if (shows.some((s, i) => traces[i] === null && (labelOf(s) === text || s.exprText === text)) || this.program.brokenWords.has(text)) return null;
    const names = traces.filter((t): t is TraceSpec => t !== null).map((t) => t.label);
    const near = this.near(text, names);
    this.error(
      st.target.range,
      'unknown-target',
      shows.length === 0 ? `there is no trace called ${text}: this cell shows nothing` : `there is no trace called ${text}`,
      suggestionHint(near, undefined, shows.length === 0 ? `add show ${text}` : `the traces are ${names.join(', ')}; a requirement names a trace’s label or what its show line shows`),
      st.target.quoted ? undefined : near.fix,
    );
    return null;
  }

  // -------------------------------------------------------------------------------------
  // Whole-cell checks

  private wholeCellChecks(shows: ShowStatement[], traces: (TraceSpec | null)[], drives: DriveStatement[]): void {
    if (this.program.incomplete) return;
    const parts = this.program.statements.filter((s) => s.kind === 'passive' || s.kind === 'opamp' || s.kind === 'controlled' || s.kind === 'use');
    const needsDrive = shows.filter((s, i) => traces[i]?.kind !== 'impedance' && s.expr.kind !== 'impedance');
    if (drives.length === 0 && needsDrive.length > 0) {
      const st = needsDrive[0];
      this.error(st.range, 'no-drive', `this cell has no drive, so ${labelOf(st)} has nothing to be compared with`, 'add a drive line, like drive in (1 V between in and gnd)');
    }
    if (shows.length === 0 && parts.length > 0) {
      this.warn(parts[0].range, 'no-trace', 'this cell shows nothing', 'add a show line, like show out');
    }
    if (this.diagnostics.some((d) => d.severity === 'error' && d.code !== CASCADE)) return;
    this.connectivity(shows);
  }

  private connectivity(shows: ShowStatement[]): void {
    const count = this.nodes.length;
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
    for (const e of this.elements) {
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
        default:
          break;
      }
    }
    if (this.drive !== null && this.drive.kind === 'voltage') join(this.drive.p, this.drive.n);

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
      const first = this.nodes[group[0]];
      const key = `${first.range.line}:${first.range.column}`;
      if (reported.has(key)) continue;
      reported.add(key);
      const names = group.map((i) => this.nodes[i].name);
      const list = names.length <= 5 ? joinWords(names) : `${names.slice(0, 4).join(', ')} and ${names.length - 4} more`;
      this.error(
        first.range,
        'no-path-to-ground',
        names.length === 1 ? `node ${names[0]} has no path to gnd` : `nodes ${list} have no path to gnd`,
        `connect ${names.length === 1 ? 'it' : 'them'} to gnd through parts, a voltage source or an op-amp output; op-amp inputs, control pins and current sources do not make a path`,
      );
    }

    const shown = new Set<string>();
    for (const s of shows) for (const n of nodesOf(s)) shown.add(n);
    const names = this.nodes.map((n) => n.name);
    let dangling = 0;
    for (let i = 1; i < count; i++) {
      const node = this.nodes[i];
      if (node.touches.size !== 1 || shown.has(node.name) || floating.has(find(i)) || GROUND_LOOKALIKE.test(node.name)) continue;
      const key = `${node.range.line}:${node.range.column}`;
      if (reported.has(key)) continue;
      reported.add(key);
      if (++dangling > MAX_DANGLING) continue;
      const [only] = [...node.touches];
      const near = this.near(node.name, names.filter((n) => n !== node.name && n !== GROUND));
      const onlyLocal = node.block !== null && only.includes('.') ? only.slice(only.lastIndexOf('.') + 1) : only;
      this.warn(
        node.range,
        'dangling-node',
        node.block === null ? `node ${node.name} connects only to ${only}` : `node ${node.local} of block ${node.block} connects only to ${onlyLocal}`,
        near.question !== undefined ? `a misspelt node name? ${near.question}` : 'a node usually joins two or more parts; check the spelling',
        node.block === null ? near.fix : undefined,
      );
    }
    if (dangling > MAX_DANGLING) {
      const first = this.nodes.find((n, i) => i > 0 && n.touches.size === 1) as NodeInfo;
      this.warn(first.range, 'dangling-node', `${(dangling - MAX_DANGLING).toLocaleString('en-US')} more nodes connect to only one part`, 'the first ' + MAX_DANGLING + ' are marked where they are written');
    }
  }
}

function designatorOf(st: Statement): { ident: Ident; kind: string } | null {
  switch (st.kind) {
    case 'passive':
      return { ident: st.designator, kind: st.part };
    case 'opamp':
      return { ident: st.designator, kind: 'opamp' };
    case 'controlled':
      return { ident: st.designator, kind: 'controlled' };
    case 'use':
      return { ident: st.instance, kind: 'use' };
    default:
      return null;
  }
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
  };
  return names[kind];
}

function labelOf(st: ShowStatement): string {
  return st.label?.text ?? (st.mode === 'plain' ? st.exprText : `${st.mode} ${st.exprText}`);
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
    case 'current':
      return [];
  }
}

function sourceText(v: Value): string {
  switch (v.kind) {
    case 'number':
      return v.text;
    case 'name':
      return v.name;
    case 'expr':
      return v.range.endColumn - v.range.column === v.text.length ? v.text : `(${v.text})`;
  }
}

function joinWords(names: string[]): string {
  if (names.length <= 1) return names.join('');
  return `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

function formatCount(n: number): string {
  return Number.isInteger(n) ? n.toLocaleString('en-US') : formatSi(n);
}

/** Units a requirement's value may carry, by measure and the trace's kind. */
function measureSlot(measure: Measure, trace: TraceSpec): Slot {
  const unit = MEASURES[measure];
  if (unit === '') {
    const units: Unit[] = trace.unit === 'Ω' || trace.unit === 'V/A' ? ['Ω'] : trace.unit === 'A/V' || trace.unit === 'A/A' ? ['A'] : trace.unit === 'V/√Hz' ? ['V'] : [];
    return { says: `the magnitude of ${trace.label} is in ${trace.unit}`, units, unit: trace.unit };
  }
  const { in: written, example } = MEASURE_UNIT_WORDS[unit];
  return { says: `${measure} is ${written}`, units: [unit], unit: unit === 'deg' ? '°' : unit, example };
}

/** How a measure's unit is said in messages, with an example value. */
const MEASURE_UNIT_WORDS: Record<Exclude<(typeof MEASURES)[Measure], ''>, { in: string; example: string }> = {
  dB: { in: 'in dB', example: '-3 dB' },
  deg: { in: 'in degrees', example: '45°' },
  s: { in: 'a time, in s', example: '1m' },
  Hz: { in: 'a frequency, in Hz', example: '1k' },
  '%': { in: 'in %', example: '5%' },
};
