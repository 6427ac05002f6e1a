/**
 * The readouts of a step trace and the requirements on it: found between time points, never
 * passing by default. Each expected value names its source beside it.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyze } from '../src/analyze.js';
import { num } from './helpers/networks.js';
import { readout, rel, run } from './helpers/cell.js';

const RC = 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow step out\n';
const TAU = 1e-3;

describe('readouts of a step trace', () => {
  it('RC: t63 = τ, rise time = τ·ln 9, settling = τ·ln 100, no overshoot [textbook first-order step, solved for 63.2 %, 10 %, 90 %, 99 %]', () => {
    // A coarse window: the readouts come from solving between the points, not from the grid.
    const r = run(RC + 'time 0 .. 10m, 11 points\n');
    expect(rel(readout(r, 'step out', 'final').value, 1)).toBeLessThan(1e-12);
    expect(readout(r, 'step out', 'final').unit).toBe('V');
    expect(rel(readout(r, 'step out', 't63').value, TAU)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'step out', 'rise-time').value, TAU * Math.log(9))).toBeLessThan(1e-6);
    expect(rel(readout(r, 'step out', 'settling').value, TAU * Math.log(100))).toBeLessThan(1e-6);
    expect(readout(r, 'step out', 'settling').unit).toBe('s');
    expect(readout(r, 'step out', 'overshoot').value).toBe(0);
  });

  it('an inverting stage reads like any other: final −10, the times of its magnitude [common practice: readouts are fractions of the final value]', () => {
    const r = run('drive in\nR1 [in n] 1k\nR2 [n out] 10k\nC1 [n out] 100n\nU1 [gnd n out] opamp\nshow step out\n');
    expect(rel(readout(r, 'step out', 'final').value, -10)).toBeLessThan(1e-12);
    // Pole at R2·C1 = 1 ms.
    expect(rel(readout(r, 'step out', 't63').value, 1e-3)).toBeLessThan(1e-6);
    expect(readout(r, 'step out', 'overshoot').value).toBe(0);
  });

  it('a step whose final value is 0 has a final value and no fractions of it, with the reason on the trace line', () => {
    const r = analyze('drive in\nC1 [in out] 1u\nR1 [out gnd] 1k\nshow step out\n');
    expect(readout(r, 'step out', 'final').value).toBe(0);
    expect(r.readouts.filter((x) => x.trace === 'step out').map((x) => x.name)).toEqual(['final']);
    const note = r.diagnostics.find((d) => d.code === 'step-readouts');
    expect(note?.line).toBe(4);
    expect(note?.hint).toContain('final value is 0');
  });

  it('a window too short to settle has no settling time, and says to widen it', () => {
    const r = analyze(RC + 'time 0 .. 2m\n');
    expect(r.readouts.some((x) => x.trace === 'step out' && x.name === 'settling')).toBe(false);
    expect(r.diagnostics.find((d) => d.code === 'step-readouts')?.hint).toContain('widen it');
  });
});

describe('requirements on a step trace', () => {
  it('value at a time, solved exactly there, inside or outside the window [textbook: 1 − e^(−5) = 0.993262]', () => {
    const r = run(RC + 'require step out value >= 0.99 at 5m\nrequire step out value >= 0.7 at 1m\nrequire step out value = 1 ± 1m at 20m\n');
    const [five, one, late] = r.requirements;
    expect(five).toMatchObject({ status: 'pass', measure: 'value', unit: 'V', at: 5e-3, over: null, reason: null });
    expect(five.measured).toBeCloseTo(1 - Math.exp(-5), 7);
    expect(one.status).toBe('fail');
    expect(one.measured).toBeCloseTo(1 - Math.exp(-1), 7);
    expect(late.status).toBe('pass');
  });

  it('settling and overshoot compare the readouts [textbook: τ·ln 100 = 4.605 ms; exp(−πζ/√(1−ζ²)) = 16.3 % at ζ = 0.5]', () => {
    const r = run(RC + 'require step out settling <= 5m\nrequire step out settling <= 4m\n');
    expect(r.requirements.map((q) => q.status)).toEqual(['pass', 'fail']);
    expect(rel(r.requirements[0].measured, TAU * Math.log(100))).toBeLessThan(1e-6);
    const rlc = run('drive in\nR1 [in a] 100\nL1 [a b] 10m\nC1 [b gnd] 1u\nshow step b\nrequire step overshoot <= 5%\nrequire step b overshoot <= 20%\n');
    expect(rlc.requirements.map((q) => q.status)).toEqual(['fail', 'pass']);
    expect(rlc.requirements[0].measured).toBeCloseTo(16.3034, 3);
  });

  it('one that cannot be measured is not applicable, with its reason and a warning, never a pass', () => {
    const r = analyze(
      'drive current out 1m\nC1 [out gnd] 1u\nshow step out\ntime 0 .. 1m\nrequire step out settling <= 1\nrequire step out overshoot <= 100%\n',
    );
    for (const q of r.requirements) {
      expect(q.status).toBe('not-applicable');
      expect(Number.isNaN(q.measured)).toBe(true);
      expect(q.reason).toContain('no final value');
    }
    expect(r.diagnostics.filter((d) => d.code === 'requirement-not-checked').map((d) => d.line)).toEqual([5, 6]);
  });

  it('elaboration refuses what does not fit a step response', () => {
    const errors = (text: string): string[] =>
      analyze(RC + text)
        .diagnostics.filter((d) => d.severity === 'error')
        .map((d) => d.code);
    expect(errors('require step out gain >= 0\n')).toEqual(['wrong-measure']);
    expect(errors('require step out value >= 0.5\n')).toEqual(['missing-time']);
    expect(errors('require step out value >= 0.5 at 1 kHz\n')).toEqual(['unit-mismatch']);
    expect(errors('require step out value >= 0.5 at -1m\n')).toEqual(['value-out-of-range']);
    expect(errors('show out\nrequire out settling <= 1m\n')).toEqual(['wrong-measure']);
    expect(errors('require step out value >= 0.5 V at 1m\n')).toEqual([]);
  });
});

describe('property: the final value of a step is the DC gain of the AC solve', () => {
  // A ladder of series parts (R, or L with its winding resistance) and shunt parts (R or C).
  const section = fc.record({
    series: fc.constantFrom('R', 'L'),
    shunt: fc.constantFrom('R', 'C'),
    a: fc.double({ min: 1, max: 5, noNaN: true }),
    b: fc.double({ min: 1, max: 5, noNaN: true }),
  });
  it('holds for random ladders [common practice: the final value theorem, lim sH(s)/s = H(0)]', () => {
    fc.assert(
      fc.property(fc.array(section, { minLength: 1, maxLength: 4 }), (sections) => {
        const lines = ['drive in'];
        sections.forEach((s, k) => {
          const from = k === 0 ? 'in' : `n${k}`;
          const to = `n${k + 1}`;
          const a = Math.pow(10, s.a);
          const b = Math.pow(10, s.b);
          lines.push(s.series === 'R' ? `R${k + 1} [${from} ${to}] ${num(a)}` : `L${k + 1} [${from} ${to}] ${num(a * 1e-6)} dcr ${num(a / 100)}`);
          lines.push(s.shunt === 'R' ? `R${k + 11} [${to} gnd] ${num(b)}` : `C${k + 1} [${to} gnd] ${num(b * 1e-12)}`);
        });
        const out = `n${sections.length}`;
        // The final value does not depend on the window: a short one keeps the property quick.
        lines.push(`R99 [${out} gnd] 1M`, `show ${out}`, `show step ${out}`, 'sweep at 0, 1', 'time 0 .. 1n, 3 points');
        const r = run(lines.join('\n') + '\n');
        const dc = r.traces[0].re[0];
        expect(rel(readout(r, `step ${out}`, 'final').value, dc)).toBeLessThan(1e-9);
      }),
      { numRuns: 25 },
    );
  });
});
