/** Transfer-function sources: `A1 [o+ o- c+ c-] transfer H(s)` and `A1 [o+ o- c+ c-] poles … zeros … gain K`. */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { point, rel, run, sweepAt } from './helpers/cell.js';

const TWO_PI = 2 * Math.PI;
type C = { re: number; im: number };
const c = (re: number, im = 0): C => ({ re, im });
const mul = (a: C, b: C): C => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const div = (a: C, b: C): C => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
/** A polynomial (ascending powers) at s = jω. */
const poly = (p: number[], w: number): C => p.reduceRight((acc, k) => ({ re: acc.re * 0 - acc.im * w + k, im: acc.re * w }), c(0));
const err = (got: { re: number; im: number }, want: C) => Math.hypot(got.re - want.re, got.im - want.im) / Math.hypot(want.re, want.im);

const cell = (part: string, fs: number[]) => `drive in\nR9 [in gnd] 1k\n${part}\nR8 [out gnd] 1k\nshow out\n${sweepAt(...fs)}\n`;
const fs = [0, 1, 150, 1e3, 7e3, 1e5, 1e7];

describe('transfer H(s) against the closed form [DER: H evaluated at s = jω]', () => {
  it('a 2nd-order low-pass ω0²/(s² + s·ω0/Q + ω0²), f0 = 1 kHz, Q = 2, written with parameters', () => {
    const w0 = TWO_PI * 1000;
    const r = run(cell('let w0 = 2*pi*1k\nlet Q = 2\nA1 [out gnd in gnd] transfer w0^2/(s^2 + s*w0/Q + w0^2)', fs));
    for (const f of fs) expect(err(point(r, 'out', f), div(c(w0 * w0), poly([w0 * w0, w0 / 2, 1], TWO_PI * f)))).toBeLessThan(1e-12);
  });

  it('a band-pass with a gain and a right-half-plane zero, 5·(1 − s/a)·s/((s + b)(s + c))', () => {
    const [a, b, d] = [TWO_PI * 3e4, TWO_PI * 100, TWO_PI * 2e3];
    const r = run(cell('A1 [out gnd in gnd] transfer (5*(1 - s/(2*pi*30k))*s/((s + 2*pi*100)*(s + 2*pi*2k)))', fs.slice(1)));
    for (const f of fs.slice(1)) {
      const w = TWO_PI * f;
      expect(err(point(r, 'out', f), div(mul(c(5), mul(poly([1, -1 / a], w), c(0, w))), mul(poly([b, 1], w), poly([d, 1], w))))).toBeLessThan(1e-12);
    }
  });

  it('an integrator 2π·1k/s reads 1k/f at −90°, and a constant is a gain in V/V or dB', () => {
    const r = run(cell('A1 [out gnd in gnd] transfer 2*pi*1k/s\nA2 [o2 gnd in gnd] transfer 20dB\nR7 [o2 gnd] 1k\nshow o2', fs.slice(1)));
    for (const f of fs.slice(1)) {
      expect(rel(point(r, 'out', f).mag, 1000 / f)).toBeLessThan(1e-12);
      expect(point(r, 'out', f).deg).toBeCloseTo(-90, 9);
      expect(rel(point(r, 'o2', f).mag, 10)).toBeLessThan(1e-13);
    }
  });

  it('poles far apart (1 Hz and 1 GHz) keep their precision', () => {
    const r = run(cell('A1 [out gnd in gnd] transfer 1/((1 + s/(2*pi))*(1 + s/(2*pi*1G)))', [0.01, 1, 1e3, 1e9, 1e11]));
    for (const f of [0.01, 1, 1e3, 1e9, 1e11]) {
      expect(err(point(r, 'out', f), div(c(1), mul(c(1, f), c(1, f / 1e9))))).toBeLessThan(1e-12);
    }
  });
});

describe('poles, zeros and gain against the closed form', () => {
  it('5th-order Butterworth at 1 kHz from its pole pairs: |H| = 1/√(1 + (f/fc)^10) [Butterworth magnitude; pair Q = 1/(2·sin((2k−1)π/10)), KUG T16.7]', () => {
    const q = (k: number) => 1 / (2 * Math.sin(((2 * k - 1) * Math.PI) / 10));
    const r = run(cell(`A1 [out gnd in gnd] poles 1k q ${q(1)}, 1k q ${q(2)}, 1k`, fs.slice(1)));
    for (const f of fs.slice(1)) expect(rel(point(r, 'out', f).mag, 1 / Math.sqrt(1 + (f / 1000) ** 10))).toBeLessThan(1e-12);
  });

  it('a lead network, zeros 100 poles 1k gain 0.5: 0.5·(1 + jf/100)/(1 + jf/1k), and a right-half-plane zero at −5k: (1 − jf/5k)', () => {
    const r = run(cell('A1 [out gnd in gnd] poles 1k zeros 100, -5k gain 0.5', fs));
    for (const f of fs) expect(err(point(r, 'out', f), div(mul(c(0.5), mul(c(1, f / 100), c(1, -f / 5000))), c(1, f / 1000)))).toBeLessThan(1e-12);
  });
});

describe('the same response built from parts', () => {
  it('transfer 1/(1 + s·R·C) equals an RC low-pass', () => {
    const rc = 'let R = 10k\nlet C = 15.9n\n';
    const a = run(`${rc}${cell('A1 [out gnd in gnd] transfer 1/(1 + s*R*C)', fs)}`);
    const b = run(`${rc}drive in\nR1 [in out] R\nC1 [out gnd] C\nshow out\n${sweepAt(...fs)}\n`);
    for (const f of fs) expect(err(point(a, 'out', f), point(b, 'out', f))).toBeLessThan(1e-12);
  });

  it('a unity-gain Sallen–Key low-pass equals transfer 1/(1 + s·C2·(R1 + R2) + s²·R1·R2·C1·C2) [SK: C2 to ground]', () => {
    const v = 'let Ra = 10k\nlet Rb = 22k\nlet Ca = 10n\nlet Cb = 3.3n\n';
    const a = run(`${v}${cell('A1 [out gnd in gnd] transfer 1/(1 + s*Cb*(Ra + Rb) + s^2*Ra*Rb*Ca*Cb)', fs)}`);
    const b = run(`${v}drive in\nR1 [in a] Ra\nR2 [a b] Rb\nC1 [a out] Ca\nC2 [b gnd] Cb\nU1 [b out out] opamp\nshow out\n${sweepAt(...fs)}\n`);
    for (const f of fs) expect(err(point(a, 'out', f), point(b, 'out', f))).toBeLessThan(1e-12);
  });

  it('a real op-amp’s second pole: poles at 10 Hz and 1 MHz with gain 1e5 is the op-amp with gbw 1M pole2 1M', () => {
    const a = run(cell('A1 [out gnd in gnd] poles 10, 1M gain 1e5', fs));
    const b = run(`drive in\nR9 [in gnd] 1k\nU1 [in gnd out] opamp gain 1e5 gbw 1M pole2 1M\nshow out\n${sweepAt(...fs)}\n`);
    for (const f of fs) expect(err(point(a, 'out', f), point(b, 'out', f))).toBeLessThan(1e-12);
  });
});

describe('what a transfer line may not say', () => {
  const errors = (part: string) =>
    analyze(`drive in\nR9 [in gnd] 1k\n${part}\nR8 [out gnd] 1k\nshow out\n`)
      .diagnostics.filter((d) => d.severity === 'error')
      .map((d) => ({ code: d.code, column: d.column, endColumn: d.endColumn, message: d.message }));
  const line = 'A1 [out gnd in gnd] ';

  it('a denominator that is 0, a function of s, a power that is not whole, a degree over 20', () => {
    expect(errors(`${line}transfer 1/(s - s)`)).toMatchObject([
      { code: 'bad-transfer', column: 32, endColumn: 39, message: 'this divides by 0 at every frequency' },
    ]);
    expect(errors(`${line}transfer 1/(0*s)`)[0]).toMatchObject({ code: 'bad-transfer' });
    expect(errors(`${line}transfer 1/sqrt(s)`)).toMatchObject([{ code: 'bad-transfer', column: 32, endColumn: 39 }]);
    expect(errors(`${line}transfer s^0.5`)).toMatchObject([{ code: 'bad-transfer', column: 32, endColumn: 35 }]);
    expect(errors(`${line}transfer s^s`)[0].message).toContain('whole number');
    expect(errors(`${line}transfer 1/(1+s)^21`)[0].message).toContain('whole number from −20 to 20');
    expect(errors(`${line}transfer 1/((1+s)^11*(1+s)^10)`)[0].message).toContain('degree above 20');
    expect(errors(`${line}transfer 1/(1 + s/f9)`)).toMatchObject([{ code: 'undefined-name', column: 39, endColumn: 41 }]);
    expect(errors(`${line}transfer`)).toMatchObject([{ code: 'missing-value' }]);
  });

  it('poles and zeros: 0 Hz, a Q of 0, a gain of 0, a missing frequency, a unit that does not fit', () => {
    expect(errors(`${line}poles 0`)).toMatchObject([{ code: 'value-out-of-range', column: 27, endColumn: 28 }]);
    expect(errors(`${line}poles 1k zeros 0`)).toMatchObject([{ code: 'value-out-of-range', column: 36, endColumn: 37 }]);
    expect(errors(`${line}poles 1k q 0`)).toMatchObject([{ code: 'value-out-of-range', column: 32, endColumn: 33 }]);
    expect(errors(`${line}poles 1k gain 0`)).toMatchObject([{ code: 'value-out-of-range', column: 35, endColumn: 36 }]);
    expect(errors(`${line}poles 1k,`)).toMatchObject([{ code: 'missing-value' }]);
    expect(errors(`${line}poles 1kΩ`)).toMatchObject([{ code: 'unit-mismatch' }]);
  });

  it('the node count, and a misspelt kind gets its fix', () => {
    expect(errors('A1 [out gnd] transfer 1/(1+s)')).toMatchObject([{ code: 'node-count', column: 4, endColumn: 13 }]);
    const [e] = analyze(`drive in\nR9 [in gnd] 1k\n${line}poels 1k\nR8 [out gnd] 1k\nshow out\n`).diagnostics.filter((d) => d.severity === 'error');
    expect(e).toMatchObject({ code: 'missing-mode', fix: { replacement: 'poles' } });
  });
});
