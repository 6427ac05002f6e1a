/**
 * The loop break `J1 [from to] break` and `show loop at J1`: the loop opened where the part
 * stands, with a test voltage in series, read as T = −V(from)/V(to), so a negative-feedback
 * loop's phase margin is positive.
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { point, readout, rel, run, sweepAt, trace } from './helpers/cell.js';

const follower = (opamp: string) => `drive in\nU1 [in n out] opamp ${opamp}\nJ1 [out n] break\nshow loop at J1\nshow out\n`;

describe('a follower opened at its feedback link', () => {
  it('one pole (gbw alone, an integrator): phase margin 90° at crossover = gbw, and no sign warning [one-pole loop T = ω_t/s; textbook]', () => {
    const r = run(follower('gbw 1M'));
    expect(readout(r, 'loop at J1', 'phase-margin').value as number).toBeCloseTo(90, 9);
    expect(rel(readout(r, 'loop at J1', 'crossover').value as number, 1e6)).toBeLessThan(1e-9);
    expect(r.diagnostics.map((d) => d.code)).not.toContain('loop-sign');
  });

  it('one pole with finite gain, 10⁴/(1 + s/2π·10): crossover 100 000 Hz, phase margin 90.00573° [reference-values.md OA-PM1, SCIPY brentq]', () => {
    const r = run(follower('gain 1e4 gbw 100k'));
    expect(rel(readout(r, 'loop at J1', 'crossover').value as number, 1e5)).toBeLessThan(1e-6);
    expect(readout(r, 'loop at J1', 'phase-margin').value as number).toBeCloseTo(90.00573, 4);
  });

  it('two poles, the second at gbw: crossover 786 151.4 Hz, phase margin 51.82802° [reference-values.md OA-PM]', () => {
    const r = run(follower('gain 1e5 gbw 1M pole2 1M'));
    expect(rel(readout(r, 'loop at J1', 'crossover').value as number, 786151.4)).toBeLessThan(1e-6);
    expect(readout(r, 'loop at J1', 'phase-margin').value as number).toBeCloseTo(51.82802, 4);
  });

  it('the loop trace is A(jω) itself: two-pole closed form at four frequencies [DER]', () => {
    const fs = [1, 10, 1e5, 1e6];
    const r = run(`${follower('gain 1e5 gbw 1M pole2 1M')}${sweepAt(...fs)}\n`);
    for (const f of fs) {
      // A = G / ((1 + j f/10)(1 + j f/1M))
      const [ar, ai] = [1, f / 10];
      const [br, bi] = [1, f / 1e6];
      const [dr, di] = [ar * br - ai * bi, ar * bi + ai * br];
      const d = dr * dr + di * di;
      const p = point(r, 'loop at J1', f);
      // V(to) = 1/(1 + T) is small where |T| is large, so about log10|T| digits go: 1e-9 at |T| = 1e5.
      expect(Math.hypot(p.re - (1e5 * dr) / d, p.im + (1e5 * di) / d) / (1e5 / Math.sqrt(d))).toBeLessThan(1e-9);
    }
  });

  it('closed, the break is a plain link: the follower’s response is the same as without it', () => {
    const fs = [10, 1e5, 1e6];
    const a = run(`${follower('gain 1e5 gbw 1M pole2 1M')}${sweepAt(...fs)}\n`);
    const b = run(`drive in\nU1 [in out out] opamp gain 1e5 gbw 1M pole2 1M\nshow out\n${sweepAt(...fs)}\n`);
    for (const f of fs) {
      const [x, y] = [point(a, 'out', f), point(b, 'out', f)];
      expect(Math.hypot(x.re - y.re, x.im - y.im)).toBeLessThan(1e-14);
    }
  });
});

describe('a gain-10 amplifier opened at the op-amp output', () => {
  it('β = 0.1 with the second pole at gbw: crossover 99 508.55 Hz, phase margin 84.32305° [reference-values.md OA-PM]', () => {
    const r = run('drive in\nU1 [in n out] opamp gain 1e5 gbw 1M pole2 1M\nJ1 [out x] break\nR1 [x n] 9k\nR2 [n gnd] 1k\nshow "T" loop at J1\n');
    expect(rel(readout(r, 'T', 'crossover').value as number, 99508.55)).toBeLessThan(1e-6);
    expect(readout(r, 'T', 'phase-margin').value as number).toBeCloseTo(84.32305, 4);
  });

  it('the loop needs no drive, and a requirement names it as loop, loop at J1 or its label', () => {
    const r = run(
      'U1 [gnd n out] opamp gain 1e5 gbw 1M pole2 1M\nJ1 [out x] break\nR1 [x n] 9k\nR2 [n gnd] 1k\nshow loop at J1\nrequire loop phase-margin >= 80\nrequire loop at J1 crossover <= 100k\n',
    );
    expect(trace(r, 'loop at J1').unit).toBe('V/V');
    expect(r.requirements.map((q) => q.status)).toEqual(['pass', 'pass']);
  });

  it('with two breaks, each loop is read with the other closed', () => {
    const text = 'drive in\nU1 [in n out] opamp gbw 1M\nJ1 [out x] break\nJ2 [x n] break\nshow "a" loop at J1\nshow "b" loop at J2\nsweep at 1k, 1M\n';
    const r = run(text);
    for (const f of [1e3, 1e6]) expect(Math.abs(point(r, 'a', f).mag / point(r, 'b', f).mag - 1)).toBeLessThan(1e-12);
  });
});

describe('what a loop break may not say', () => {
  const errors = (text: string) =>
    analyze(text)
      .diagnostics.filter((d) => d.severity === 'error')
      .map((d) => ({ code: d.code, line: d.line, column: d.column, endColumn: d.endColumn }));
  const base = 'drive in\nU1 [in n out] opamp gbw 1M\nR1 [out gnd] 1k\n';

  it('each problem positioned on its words', () => {
    expect(errors(`${base}J1 [out gnd] break\nshow out\n`)).toEqual([{ code: 'bad-break', line: 4, column: 9, endColumn: 12 }]);
    expect(errors(`${base}J1 [out n] brk\nshow out\n`)).toEqual([{ code: 'missing-break', line: 4, column: 12, endColumn: 15 }]);
    expect(errors(`${base}J1 [out n]\nshow out\n`)).toEqual([{ code: 'missing-break', line: 4, column: 4, endColumn: 11 }]);
    expect(errors(`${base}J1 [out n a] break\nshow out\n`)[0]).toMatchObject({ code: 'node-count', line: 4, column: 4, endColumn: 13 });
    expect(errors(`${base}J1 [out out] break\nJ2 [out n] break\nshow out\n`)).toEqual([{ code: 'shorted-part', line: 4, column: 4, endColumn: 13 }]);
    expect(errors(`${base}J1 [out n] break 2\nshow out\n`)).toEqual([{ code: 'unexpected-token', line: 4, column: 18, endColumn: 19 }]);
  });

  it('show loop at names a loop break; a plain show of one says to show it as a loop', () => {
    expect(errors(`${base}J1 [out n] break\nshow loop at R1\n`)).toEqual([{ code: 'wrong-part-kind', line: 5, column: 14, endColumn: 16 }]);
    expect(errors(`${base}J1 [out n] break\nshow loop at J2\n`)).toEqual([{ code: 'unknown-part', line: 5, column: 14, endColumn: 16 }]);
    const [plain] = analyze(`${base}J1 [out n] break\nshow at J1\n`).diagnostics.filter((d) => d.severity === 'error');
    expect(plain).toMatchObject({ code: 'bad-trace', hint: 'write show loop at J1' });
  });
});
