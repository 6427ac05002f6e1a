/** Running cell text through analyze() and reading its result in tests. */
import { expect } from 'vitest';
import { analyze } from '../../src/analyze.js';
import type { Readout, Result, TraceResult } from '../../src/result.js';

/** analyze() that fails the test on any error diagnostic. */
export function run(text: string): Result {
  const result = analyze(text);
  const errors = result.diagnostics.filter((d) => d.severity === 'error');
  expect(errors, JSON.stringify(errors)).toEqual([]);
  return result;
}

export function trace(result: Result, label: string): TraceResult {
  const t = result.traces.find((x) => x.label === label);
  if (!t) throw new Error(`no trace ${label}; have ${result.traces.map((x) => x.label).join(', ')}`);
  return t;
}

export function readout(result: Result, label: string, name: string): Readout {
  const r = result.readouts.find((x) => x.trace === label && x.name === name);
  if (!r)
    throw new Error(
      `no readout ${name} on ${label}; have ${result.readouts
        .filter((x) => x.trace === label)
        .map((x) => x.name)
        .join(', ')}`,
    );
  return r;
}

/** Index of the sweep point at f (the sweep must contain it). */
export function at(result: Result, f: number): number {
  const k = Array.from(result.frequencies).findIndex((x) => Math.abs(x - f) <= 1e-12 * f);
  if (k < 0) throw new Error(`${f} Hz is not in the sweep`);
  return k;
}

/** dB, phase, group delay and |H| of a trace at f. */
export function point(result: Result, label: string, f: number): { db: number; deg: number; delay: number; mag: number; re: number; im: number } {
  const t = trace(result, label);
  const k = at(result, f);
  return { db: t.magnitudeDb[k], deg: t.phaseDeg[k], delay: t.groupDelay[k], mag: t.magnitude[k], re: t.re[k], im: t.im[k] };
}

export function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

/** Frequencies written with full precision for a `sweep at` line. */
export function sweepAt(...fs: number[]): string {
  return `sweep at ${[...fs]
    .sort((a, b) => a - b)
    .map((f) => f.toPrecision(17))
    .join(', ')}`;
}
