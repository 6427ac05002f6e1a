/**
 * What a person must be told about a solved trace before trusting its numbers: points with
 * no finite value (a trace that is zero everywhere, an exact null, a value beyond double
 * precision, a ratio over a zero voltage) and a loop gain whose sign makes it positive
 * feedback. Each becomes one diagnostic on the trace's `show` line; nothing non-finite
 * reaches a screen unexplained. (Singular frequencies have their own warning, from the solve.)
 */
import type { Circuit } from './circuit.js';
import type { Diagnostic } from './result.js';
import type { AcAnalysis, TraceData } from './analysis.js';
import { formatFrequencyList, formatSi } from './units.js';
import { diagnostic } from './diagnostic.js';

/** Diagnostics for every solved trace of the analysis. */
export function traceDiagnostics(circuit: Circuit, analysis: AcAnalysis): Diagnostic[] {
  const singular = new Set(analysis.singular);
  return analysis.traces.flatMap((trace) => {
    const spec = circuit.traces[trace.plan.specIndex];
    return checkTrace(trace, analysis.frequencies, singular).map(({ severity, code, message, hint }) =>
      diagnostic(spec.range, code, message, { severity, hint }),
    );
  });
}

type Finding = Omit<Diagnostic, 'line' | 'column' | 'endColumn'>;

function checkTrace(trace: TraceData, f: Float64Array, singular: Set<number>): Finding[] {
  const r = trace.result;
  const label = r.label;
  const zero: number[] = [];
  const huge: number[] = [];
  const missing: number[] = [];
  for (let k = 0; k < f.length; k++) {
    const m = r.magnitude[k] as number;
    if (m === 0) zero.push(f[k]);
    else if (m === Infinity) huge.push(f[k]);
    else if (Number.isNaN(m) && !singular.has(f[k]) && trace.plan.reader !== null) missing.push(f[k]);
  }
  const out: Finding[] = [];
  if (f.length > 0 && zero.length === f.length) {
    out.push({
      severity: 'warning',
      message: `${label} is exactly 0 at every frequency of the sweep, so it has no gain in dB, no phase and no readouts`,
      hint: 'a difference of two nodes that always carry the same voltage, or a node nothing reaches, is zero everywhere',
      code: 'trace-zero',
    });
    return out;
  }
  if (zero.length > 0) {
    out.push({
      severity: 'info',
      message: `${label} is exactly 0 at ${formatFrequencyList(zero)}: its gain there is −∞ dB and its phase undefined`,
      hint: 'an exact null of the network, or a value below about 1e-308, the smallest a double-precision number holds',
      code: 'trace-null',
    });
  }
  if (huge.length > 0) {
    out.push({
      severity: 'warning',
      message: `${label} is larger than a double-precision number holds at ${formatFrequencyList(huge)}: its gain there is +∞ dB`,
      code: 'trace-overflow',
    });
  }
  if (missing.length > 0) {
    const ratio = trace.plan.reader?.kind === 'ratio';
    out.push({
      severity: 'warning',
      message: `${label} has no value at ${formatFrequencyList(missing)}${ratio ? ': the voltage it divides by is 0 there' : ''}`,
      code: 'trace-undefined',
    });
  }
  const sign = loopSign(trace);
  if (sign) out.push(sign);
  return out;
}

/**
 * A loop gain T = A·β of a negative-feedback loop is positive at low frequency (phase near
 * 0°). One that starts negative with |T| > 1 is, as written, positive feedback there; its
 * phase margin then reads as nonsense, so say what it most likely means.
 */
function loopSign(trace: TraceData): Finding | null {
  const r = trace.result;
  if (r.kind !== 'loop') return null;
  for (let k = 0; k < r.magnitude.length; k++) {
    const m = r.magnitude[k] as number;
    if (!Number.isFinite(m) || m === 0) continue;
    if (!(m > 1 && (r.re[k] as number) < 0)) return null;
    return {
      severity: 'warning',
      message: `${r.label} is negative at low frequency (phase ${formatSi(r.phaseDeg[k] as number, '°')}, |T| > 1): as written the loop is positive feedback there, and its margins mean nothing`,
      hint: 'a negative-feedback loop gain T = A·β starts near 0°: check the sign (reverse the difference, or the points the loop is read between)',
      code: 'loop-sign',
    };
  }
  return null;
}
