/** Sums and scales of traces: `show out + a`, `show 2 * out`, `show out - k * a`. */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { point, run, sweepAt, trace } from './helpers/cell.js';

const TWO_PI = 2 * Math.PI;

/**
 * A 2nd-order Linkwitz–Riley crossover at f0 = 1 kHz: each way two buffered first-order
 * sections, so H_L = 1/(1 + s/ω0)² and H_H = (s/ω0)²/(1 + s/ω0)².
 */
const LR2 = `let R = 10k
let C = 1/(2*pi*1k*R)
drive in
R1 [in a] R
C1 [a gnd] C
U1 [a b b] opamp
R2 [b c] R
C2 [c gnd] C
U2 [c low low] opamp
C3 [in d] C
R3 [d gnd] R
U3 [d e e] opamp
C4 [e g] C
R4 [g gnd] R
U4 [g high high] opamp
`;

describe('the summed response of a crossover', () => {
  it('LR2 with the high way inverted, low - high, is an all-pass: 0 dB to 1e-12 and phase −2·atan(f/f0) [Linkwitz, JAES 24(1), 1976: H_L − H_H = (1 − s/ω0)/(1 + s/ω0)]', () => {
    const r = run(`${LR2}show low - high\nshow "sum" low + -1 * high\nsweep 10 .. 100k, 50/decade\n`);
    for (const label of ['low - high', 'sum']) {
      const t = trace(r, label);
      const worst = Math.max(...Array.from(t.magnitudeDb, Math.abs));
      expect(worst).toBeLessThan(1e-12);
      r.frequencies.forEach((f, k) => {
        expect(t.phaseDeg[k]).toBeCloseTo((-2 * Math.atan(f / 1000) * 180) / Math.PI, 9);
      });
    }
  });

  it('LR2 with both ways in phase, low + high, has a null at f0: |1 − x²|/(1 + x²), x = f/f0 [Linkwitz 1976]', () => {
    const fs = [100, 500, 999, 1001, 2000, 10000];
    const r = run(`${LR2}show low + high\n${sweepAt(...fs)}\n`);
    for (const f of fs) {
      const x = f / 1000;
      const expected = Math.abs(1 - x * x) / (1 + x * x);
      expect(point(r, 'low + high', f).mag / expected - 1).toBeLessThan(1e-9);
    }
  });

  it('a requirement names a sum by its words, spaced or not', () => {
    const r = run(`${LR2}show low - high\nrequire low-high gain >= -0.001 dB\nrequire low - high gain <= 0.001 dB\n`);
    expect(r.requirements.map((q) => q.status)).toEqual(['pass', 'pass']);
  });
});

describe('scales and weighted sums against the closed form', () => {
  /** Equal-R, equal-C two-section RC ladder: V(out)/V(in) = 1/(1 + 3sRC + (sRC)²), V(a) = (1 + sRC)·V(out) (nodal analysis by hand; DER). */
  const ladder = (f: number) => {
    const w = TWO_PI * f * 1e-3; // sRC = jωRC with R = 1 kΩ, C = 1 µF
    const dr = 1 - w * w;
    const di = 3 * w;
    const d = dr * dr + di * di;
    const out = { re: dr / d, im: -di / d };
    const a = { re: out.re - w * out.im, im: out.im + w * out.re };
    return { out, a };
  };
  const cell = 'let k = 0.5\nlet R = 1k\ndrive in\nR1 [in a] R\nC1 [a gnd] 1u\nR2 [a out] R\nC2 [out gnd] 1u\n';
  const fs = [10, 159.15494309189535, 1000, 5000];

  it('2 * out, out + a, out - k * a and out - (2*k) * a - in, at four frequencies [DER]', () => {
    const r = run(`${cell}show 2 * out\nshow out + a\nshow out - k * a\nshow out - (2*k) * a - in\n${sweepAt(...fs)}\n`);
    const cases: [string, (h: ReturnType<typeof ladder>) => { re: number; im: number }][] = [
      ['2 * out', (h) => ({ re: 2 * h.out.re, im: 2 * h.out.im })],
      ['out + a', (h) => ({ re: h.out.re + h.a.re, im: h.out.im + h.a.im })],
      ['out - k * a', (h) => ({ re: h.out.re - 0.5 * h.a.re, im: h.out.im - 0.5 * h.a.im })],
      ['out - (2 * k) * a - in', (h) => ({ re: h.out.re - h.a.re - 1, im: h.out.im - h.a.im })],
    ];
    for (const [label, expected] of cases) {
      for (const f of fs) {
        const e = expected(ladder(f));
        const p = point(r, label, f);
        expect(Math.hypot(p.re - e.re, p.im - e.im) / Math.hypot(e.re, e.im)).toBeLessThan(1e-12);
      }
    }
  });

  it('a sum has the unit of a node: V/A with a current drive', () => {
    const r = run('drive current in 1m\nR1 [in gnd] 1k\nshow 3 * in\nsweep at 100\n');
    expect(trace(r, '3 * in').unit).toBe('V/A');
    expect(point(r, '3 * in', 100).mag).toBeCloseTo(3000, 9);
  });
});

describe('what a sum line may not say', () => {
  const errors = (text: string) =>
    analyze(text)
      .diagnostics.filter((d) => d.severity === 'error')
      .map((d) => ({ code: d.code, message: d.message, column: d.column, endColumn: d.endColumn }));
  const base = 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\n';

  it('the factor after the node, positioned at the *', () => {
    expect(errors(`${base}show out * 2\n`)).toEqual([
      { code: 'bad-trace', message: 'write the factor before the node, like 2 * out', column: 10, endColumn: 11 },
    ]);
  });

  it('terms that cancel, a sum on gnd alone, a dangling +, a factor with a unit, a node that does not exist', () => {
    expect(errors(`${base}show out - out + in - in\n`).map((e) => e.message)).toEqual(['out - out + in - in is 0 by definition']);
    expect(errors(`${base}show 2 * gnd + gnd\n`).map((e) => e.code)).toEqual(['bad-trace']);
    expect(errors(`${base}show out +\n`)[0]).toMatchObject({ code: 'missing-node', column: 10 });
    expect(errors(`${base}show 6dB * out + in\n`).map((e) => e.message)).toEqual(['a factor of a sum is a plain number']);
    expect(errors(`${base}show out + ot\n`).map((e) => e.code)).toEqual(['unknown-node']);
  });

  it('two nodes side by side are not read as two traces', () => {
    const [e] = analyze(`${base}show out in\n`).diagnostics;
    expect(e.hint).toContain('out + a');
    expect(e.hint).not.toMatch(/two traces/);
  });
});
