/**
 * The first example of the language definition (cell-language.md, "A first example")
 * must compile with no diagnostics at all and give the circuit a designer expects.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { compile } from '../src/compile.js';
import type { Capacitor, OpAmp, Resistor } from '../src/circuit.js';
import { FIRST_EXAMPLE } from '../src/examples.js';

describe('the first example of the language definition', () => {
  const { circuit, diagnostics } = compile(FIRST_EXAMPLE);

  it('compiles with no diagnostics', () => {
    expect(diagnostics).toEqual([]);
    expect(circuit).not.toBeNull();
  });

  it('has the nodes and parts as written', () => {
    const c = circuit!;
    expect(c.nodeNames).toEqual(['gnd', 'in', 'a', 'b', 'out']);
    const node = (name: string) => c.nodeNames.indexOf(name);
    expect(c.elements.map((e) => `${e.kind} ${e.name}`)).toEqual(['resistor R1', 'resistor R2', 'capacitor C1', 'capacitor C2', 'opamp U1']);
    const [r1, r2, c1, c2, u1] = c.elements as [Resistor, Resistor, Capacitor, Capacitor, OpAmp];
    expect(r1).toMatchObject({ a: node('in'), b: node('a'), value: 10e3, tolerance: 0.01, noiseless: false });
    expect(r2).toMatchObject({ a: node('a'), b: node('b'), value: 10e3, tolerance: 0.01 });
    expect(c1).toMatchObject({ a: node('a'), b: node('out'), tolerance: 0.05, esr: 0, esl: 0 });
    expect(c1.value).toBeCloseTo(22.5e-9, 20);
    expect(c2).toMatchObject({ a: node('b'), b: 0, tolerance: 0.05, esl: 0 });
    expect(c2.value).toBeCloseTo(11.25e-9, 20);
    expect(c2.esr).toBeCloseTo(0.02, 15);
    expect(u1).toMatchObject({ p: node('b'), n: node('out'), o: node('out'), zout: 0, gbw: 1e6 });
    expect(u1.gain).toBeCloseTo(1e5, 6); // 100 dB
    expect(u1.en).toBeUndefined();
    expect(u1.inoise).toBeUndefined();
  });

  it('is the Butterworth low-pass its comment says: fc = 1/(2π·R·√(Ca·Cb)) = 1 kHz, Q = ½·√(Ca/Cb) = 1/√2', () => {
    const [r1, , c1, c2] = circuit!.elements as [Resistor, Resistor, Capacitor, Capacitor];
    const fc = 1 / (2 * Math.PI * r1.value * Math.sqrt(c1.value * c2.value));
    expect(fc).toBeCloseTo(1000, 0);
    expect(0.5 * Math.sqrt(c1.value / c2.value)).toBeCloseTo(Math.SQRT1_2, 12);
  });

  it('drives in with 1 V at 0°, shows out, sweeps 10 Hz to 100 kHz', () => {
    const c = circuit!;
    expect(c.drive).toMatchObject({ kind: 'voltage', p: 1, n: 0, amplitude: 1, phaseDeg: 0 });
    expect(c.traces).toHaveLength(1);
    expect(c.traces[0]).toMatchObject({ label: 'out', expr: 'out', kind: 'ratio', unit: 'V/V', probe: { kind: 'voltage', p: 4, n: 0 } });
    expect(c.sweep).toEqual({ kind: 'log', from: 10, to: 100e3, perDecade: 100 });
    expect(c.tolerance).toBeNull();
    expect(c.temperature).toBe(300);
    expect(c.time).toBeNull();
  });

  it('maps its three requirements to the trace and measure', () => {
    const [a, b, d] = circuit!.requirements;
    expect(a).toMatchObject({
      trace: 0,
      measure: 'gain',
      op: '>=',
      value: -0.3,
      over: { from: 10, to: 500 },
      text: 'require out gain >= -0.3 dB over 10 .. 500',
    });
    expect(a.range.line).toBe(15);
    expect(b).toMatchObject({ trace: 0, measure: 'corner', op: '=', value: 1000, tolerance: { amount: 0.02, relative: true } });
    expect(b.over).toBeUndefined();
    expect(d).toMatchObject({ trace: 0, measure: 'gain', op: '<=', value: -38, over: { from: 10e3 } });
    expect(d.over?.to).toBeUndefined();
  });

  it('is the example LANGUAGE.md shows, word for word', () => {
    const reference = readFileSync(new URL('../LANGUAGE.md', import.meta.url), 'utf8');
    expect(reference).toContain(FIRST_EXAMPLE);
  });
});
