/**
 * What every step of the elaboration shares: the diagnostics it has made, the node table,
 * the elements and blocks found so far, and the scopes parameters and designators live in.
 */
import type { Drive, Element, NodeIndex, SourceRange } from '../circuit.js';
import type { Diagnostic } from '../result.js';
import type { BlockStatement, Ident, Program, Statement } from '../ast.js';
import type { ExprUnit } from '../expr.js';
import { diagnostic, replaceWith } from '../diagnostic.js';
import type { FixSpec } from '../diagnostic.js';
import { didYouMean, suggestionHint } from '../suggest.js';
import type { Suggestion } from '../suggest.js';
import { GROUND } from '../vocabulary.js';

/** Node names that look like ground but are not (`GND`, `ground`): warned about once. */
export const GROUND_LOOKALIKE = /^(gnd|ground|agnd|0v)$/i;
/** A problem that only echoes an error on a line that could not be read; never shown. */
export const CASCADE = 'cascade';

export interface Param {
  value: number;
  unit: ExprUnit;
  /** Line of its definition; visible to lines after it. */
  line: number;
  range: SourceRange;
}

export interface Scope {
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

export interface NodeInfo {
  name: string;
  /** Where it is first written. */
  range: SourceRange;
  /** The name as written, and the block it belongs to, for a block's private node. */
  local: string;
  block: string | null;
  /** Parts (and the drive) that touch it. */
  touches: Set<string>;
}

/** What the elaboration of one cell has found so far. */
export class Elaboration {
  readonly diagnostics: Diagnostic[] = [];
  readonly nodes: NodeInfo[] = [];
  readonly nodeIndex = new Map<string, NodeIndex>();
  readonly elements: Element[] = [];
  readonly elementNames = new Map<string, { kind: Element['kind'] | 'instance'; range: SourceRange; line: number }>();
  readonly blocks = new Map<string, BlockStatement>();
  readonly usedBlocks = new Set<string>();
  /** Checks that need every element first: controlling parts and couplings. */
  readonly pending: (() => void)[] = [];
  /** Blocks whose namespace and pins have been checked (once, however often they are used). */
  readonly checkedBlocks = new Set<string>();
  drive: Drive | null = null;
  driveLine = 0;
  suggestBudget = 200_000;
  readonly top: Scope;

  constructor(
    readonly program: Program,
    /** Most frequency points a sweep may have. */
    readonly maxPoints: number,
    /** Most parts a network may have after blocks are flattened. */
    readonly maxParts: number,
    /** Values that replace those of top-level `let` lines, by name: one variant of a `vary` line. */
    readonly overrides: ReadonlyMap<string, number> = new Map(),
  ) {
    this.nodes.push({ name: 'gnd', range: { line: 1, column: 1, endColumn: 1 }, local: 'gnd', block: null, touches: new Set() });
    this.nodeIndex.set('gnd', 0);
    this.top = this.scope('', '', null, null, program.statements);
  }

  error(range: SourceRange, code: string, message: string, hint?: string, fix?: FixSpec): void {
    this.diagnostics.push(diagnostic(range, code, message, { hint, fix }));
  }

  warn(range: SourceRange, code: string, message: string, hint?: string, fix?: FixSpec): void {
    this.diagnostics.push(diagnostic(range, code, message, { hint, fix, severity: 'warning' }));
  }

  /**
   * "Did you mean", within a budget: a cell with thousands of misspellings still
   * elaborates quickly, and the first problems keep their suggestions.
   */
  near(name: string, candidates: string[]): Suggestion {
    if (this.suggestBudget <= 0) return didYouMean(name, []);
    this.suggestBudget -= candidates.length;
    return didYouMean(name, candidates);
  }

  scope(prefix: string, instance: string, block: BlockStatement | null, parent: Scope | null, body: Statement[]): Scope {
    const s: Scope = {
      prefix,
      instance,
      block,
      params: new Map(),
      lets: new Map(),
      designators: new Map(),
      pins: new Map(),
      parent,
      stack: parent ? [...parent.stack] : [],
    };
    for (const st of body) {
      if (st.kind === 'let' && !s.lets.has(st.name.name)) s.lets.set(st.name.name, st.range.line);
      const d = designatorOf(st);
      if (d !== null && !s.designators.has(d.ident.name)) s.designators.set(d.ident.name, { line: d.ident.range.line, kind: d.kind, range: d.ident.range });
    }
    return s;
  }

  /** The index of a node written in `scope`, created on first use. */
  node(scope: Scope, id: Ident, toucher: string | null, privateCheck = false): NodeIndex {
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
        this.error(
          id.range,
          'private-node',
          `${name} is a node inside block instance ${owner}; it is reached through the instance’s pins`,
          'add a pin to the block, or show the node instead of connecting to it',
        );
      }
    }
    let index = this.nodeIndex.get(full);
    if (index === undefined) {
      if (GROUND_LOOKALIKE.test(name)) {
        this.warn(
          id.range,
          'ground-name',
          `${name} is a node of its own, not ground`,
          `ground is written ${GROUND}, and names are case-sensitive`,
          replaceWith(GROUND),
        );
      }
      index = this.nodes.length;
      this.nodes.push({ name: full, range: id.range, local: name, block: scope.block?.name.name ?? null, touches: new Set() });
      this.nodeIndex.set(full, index);
    }
    if (toucher !== null) this.nodes[index].touches.add(toucher);
    return index;
  }

  /** A node named by a trace or requirement: it must exist already. */
  existingNode(id: Ident): NodeIndex | null {
    if (id.name === GROUND) return 0;
    const index = this.nodeIndex.get(id.name);
    if (index !== undefined) return index;
    if (this.program.brokenWords.has(id.name)) return null;
    const names = this.suggestBudget > 0 ? this.nodes.slice(1).map((n) => n.name) : [];
    const near = this.near(id.name, names);
    const otherwise =
      names.length > 0
        ? `the nodes are ${names.slice(0, 10).join(', ')}${names.length > 10 ? ', …' : ''}`
        : this.nodes.length > 1
          ? undefined
          : 'no part connects to any node yet';
    this.error(id.range, 'unknown-node', `there is no node named ${id.name} in this network`, suggestionHint(near, undefined, otherwise), near.fix);
    return null;
  }
}

/** The designator a statement defines, with its kind; null for lines that define none. */
export function designatorOf(st: Statement): { ident: Ident; kind: string } | null {
  switch (st.kind) {
    case 'passive':
      return { ident: st.designator, kind: st.part };
    case 'opamp':
      return { ident: st.designator, kind: 'opamp' };
    case 'controlled':
      return { ident: st.designator, kind: 'controlled' };
    case 'transformer':
      return { ident: st.designator, kind: 'transformer' };
    case 'break':
      return { ident: st.designator, kind: 'break' };
    case 'use':
      return { ident: st.instance, kind: 'use' };
    default:
      return null;
  }
}
