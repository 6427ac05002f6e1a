/** No input crashes analyze(): garbage text, mangled cells, malformed networks. */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyze, analyzeCircuit } from '../src/analyze.js';
import type { Circuit } from '../src/circuit.js';
import { INTERNAL_ERROR } from '../src/diagnostic.js';
import { net } from './helpers/net.js';

const CELL = `let R = 10k
drive in
R1 [in a] R
C1 [a out] 22n esr 0.1
C2 [b gnd] 11n
R2 [a b] R
U1 [b out out] opamp gain 100dB gbw 1M zout 50
L1 [out x] 1m dcr 2
L2 [x gnd] 2m
couple L1 L2 0.5
A1 [y gnd x gnd] vgain 3
R3 [y gnd] 1k
show out
show loop out / a
show impedance x
sweep 10 .. 100k, 20/decade
require out corner = 1k ± 50%
require out gain <= 10 dB over 10 ..
`;

function wellFormed(r: ReturnType<typeof analyze>): void {
  expect(Array.isArray(r.diagnostics)).toBe(true);
  for (const d of r.diagnostics) {
    expect(['error', 'warning']).toContain(d.severity);
    expect(d.line).toBeGreaterThanOrEqual(1);
    expect(typeof d.message).toBe('string');
  }
  for (const t of r.traces) expect(t.re.length).toBe(r.frequencies.length);
  expect(r.diagnostics.some((d) => d.code === INTERNAL_ERROR)).toBe(false);
}

describe('robustness', { timeout: 30_000 }, () => {
  it('the sample cell analyses cleanly', () => {
    const r = analyze(CELL);
    expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    wellFormed(r);
  });

  it('never throws on arbitrary text', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 200 }), (s) => {
        wellFormed(analyze(s));
      }),
      { numRuns: 300 },
    );
  });

  it('never throws on a cell with characters deleted, duplicated or replaced', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ at: fc.nat({ max: CELL.length - 1 }), op: fc.constantFrom('del', 'dup', 'digit', 'zero'), len: fc.integer({ min: 1, max: 6 }) }), {
          minLength: 1,
          maxLength: 4,
        }),
        (edits) => {
          let s = CELL;
          for (const e of edits) {
            const at = Math.min(e.at, s.length - 1);
            if (e.op === 'del') s = s.slice(0, at) + s.slice(at + e.len);
            else if (e.op === 'dup') s = s.slice(0, at + e.len) + s.slice(at);
            else if (e.op === 'digit') s = s.slice(0, at) + '9' + s.slice(at + 1);
            else s = s.slice(0, at) + '0' + s.slice(at + 1);
          }
          wellFormed(analyze(s));
        },
      ),
      { numRuns: 300 },
    );
  });

  it('a gain in dB beyond what a number holds is an error on its value, not a fault (found by the property above)', () => {
    // 10100 dB is 10^505 V/V, past the largest double (about 1.8e308; IEEE 754).
    const text = CELL.replace('gain 100dB', 'gain 10100dB');
    const r = analyze(text);
    wellFormed(r);
    const problem = r.diagnostics.find((d) => d.code === 'value-out-of-range');
    expect(problem?.message).toBe('`10100dB` is too large to compute (beyond ±1.8e308)');
    expect([problem?.line, text.split('\n')[problem!.line - 1].slice(problem!.column - 1, problem!.endColumn - 1)]).toEqual([7, '10100dB']);
  });

  it('a malformed network becomes error diagnostics, not an exception', () => {
    const bad: Circuit = net().vdrive('in').R('R1', 'in', 'out', NaN).v('out', 'out').build();
    const r = analyzeCircuit(bad);
    expect(r.diagnostics.some((d) => d.severity === 'error')).toBe(true);
    const worse = { ...net().vdrive('in').v('out', 'out').build(), elements: [{ kind: 'resistor', name: 'R9', a: 99, b: 0, value: 1 }] } as unknown as Circuit;
    expect(analyzeCircuit(worse).diagnostics.some((d) => d.severity === 'error')).toBe(true);
    const broken = { nodeNames: ['gnd'] } as unknown as Circuit;
    const r3 = analyzeCircuit(broken);
    expect(r3.diagnostics.some((d) => d.code === INTERNAL_ERROR)).toBe(true);
  });

  it('extreme element values (1e-15 F beside 1e12 Ω) still give finite, exact answers', () => {
    // An RC low-pass of 1 TΩ and 1 fF: corner 159.15 Hz, next to a 1 Ω, 1 F pair at 0.159 Hz.
    const r = analyze('drive in\nR1 [in a] 1T\nC1 [a gnd] 1f\nR2 [in b] 1\nC2 [b gnd] 1\nshow a\nshow b\nsweep 1m .. 10k');
    expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const corner = (label: string): number => r.readouts.find((x) => x.trace === label && x.name === 'corner')!.value;
    expect(Math.abs(corner('a') * 2 * Math.PI * 1e12 * 1e-15 - 1)).toBeLessThan(1e-9);
    expect(Math.abs(corner('b') * 2 * Math.PI - 1)).toBeLessThan(1e-9);
  });
});
