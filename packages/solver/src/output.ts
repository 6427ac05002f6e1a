/**
 * Printing a Result: the contract's JSON (plain arrays, non-finite numbers as null, stable
 * ids), CSV (one row per frequency, or per time for the step traces) and a short text report in the screens' words. Pure
 * functions, usable by the command line and by the API's exports alike.
 */
import type { Readout, RequirementResult, Result, StepResult, TraceResult, VariantResult } from './result.js';
import { READOUT_NAMES, STATUS_WORDS } from './result.js';
import { formatReading, formatSi } from './units.js';

export interface OutputOptions {
  /** Only this trace (by label) and its readouts. */
  trace?: string;
}

/** The result with only the chosen trace (in every variant too; a step trace too), or unchanged without a choice. */
export function selectTrace(result: Result, label: string | undefined): Result {
  if (label === undefined) return result;
  const only = <T extends { traces: TraceResult[]; readouts: Readout[]; steps: StepResult[] }>(r: T): T => ({
    ...r,
    traces: r.traces.filter((t) => t.label === label),
    readouts: r.readouts.filter((x) => x.trace === label),
    steps: r.steps.filter((s) => s.label === label),
  });
  return result.variants === undefined ? only(result) : { ...only(result), variants: result.variants.map(only) };
}

/**
 * Fields whose infinite value is a result in its own right (a gain margin of +∞ when the
 * phase never reaches −180°, the −∞ dB of an exact null): JSON writes them as the strings
 * `"Infinity"` and `"-Infinity"`, so they differ from null, "no value".
 */
const INFINITE_AS_TEXT = new Set(['value', 'measured']);

/** One JSON object of the contract's shape. */
export function toJson(result: Result, options: OutputOptions = {}): string {
  const r = selectTrace(result, options.trace);
  // JSON.stringify writes NaN and ±Infinity as null; typed arrays need turning into arrays.
  return JSON.stringify(r, (key, value: unknown) => {
    if (ArrayBuffer.isView(value)) return Array.from(value as Float64Array);
    if (INFINITE_AS_TEXT.has(key) && (value === Infinity || value === -Infinity)) return value > 0 ? 'Infinity' : '-Infinity';
    return value;
  });
}

/**
 * One row per frequency: `frequency (Hz)`, then for each trace `LABEL · gain (dB)`,
 * `LABEL · phase (°)` and `LABEL · group delay (s)`; an impedance trace has
 * `LABEL · magnitude (dBΩ)` in place of the gain and `LABEL · magnitude (Ω)` after them.
 */
export function toCsv(result: Result, options: OutputOptions = {}): string {
  const r = selectTrace(result, options.trace);
  const header = ['frequency (Hz)'];
  const columns: ArrayLike<number>[] = [];
  let frequencies: ArrayLike<number> = r.frequencies;
  if (r.variants === undefined) {
    traceColumns(r.traces, '', header, columns);
  } else {
    // With variants, `LABEL · VARIANT · …` columns over every variant's frequencies; a variant is empty where it has no point.
    frequencies = Float64Array.from(new Set(r.variants.flatMap((v) => Array.from(v.frequencies)))).sort();
    for (const v of r.variants) {
      const own: ArrayLike<number>[] = [];
      traceColumns(v.traces, ` · ${v.label}`, header, own);
      const at = new Map(Array.from(v.frequencies, (f, k) => [f, k]));
      columns.push(...own.map((c) => Array.from(frequencies, (f) => c[at.get(f) ?? -1] ?? NaN)));
    }
  }
  columns.unshift(frequencies);
  const lines = [header.map(csvField).join(',')];
  for (let k = 0; k < frequencies.length; k++) {
    lines.push(columns.map((c) => (Number.isFinite(c[k]) ? String(c[k]) : '')).join(','));
  }
  return lines.join('\n') + '\n';
}

/**
 * The step traces' table, one row per time: `time (s)`, then `LABEL (UNIT)` for each step
 * trace (they share one time axis). Only a header when the cell shows no step.
 */
export function toStepCsv(result: Result, options: OutputOptions = {}): string {
  const r = selectTrace(result, options.trace);
  const header = ['time (s)', ...r.steps.map((s) => `${s.label} (${s.unit})`)];
  const times = r.steps[0]?.times ?? [];
  const lines = [header.map(csvField).join(',')];
  for (let k = 0; k < times.length; k++) {
    lines.push([times[k], ...r.steps.map((s) => s.values[k])].map((v) => (Number.isFinite(v) ? String(v) : '')).join(','));
  }
  return lines.join('\n') + '\n';
}

/** The CSV columns of some traces, each header `LABEL` + `suffix` + ` · quantity (unit)`. */
function traceColumns(traces: readonly TraceResult[], suffix: string, header: string[], columns: ArrayLike<number>[]): void {
  for (const t of traces) {
    const name = `${t.label}${suffix}`;
    const impedance = t.kind === 'impedance';
    header.push(`${name} · ${impedance ? 'magnitude (dBΩ)' : 'gain (dB)'}`, `${name} · phase (°)`, `${name} · group delay (s)`);
    columns.push(t.magnitudeDb, t.phaseDeg, t.groupDelay);
    if (impedance) {
      header.push(`${name} · magnitude (${t.unit})`);
      columns.push(t.magnitude);
    }
  }
}

function csvField(s: string): string {
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function readoutText(r: Readout): string {
  const value = formatReading(r.value, r.unit);
  return r.at !== null ? `${value} at ${formatSi(r.at, 'Hz')}` : value;
}

/**
 * "pass  line 17: require … (measured 1.0002 kHz)", or why it was not checked; the status
 * reads as on every screen. With variants, the variant measured and those that fail are named.
 */
export function requirementText(q: RequirementResult, variants?: readonly VariantResult[]): string {
  const status = STATUS_WORDS[q.status].padEnd(4);
  const shown = q.variants !== undefined && variants !== undefined ? variants[q.variants.worst] : undefined;
  const within = shown === undefined ? '' : ` with ${shown.label}`;
  let measured = q.reason !== null ? `  (not checked${within}: ${q.reason})` : '';
  if (q.status !== 'not-applicable') {
    const v = formatReading(q.measured, q.unit);
    measured = `  (${q.worstAt !== null ? `worst ${v} at ${formatSi(q.worstAt, 'Hz')}` : `measured ${v}`}${within})`;
  }
  const failing = q.variants?.failed.map((i) => variants?.[i]?.label).filter((l): l is string => l !== undefined) ?? [];
  const fails = failing.length > 0 ? `; ${STATUS_WORDS.fail} with ${failing.join(', ')}` : '';
  return `${status}  line ${q.line}: ${q.text}${measured}${fails}`;
}

/** The text report: readouts per trace by their screen names, then requirement results. */
export function toText(result: Result, options: OutputOptions & { readouts?: boolean } = {}): string {
  const r = selectTrace(result, options.trace);
  const lines: string[] = [];
  if (options.readouts !== false && r.variants !== undefined) {
    lines.push(...variantsText(r.variants));
  } else if (options.readouts !== false) {
    const f = r.frequencies;
    if (f.length > 0) lines.push(`sweep ${formatSi(f[0], 'Hz')} .. ${formatSi(f[f.length - 1], 'Hz')}, ${f.length} points`);
    for (const t of r.traces) {
      lines.push(`${t.label}  (${t.kind}, ${t.unit})`);
      const rs = r.readouts.filter((x) => x.trace === t.label);
      if (rs.length === 0) lines.push('  no readouts');
      const width = Math.max(0, ...rs.map((x) => READOUT_NAMES[x.name].length));
      for (const x of rs) lines.push(`  ${READOUT_NAMES[x.name].padEnd(width)}  ${readoutText(x)}`);
    }
    for (const s of r.steps) {
      const t = s.times;
      lines.push(`${s.label}  (step, ${s.unit}${t.length > 0 ? `, ${formatSi(t[0], 's')} .. ${formatSi(t[t.length - 1], 's')}, ${t.length} points` : ''})`);
      const rs = r.readouts.filter((x) => x.trace === s.label);
      if (rs.length === 0) lines.push('  no readouts');
      const width = Math.max(0, ...rs.map((x) => READOUT_NAMES[x.name].length));
      for (const x of rs) lines.push(`  ${READOUT_NAMES[x.name].padEnd(width)}  ${readoutText(x)}`);
    }
  }
  if (r.requirements.length > 0) {
    lines.push('requirements');
    for (const q of r.requirements) lines.push(`  ${requirementText(q, r.variants)}`);
  }
  return lines.join('\n') + '\n';
}

/** Each variant's sweep, then per trace a table of readouts with one column per variant. */
function variantsText(variants: readonly VariantResult[]): string[] {
  const lines: string[] = [];
  for (const v of variants) {
    const f = v.frequencies;
    if (f.length > 0) lines.push(`${v.label}: sweep ${formatSi(f[0], 'Hz')} .. ${formatSi(f[f.length - 1], 'Hz')}, ${f.length} points`);
  }
  const first = variants[0];
  for (const t of first?.traces ?? []) {
    lines.push(`${t.label}  (${t.kind}, ${t.unit})`);
    const names = [...new Set(variants.flatMap((v) => v.readouts.filter((x) => x.trace === t.label).map((x) => x.name)))];
    if (names.length === 0) {
      lines.push('  no readouts');
      continue;
    }
    const rows = [['', ...variants.map((v) => v.label)]];
    for (const name of names) {
      rows.push([
        READOUT_NAMES[name],
        ...variants.map((v) => {
          const x = v.readouts.find((y) => y.trace === t.label && y.name === name);
          return x === undefined ? '–' : readoutText(x);
        }),
      ]);
    }
    const widths = rows[0].map((_, c) => Math.max(...rows.map((row) => row[c].length)));
    for (const row of rows)
      lines.push(
        `  ${row
          .map((cell, c) => cell.padEnd(widths[c]))
          .join('  ')
          .trimEnd()}`,
      );
  }
  return lines;
}
