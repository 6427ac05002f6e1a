/**
 * The variants of a cell with a `vary` line. Each is elaborated with its parameter's value in
 * place of the one on the `let` line (the same network as the cell with that value written
 * there) and solved on its own; then they are put together: every variant's traces, readouts
 * and requirement results, and each requirement's result over them all, which passes only
 * where every variant passes.
 */
import type { Circuit, SourceRange } from './circuit.js';
import type { Program } from './ast.js';
import type { Diagnostic, RequirementResult, Result, VariantResult } from './result.js';
import type { VarySpec } from './elaborate/vary.js';
import { variantLabel } from './elaborate/vary.js';
import { elaborate } from './elaborate/index.js';
import type { ElaborateOptions } from './elaborate/index.js';
import { diagnostic } from './diagnostic.js';
import { DEFAULT_MAX_POINTS } from './sweep.js';

/** One variant, elaborated. */
export interface CompiledVariant {
  parameter: string;
  value: number;
  /** The parameter's unit, '' without one. */
  unit: string;
  /** "Rload = 10 Ω" */
  label: string;
  circuit: Circuit;
}

/** Each variant's share of the point limit: every variant is solved over its own sweep. */
export function pointShare(maxPoints: number | undefined, variants: number): number {
  return Math.floor((maxPoints ?? DEFAULT_MAX_POINTS) / Math.max(1, variants));
}

/** Variants whose elaboration fails are reported, at most this many, each by its first error. */
const REPORTED_FAILURES = 3;

const keyOf = (d: Diagnostic) => `${d.severity}|${d.line}|${d.column}|${d.code}|${d.message}`;

/** A diagnostic of one variant, placed on the value of the `vary` line it comes from. */
function onValue(d: Diagnostic, range: SourceRange, label: string): Diagnostic {
  const where = d.line !== range.line ? ` (line ${d.line})` : '';
  return diagnostic(range, d.code, `with ${label}: ${d.message}${where}`, { severity: d.severity, hint: d.hint });
}

/**
 * Elaborates every variant of `spec`, each within its share of the point limit. What a
 * variant says that the cell as written does not (a part's value that turns negative, a
 * sweep that depends on the parameter and grows past the share) is reported on its value.
 */
export function compileVariants(
  program: Program,
  spec: VarySpec,
  nominal: readonly Diagnostic[],
  options: Omit<ElaborateOptions, 'overrides'>,
): { variants: CompiledVariant[]; diagnostics: Diagnostic[] } {
  const base: Program = { ...program, statements: program.statements.filter((s) => s.kind !== 'vary') };
  const seen = new Set(nominal.map(keyOf));
  const variants: CompiledVariant[] = [];
  const diagnostics: Diagnostic[] = [];
  let failures = 0;
  spec.values.forEach((value, i) => {
    const label = variantLabel(spec, value);
    const maxPoints = pointShare(options.maxPoints, spec.values.length);
    const elaborated = elaborate(base, { ...options, maxPoints, overrides: new Map([[spec.parameter, value]]) });
    const own = elaborated.diagnostics.filter((d) => !seen.has(keyOf(d)));
    const firstError = own.find((d) => d.severity === 'error');
    if (firstError !== undefined) {
      if (failures++ < REPORTED_FAILURES) diagnostics.push(onValue(firstError, spec.ranges[i], label));
    }
    for (const d of own.filter((x) => x.severity !== 'error')) {
      seen.add(keyOf(d));
      diagnostics.push(onValue(d, spec.ranges[i], label));
    }
    if (elaborated.circuit !== null) variants.push({ parameter: spec.parameter, value, unit: spec.unit ?? '', label, circuit: elaborated.circuit });
  });
  return { variants, diagnostics };
}

/** The result of a cell with variants, from each variant's own result (in the same order). */
export function combineVariants(variants: readonly CompiledVariant[], results: readonly Result[]): Result {
  const first = results[0];
  const variantResults: VariantResult[] = variants.map((v, i) => ({
    parameter: v.parameter,
    value: v.value,
    unit: v.unit,
    label: v.label,
    frequencies: results[i].frequencies,
    traces: results[i].traces,
    readouts: results[i].readouts,
    requirements: results[i].requirements,
    steps: results[i].steps,
  }));
  return {
    ...first,
    diagnostics: mergeDiagnostics(variants, results),
    requirements: first.requirements.map((_, q) => combineRequirement(results.map((r) => r.requirements[q]))),
    variants: variantResults,
  };
}

/** A diagnostic every variant gives is shown once as it is; one that only some give names each of them. */
function mergeDiagnostics(variants: readonly CompiledVariant[], results: readonly Result[]): Diagnostic[] {
  const byKey = new Map<string, { d: Diagnostic; labels: string[] }>();
  results.forEach((r, i) => {
    for (const d of r.diagnostics) {
      const key = keyOf(d);
      const entry = byKey.get(key) ?? { d, labels: [] };
      if (!entry.labels.includes(variants[i].label)) entry.labels.push(variants[i].label);
      byKey.set(key, entry);
    }
  });
  const merged: Diagnostic[] = [];
  for (const { d, labels } of byKey.values()) {
    if (labels.length === variants.length) merged.push(d);
    else for (const label of labels) merged.push({ ...d, message: `with ${label}: ${d.message}` });
  }
  return merged;
}

/** How far a measured value is inside its band; negative outside it, NaN without a value. */
function margin(q: RequirementResult): number {
  const above = q.band.low === null ? Infinity : q.measured - q.band.low;
  const below = q.band.high === null ? Infinity : q.band.high - q.measured;
  return Math.min(above, below);
}

/**
 * One requirement over every variant: failed when any variant fails (showing the one that
 * fails by most), else n/a when any could not be checked (showing the first), else passed
 * (showing the one closest to its limit). `variants` says which it shows and which failed.
 */
function combineRequirement(each: readonly RequirementResult[]): RequirementResult {
  const failed = each.flatMap((q, i) => (q.status === 'fail' ? [i] : []));
  const unchecked = each.findIndex((q) => q.status === 'not-applicable');
  let worst: number;
  if (failed.length > 0) worst = lowest(each, failed);
  else if (unchecked >= 0) worst = unchecked;
  else
    worst = lowest(
      each,
      each.map((_, i) => i),
    );
  return { ...each[worst], variants: { worst, failed } };
}

/** The index among `indices` whose margin is least (a margin that is not a number counts as least). */
function lowest(each: readonly RequirementResult[], indices: number[]): number {
  let best = indices[0];
  for (const i of indices) {
    const m = margin(each[i]);
    const b = margin(each[best]);
    if (Number.isNaN(m) ? !Number.isNaN(b) : m < b) best = i;
  }
  return best;
}
