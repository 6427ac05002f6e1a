/**
 * Printing a Result: the contract's JSON (plain arrays, non-finite numbers as null, stable
 * ids), CSV (one row per frequency) and a short text report in the screens' words. Pure
 * functions, usable by the command line and by the API's exports alike.
 */
import type { Readout, RequirementResult, Result } from './result.js';
import { READOUT_NAMES, STATUS_WORDS } from './result.js';
import { formatReading, formatSi } from './units.js';

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
  const columns: ArrayLike<number>[] = [r.frequencies];
  for (const t of r.traces) {
    const impedance = t.kind === 'impedance';
    header.push(`${t.label} · ${impedance ? 'magnitude (dBΩ)' : 'gain (dB)'}`, `${t.label} · phase (°)`, `${t.label} · group delay (s)`);
    columns.push(t.magnitudeDb, t.phaseDeg, t.groupDelay);
    if (impedance) {
      header.push(`${t.label} · magnitude (${t.unit})`);
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
  const value = formatReading(r.value, r.unit);
  return r.at !== null ? `${value} at ${formatSi(r.at, 'Hz')}` : value;
}

/** "pass  line 17: require … (measured 1.0002 kHz)", or why it was not checked; the status reads as on every screen. */
export function requirementText(q: RequirementResult): string {
  const status = STATUS_WORDS[q.status].padEnd(4);
  let measured = q.reason !== null ? `  (not checked: ${q.reason})` : '';
  if (q.status !== 'not-applicable') {
    const v = formatReading(q.measured, q.unit);
    measured = `  (${q.worstAt !== null ? `worst ${v} at ${formatSi(q.worstAt, 'Hz')}` : `measured ${v}`})`;
  }
  return `${status}  line ${q.line}: ${q.text}${measured}`;
}

/** The text report: readouts per trace by their screen names, then requirement results. */
export function toText(result: Result, options: OutputOptions & { readouts?: boolean } = {}): string {
  const r = selectTrace(result, options.trace);
  const lines: string[] = [];
  if (options.readouts !== false) {
    const f = r.frequencies;
    if (f.length > 0) lines.push(`sweep ${formatSi(f[0], 'Hz')} .. ${formatSi(f[f.length - 1], 'Hz')}, ${f.length} points`);
    for (const t of r.traces) {
      lines.push(`${t.label}  (${t.kind}, ${t.unit})`);
      const rs = r.readouts.filter((x) => x.trace === t.label);
      if (rs.length === 0) lines.push('  no readouts');
      const width = Math.max(0, ...rs.map((x) => READOUT_NAMES[x.name].length));
      for (const x of rs) lines.push(`  ${READOUT_NAMES[x.name].padEnd(width)}  ${readoutText(x)}`);
    }
  }
  if (r.requirements.length > 0) {
    lines.push('requirements');
    for (const q of r.requirements) lines.push(`  ${requirementText(q)}`);
  }
  return lines.join('\n') + '\n';
}
