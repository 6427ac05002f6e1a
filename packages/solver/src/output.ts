/**
 * Printing a Result: the contract's JSON (plain arrays, non-finite numbers as null), CSV
 * (one row per frequency) and a short text report. Pure functions, usable by the command
 * line and by the API's exports alike.
 */
import type { Readout, RequirementResult, Result } from './result.js';
import { formatNumber, formatQuantity } from './format.js';

export interface OutputOptions {
  /** Only this trace (by label) and its readouts. */
  trace?: string;
}

/** The result with only the chosen trace, or unchanged without a choice. */
export function selectTrace(result: Result, label: string | undefined): Result {
  if (label === undefined) return result;
  return {
    ...result,
    traces: result.traces.filter((t) => t.label === label),
    readouts: result.readouts.filter((r) => r.trace === label),
  };
}

/** One JSON object of the contract's shape. */
export function toJson(result: Result, options: OutputOptions = {}): string {
  const r = selectTrace(result, options.trace);
  // JSON.stringify already writes NaN and ±Infinity as null; typed arrays need turning into arrays.
  return JSON.stringify(r, (_key, value: unknown) => (ArrayBuffer.isView(value) ? Array.from(value as Float64Array) : value));
}

/** One row per frequency: frequency_hz, then LABEL_mag_db, LABEL_phase_deg (and LABEL_mag for impedances). */
export function toCsv(result: Result, options: OutputOptions = {}): string {
  const r = selectTrace(result, options.trace);
  const header = ['frequency_hz'];
  const columns: ArrayLike<number>[] = [r.frequencies];
  for (const t of r.traces) {
    header.push(`${t.label}_mag_db`, `${t.label}_phase_deg`);
    columns.push(t.magnitudeDb, t.phaseDeg);
    if (t.kind === 'impedance') {
      header.push(`${t.label}_mag`);
      columns.push(t.magnitude);
    }
  }
  const lines = [header.map(csvField).join(',')];
  for (let k = 0; k < r.frequencies.length; k++) {
    lines.push(columns.map((c) => (Number.isFinite(c[k]) ? String(c[k]) : '')).join(','));
  }
  return lines.join('\n') + '\n';
}

function csvField(s: string): string {
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function readoutText(r: Readout): string {
  const value = r.unit === 'Hz' || r.unit === 'Ω' ? formatQuantity(r.value, r.unit) : `${formatNumber(r.value)}${r.unit ? ' ' + r.unit : ''}`;
  return r.at !== null && r.name !== 'phase-margin' && r.name !== 'gain-margin' ? `${value} at ${formatQuantity(r.at, 'Hz')}` : value;
}

/** "PASS  line 17  require … — measured 1.0002 kHz" */
export function requirementText(q: RequirementResult): string {
  const status = q.status === 'not-available' ? 'N/A ' : q.pass ? 'PASS' : 'FAIL';
  const unit = q.unit ?? '';
  let measured = '';
  if (q.status !== 'not-available') {
    const v = unit === 'Hz' || unit === 's' || unit === 'Ω' ? formatQuantity(q.measured, unit) : `${formatNumber(q.measured)}${unit ? ' ' + unit : ''}`;
    measured = `  (${q.worstAt !== null ? 'worst ' : 'measured '}${v}${q.worstAt !== null ? ` at ${formatQuantity(q.worstAt, 'Hz')}` : ''})`;
  }
  return `${status}  line ${q.line}: ${q.text}${measured}`;
}

/** The text report: readouts per trace, then requirement results. */
export function toText(result: Result, options: OutputOptions & { readouts?: boolean } = {}): string {
  const r = selectTrace(result, options.trace);
  const lines: string[] = [];
  if (options.readouts !== false) {
    const f = r.frequencies;
    if (f.length > 0) lines.push(`sweep ${formatQuantity(f[0], 'Hz')} .. ${formatQuantity(f[f.length - 1], 'Hz')}, ${f.length} points`);
    for (const t of r.traces) {
      lines.push(`${t.label}  (${t.kind}, ${t.unit})`);
      const rs = r.readouts.filter((x) => x.trace === t.label);
      if (rs.length === 0) lines.push('  no readouts');
      const width = Math.max(0, ...rs.map((x) => x.name.length));
      for (const x of rs) lines.push(`  ${x.name.padEnd(width)}  ${readoutText(x)}`);
    }
  }
  if (r.requirements.length > 0) {
    lines.push('requirements');
    for (const q of r.requirements) lines.push(`  ${requirementText(q)}`);
  }
  return lines.join('\n') + '\n';
}
