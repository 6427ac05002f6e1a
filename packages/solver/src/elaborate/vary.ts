/**
 * The `vary` line: which top-level `let` parameter it steps and through which values, checked
 * against the point limit (every variant is solved over the whole sweep). The variants
 * themselves are elaborated by `compileVariants` (variants.ts), each with the parameter's
 * value replaced.
 */
import type { SourceRange, SweepSpec } from '../circuit.js';
import type { Value, VaryStatement } from '../ast.js';
import type { Elaboration, Param } from './context.js';
import { suggestionHint } from '../suggest.js';
import { formatSi } from '../units.js';
import { DEFAULT_SWEEP, gridFromSpec, logGrid } from '../sweep.js';
import { isConstantName, isFunctionName } from '../vocabulary.js';
import type { Unit } from '../vocabulary.js';
import { evaluate, formatCount, read } from './values.js';
import { merge } from '../parser/cursor.js';

/** A checked `vary` line. */
export interface VarySpec {
  /** The name of the top-level `let` parameter it steps. */
  parameter: string;
  /** The unit its `let` line is written in; null without one (or for a product of units). */
  unit: Unit | null;
  /** One value per variant, in the order written (a range from its first end to its second). */
  values: number[];
  /** Where each value is written (every value of a range points at the range). */
  ranges: SourceRange[];
  range: SourceRange;
}

/** Points of the default sweep before it widens: what one variant of a cell without a sweep line costs. */
const DEFAULT_SWEEP_POINTS = logGrid(DEFAULT_SWEEP.from, DEFAULT_SWEEP.to, DEFAULT_SWEEP.perDecade).length;

/** The cell's one `vary` line, checked; null without one or when it has an error (reported). */
export function varyStatements(cx: Elaboration, sweep: SweepSpec | null): VarySpec | null {
  const lines = cx.program.statements.filter((s): s is VaryStatement => s.kind === 'vary');
  if (lines.length === 0) return null;
  const st = lines[0];
  for (const extra of lines.slice(1)) {
    cx.error(
      extra.range,
      'duplicate-vary',
      `a cell varies one parameter; line ${st.range.line} varies ${st.name.name} already`,
      'keep one vary line: to step a second parameter too, copy the cell and vary it there',
    );
  }
  const param = parameterOf(cx, st);
  if (param === null) return null;
  const picked = st.form === 'list' ? listValues(cx, st, param) : rangeValues(cx, st, param);
  if (picked === null || !withinPointLimit(cx, st, picked.values.length, sweep)) return null;
  const unit = param.unit === null || param.unit === 'compound' ? null : param.unit;
  return { parameter: st.name.name, unit, values: picked.values, ranges: picked.ranges, range: st.range };
}

/** How a variant is named wherever a person reads it: "Rload = 10 Ω". */
export function variantLabel(spec: VarySpec, value: number): string {
  return `${spec.parameter} = ${formatSi(value, spec.unit ?? '')}`;
}

/** The top-level `let` parameter a `vary` line names, or null (with the reason reported unless it is reported elsewhere). */
function parameterOf(cx: Elaboration, st: VaryStatement): Param | null {
  const { name, range } = st.name;
  if (cx.top.lets.has(name)) {
    // A let whose value failed has its error on its own line.
    return cx.top.params.get(name) ?? null;
  }
  const notParameter = (what: string, hint: string) => {
    cx.error(range, 'not-a-parameter', `${name} is ${what}, not a parameter: vary steps a parameter defined with let`, hint);
    return null;
  };
  const part = cx.top.designators.get(name);
  if (part !== undefined) return notParameter(`a part (line ${part.line})`, `write let R = 10k, give ${name} the value R, and vary R`);
  if (cx.nodeIndex.has(name)) return notParameter('a node', 'vary steps the value of a part through a parameter: let R = 10k, R1 [a b] R, vary R over …');
  if (isConstantName(name) || isFunctionName(name))
    return notParameter(isConstantName(name) ? 'a built-in constant' : 'a built-in function', 'choose a let parameter');
  for (const block of cx.blocks.values()) {
    const own = block.params.some((p) => p.name.name === name) || block.body.some((s) => s.kind === 'let' && s.name.name === name);
    if (own) {
      return notParameter(
        `a parameter of block ${block.name.name}`,
        `define let ${name} = … at the top of the cell, pass it to the block (use ${block.name.name} as B1 […] (${name} = ${name})) and vary that`,
      );
    }
  }
  if (cx.program.brokenWords.has(name)) return null;
  const lets = [...cx.top.lets.keys()];
  const near = cx.near(name, lets);
  const otherwise =
    lets.length > 0 ? `the parameters are ${lets.slice(0, 8).join(', ')}${lets.length > 8 ? ', …' : ''}` : 'define it first with let NAME = VALUE';
  cx.error(range, 'undefined-name', `there is no parameter named ${name}`, suggestionHint(near, undefined, otherwise), near.fix);
  return null;
}

/** A value of the line as a number in the parameter's unit, or null (reported). */
function valueOf(cx: Elaboration, st: VaryStatement, v: Value, param: Param): number | null {
  const name = st.name.name;
  const uses = v.kind === 'name' ? v.name === name : v.kind === 'expr' && v.tokens.some((t) => t.kind === 'name' && t.text === name);
  if (uses) {
    cx.error(v.range, 'vary-self', `a value of vary ${name} cannot use ${name} itself`, 'write the values as numbers, like 1k, 10k');
    return null;
  }
  const q = evaluate(cx, cx.top, v, st.range.line);
  if (q === null) return null;
  // Every variant keeps the unit of the let line, so a value's own unit must be that one.
  const own = param.unit;
  if (own !== 'compound' && q.unit !== null && q.unit !== 'compound' && q.unit !== own) {
    const message =
      own === null
        ? `${name} has no unit on its let line; this value is in ${q.unit}`
        : `${name} is in ${own}, as its let line writes it; this value is in ${q.unit}`;
    const hint = own === null ? `write the values without a unit, or give the let line the unit ${q.unit}` : `write the values in ${own}, or without a unit`;
    cx.error(v.range, 'unit-mismatch', message, hint);
    return null;
  }
  return q.value;
}

function listValues(cx: Elaboration, st: VaryStatement & { form: 'list' }, param: Param): { values: number[]; ranges: SourceRange[] } | null {
  const values: number[] = [];
  for (const v of st.values) {
    const x = valueOf(cx, st, v, param);
    if (x === null) return null;
    if (values.includes(x))
      cx.warn(
        v.range,
        'vary-duplicate',
        `${formatSi(x, param.unit === null || param.unit === 'compound' ? '' : param.unit)} is listed twice`,
        'list each value once',
      );
    values.push(x);
  }
  return { values, ranges: st.values.map((v) => v.range) };
}

function rangeValues(cx: Elaboration, st: VaryStatement & { form: 'range' }, param: Param): { values: number[]; ranges: SourceRange[] } | null {
  const from = valueOf(cx, st, st.from, param);
  const to = valueOf(cx, st, st.to, param);
  const count = read(cx, cx.top, st.count, st.range.line, { says: 'the count of values is a plain number', units: [] });
  if (from === null || to === null || count === null) return null;
  const unit = param.unit === null || param.unit === 'compound' ? '' : param.unit;
  if (!Number.isInteger(count) || count < 2) {
    cx.error(
      st.count.range,
      'vary-count',
      `a range of values has a whole number of values, at least 2 (its two ends); this asks for ${formatCount(count)}`,
      'write vary R over 1k .. 100k, 5 values',
    );
    return null;
  }
  if (from === to) {
    cx.error(
      st.range,
      'vary-empty',
      `this range starts and stops at ${formatSi(from, unit)}`,
      `for one value write vary ${st.name.name} over ${formatSi(from, unit).replace(' ', '')}`,
    );
    return null;
  }
  if (!st.linear && !(from / to > 0)) {
    cx.error(
      merge(st.from.range, st.to.range),
      'vary-range',
      `values spaced by equal ratios cannot reach or cross 0; this range runs from ${formatSi(from, unit)} to ${formatSi(to, unit)}`,
      'write linear after the count for evenly spaced values: vary R over 0 .. 10, 6 values linear',
    );
    return null;
  }
  if (!withinPointLimit(cx, st, count, null, true)) return null;
  const values: number[] = [];
  for (let k = 0; k < count; k++) {
    const t = k / (count - 1);
    values.push(st.linear ? from + (to - from) * t : from * Math.pow(to / from, t));
  }
  // The ends as written, not as the spacing's arithmetic rounds them.
  values[0] = from;
  values[count - 1] = to;
  return { values, ranges: values.map(() => merge(st.from.range, st.count.range)) };
}

/**
 * Whether every variant's sweep fits in the point limit together; reported on the line when not.
 * `countOnly`: a first check before a range's values are made, against one point per variant.
 */
function withinPointLimit(cx: Elaboration, st: VaryStatement, count: number, sweep: SweepSpec | null, countOnly = false): boolean {
  const limit = cx.maxPoints;
  const each = countOnly ? 1 : sweep === null ? DEFAULT_SWEEP_POINTS : (gridFromSpec(sweep, Infinity).frequencies?.length ?? 1);
  if (count * each <= limit) return true;
  const sweepWords = sweep === null ? `of the default sweep’s ${formatCount(each)} points` : `of ${formatCount(each)} points`;
  cx.error(
    st.range,
    'vary-too-many',
    countOnly
      ? `${formatCount(count)} variants are more than the point limit allows: ${formatCount(limit)} points in all`
      : `${formatCount(count)} variants ${sweepWords} each make ${formatCount(count * each)} points; the limit is ${formatCount(limit)} points in all`,
    'vary fewer values, or sweep fewer points (fewer per decade, or a narrower range)',
  );
  return false;
}
