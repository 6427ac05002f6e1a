/** The op-amp's `pole2` option: A(s) = G / ((1 + s·G/(2π·gbw))·(1 + s/(2π·pole2))). */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { point, readout, rel, run, sweepAt } from './helpers/cell.js';

const deg = (rad: number) => (rad * 180) / Math.PI;

describe('an op-amp with a second pole', () => {
  it('open loop: phase at the second pole is −atan(f2/fp1) − 45°, and |A| there is G/√(1 + (f2/fp1)²)/√2 [two-pole closed form; DER]', () => {
    // G = 1e5 and gbw = 1 MHz put the first pole at fp1 = 10 Hz.
    const fs = [10, 1e5, 1e6, 3e6];
    const r = run(`drive in\nR1 [in gnd] 1k\nU1 [in gnd out] opamp gain 1e5 gbw 1M pole2 1M\nshow out\n${sweepAt(...fs)}\n`);
    for (const f of fs) {
      const x1 = f / 10;
      const x2 = f / 1e6;
      const p = point(r, 'out', f);
      expect(p.deg).toBeCloseTo(-deg(Math.atan(x1)) - deg(Math.atan(x2)), 9);
      expect(rel(p.mag, 1e5 / Math.hypot(1, x1) / Math.hypot(1, x2))).toBeLessThan(1e-12);
    }
    expect(point(r, 'out', 1e6).deg).toBeCloseTo(-deg(Math.atan(1e5)) - 45, 9);
  });

  it('a follower with its second pole at gbw: crossover 786 151.4 Hz and phase margin 51.82802° [reference-values.md OA-PM, SCIPY brentq on freqs]', () => {
    // Broken open by hand: V(out) = A·(0 − V(in)), so the loop gain with β = 1 is −out.
    const r = run('drive in\nR1 [in gnd] 1k\nU1 [gnd in out] opamp gain 1e5 gbw 1M pole2 1M\nshow loop -1 * out\n');
    expect(rel(readout(r, 'loop - 1 * out', 'crossover').value as number, 786151.4)).toBeLessThan(1e-6);
    expect(readout(r, 'loop - 1 * out', 'phase-margin').value as number).toBeCloseTo(51.82802, 4);
  });

  it('second pole at 2·gbw: phase margin 65.53083° [reference-values.md OA-PM]', () => {
    const r = run('drive in\nR1 [in gnd] 1k\nU1 [gnd in out] opamp gain 1e5 gbw 1M pole2 2M\nshow "T" loop -1 * out\n');
    expect(readout(r, 'T', 'phase-margin').value as number).toBeCloseTo(65.53083, 4);
  });

  it('with zout the second pole still divides the whole gain: a 1 kΩ load halves |A| of a 1 kΩ zout [DER]', () => {
    const r = run(`drive in\nR1 [in gnd] 1k\nU1 [in gnd out] opamp gain 1e5 gbw 1M pole2 1M zout 1k\nR2 [out gnd] 1k\nshow out\n${sweepAt(1e6)}\n`);
    expect(rel(point(r, 'out', 1e6).mag, 0.5 * (1e5 / Math.hypot(1, 1e5) / Math.SQRT2))).toBeLessThan(1e-12);
  });

  it('pole2 without gbw, or not above 0 Hz, is an error on the option', () => {
    const errors = (opts: string) =>
      analyze(`drive in\nR1 [in gnd] 1k\nU1 [in gnd out] opamp ${opts}\nshow out\n`).diagnostics.filter((d) => d.severity === 'error');
    const [missing] = errors('gain 1e5 pole2 1M');
    expect(missing).toMatchObject({ code: 'missing-gbw', line: 3, column: 32, endColumn: 40 });
    expect(missing.message).toContain('give gbw too');
    expect(errors('gbw 1M pole2 0').map((d) => d.code)).toEqual(['value-out-of-range']);
    expect(errors('gbw 1M pole2 1kΩ').map((d) => d.code)).toEqual(['unit-mismatch']);
  });
});
