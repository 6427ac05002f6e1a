/** Readouts, sweeps and phase unwrapping: definitions and edge cases (reference rows cited where used). */
import { describe, expect, it } from 'vitest';
import { brent } from '../src/roots.js';
import { wrapDegrees } from '../src/readouts.js';
import { gridFromSpec, logGrid } from '../src/sweep.js';
import { point, readout, rel, run, trace } from './helpers/cell.js';

describe('sweeps', () => {
  it('log grids run from F1 to exactly F2 at N per decade', () => {
    const g = logGrid(10, 100e3, 100);
    expect(g.length).toBe(401);
    expect(g[0]).toBe(10);
    expect(g[400]).toBe(100e3);
    expect(rel(g[100], 100)).toBeLessThan(1e-14);
    const odd = logGrid(1, 15, 1);
    expect(Array.from(odd)).toEqual([1, 10, 15]);
  });

  it('linear and list sweeps; lists are sorted; limits are errors, not throws', () => {
    const lin = gridFromSpec({ kind: 'linear', from: 0, to: 10, points: 6 });
    expect(Array.from(lin.frequencies!)).toEqual([0, 2, 4, 6, 8, 10]);
    expect(Array.from(gridFromSpec({ kind: 'list', frequencies: [3, 1, 2] }).frequencies!)).toEqual([1, 2, 3]);
    expect(gridFromSpec({ kind: 'log', from: 1, to: 1e6, perDecade: 1e4 }, 1000).error).toMatch(/limit/);
    expect(gridFromSpec({ kind: 'log', from: 0, to: 10, perDecade: 10 }).error).toMatch(/above 0/);
  });

  it('the default sweep is 1 Hz .. 1 MHz at 100/decade, widened to cover the poles', () => {
    const plain = run('drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out');
    expect(plain.frequencies[0]).toBe(1);
    expect(plain.frequencies[plain.frequencies.length - 1]).toBe(1e6);
    expect(plain.frequencies.length).toBe(601);
    // A pole at 0.16 Hz and one at 16 MHz widen it at both ends.
    const wide = run('drive in\nR1 [in a] 1M\nC1 [a gnd] 1u\nU1 [a b b] opamp\nR2 [b out] 10\nC2 [out gnd] 1n\nshow out');
    expect(wide.frequencies[0]).toBeLessThanOrEqual(0.01);
    expect(wide.frequencies[wide.frequencies.length - 1]).toBeGreaterThanOrEqual(1e8);
    expect(rel(readout(wide, 'out', 'corner').value, 1 / (2 * Math.PI))).toBeLessThan(1e-6);
  });
});

describe('phase', () => {
  it('starts in (−180°, 180°]: an inverting amplifier starts at +180°, not −180°', () => {
    const r = run('drive in\nR1 [in n] 1k\nR2 [n out] 10k\nU1 [gnd n out] opamp\nshow out\nsweep at 1k');
    expect(point(r, 'out', 1e3).deg).toBe(180);
  });

  it('is unwrapped through several turns, even on a coarse explicit grid (five RC sections and a 5th-order ladder)', () => {
    const lines = ['drive n0'];
    for (let k = 0; k < 5; k++) lines.push(`R${k} [n${k} b${k}] 1k`, `C${k} [b${k} gnd] 1n`, `U${k} [b${k} n${k + 1} n${k + 1}] opamp`);
    lines.push('show n5');
    const fine = run(lines.join('\n') + '\nsweep 1k .. 100M, 50/decade');
    const coarse = run(lines.join('\n') + '\nsweep at 1k, 100M');
    const t = trace(fine, 'n5');
    // Five real poles: −5·atan(f/fp), reaching almost −450°.
    const fp = 1 / (2 * Math.PI * 1e3 * 1e-9);
    for (let k = 0; k < t.phaseDeg.length; k += 37) {
      expect(Math.abs(t.phaseDeg[k] - (-5 * Math.atan(fine.frequencies[k] / fp) * 180) / Math.PI)).toBeLessThan(1e-9);
    }
    const c = trace(coarse, 'n5');
    expect(Math.abs(c.phaseDeg[1] - (-5 * Math.atan(1e8 / fp) * 180) / Math.PI)).toBeLessThan(1e-9);
  });

  it('wrapDegrees folds into (−180°, 180°]', () => {
    expect(wrapDegrees(-180)).toBe(180);
    expect(wrapDegrees(540)).toBe(180);
    expect(wrapDegrees(-190)).toBe(170);
    expect(wrapDegrees(51.8)).toBeCloseTo(51.8, 12);
  });
});

describe('readouts', () => {
  it('high-pass corner from the settled high-frequency level; the rolloff of a flat end is 0 dB/decade [RC1-g]', () => {
    const r = run('drive in\nC1 [in out] 470n\nR1 [out gnd] 2.2k\nshow out\nsweep 1 .. 100k');
    expect(rel(readout(r, 'out', 'corner').value, 1 / (2 * Math.PI * 2.2e3 * 470e-9))).toBeLessThan(1e-9);
    expect(readout(r, 'out', 'rolloff').value).toBe(0);
  });

  it('a Q = 10 000 resonance on a 20/decade grid: peak, corners, bandwidth and Q are still exact [RLC-1 formulas, DER]', () => {
    const r = run('drive in\nL1 [in a] 10m\nC1 [a b] 1u\nR1 [b gnd] 0.01\nshow b\nsweep 100 .. 100k, 20/decade');
    const f0 = 1 / (2 * Math.PI * Math.sqrt(10e-3 * 1e-6));
    const q = (1 / 0.01) * Math.sqrt(10e-3 / 1e-6);
    expect(rel(readout(r, 'b', 'center').value, f0)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'b', 'q').value, q)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'b', 'bandwidth').value, f0 / q)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'b', 'corner-low').value, f0 * (Math.sqrt(1 + 1 / (4 * q * q)) - 1 / (2 * q)))).toBeLessThan(1e-9);
  });

  it('min-impedance carries the frequency where it is found [RLC-1j]', () => {
    const r = run('R1 [a m] 10\nL1 [m n] 10m\nC1 [n gnd] 1u\nshow impedance a\nsweep 10 .. 100k, 7/decade');
    const m = readout(r, 'impedance a', 'min-impedance');
    expect(rel(m.value, 10)).toBeLessThan(1e-9);
    expect(rel(m.at!, 1 / (2 * Math.PI * Math.sqrt(10e-3 * 1e-6)))).toBeLessThan(1e-9);
  });

  it('a peak and the margins carry the frequency they are found at; values that are frequencies do not [RLC-1h/i; OA-PM]', () => {
    // Series RLC, V_C/V_in: the peak of 1/|1 − ω²LC + jωRC| lies at f₀·√(1 − 1/(2Q²)), Q = 10 [DER].
    const f0 = 1 / (2 * Math.PI * Math.sqrt(10e-3 * 1e-6));
    const r = run('drive in\nR1 [in a] 10\nL1 [a b] 10m\nC1 [b gnd] 1u\nshow "vc" b\nsweep 100 .. 100k');
    const peak = readout(r, 'vc', 'peak');
    expect(rel(peak.at!, f0 * Math.sqrt(1 - 1 / 200))).toBeLessThan(1e-9);
    expect(peak.at).toBe(readout(r, 'vc', 'peak-frequency').value);
    expect(readout(r, 'vc', 'corner').at).toBeNull();
    // Three buffered RC poles behind a gain of 1000: a crossover and a phase crossover in the sweep.
    const loop = run(
      'drive in\nA1 [a gnd in gnd] vgain 1000\nR1 [a b] 1k\nC1 [b gnd] 1u\nA2 [c gnd b gnd] vgain 1\nR2 [c d] 1k\nC2 [d gnd] 1u\nA3 [e gnd d gnd] vgain 1\nR3 [e f] 1k\nC3 [f gnd] 1u\nshow loop f\nsweep 1 .. 100k',
    );
    const label = loop.traces[0].label;
    expect(readout(loop, label, 'phase-margin').at).toBe(readout(loop, label, 'crossover').value);
    expect(readout(loop, label, 'gain-margin').at).toBe(readout(loop, label, 'phase-crossover').value);
  });

  it('a response without peaking has a peak of 0 dB found at no frequency', () => {
    const r = run('drive in\nR1 [in out] 2.2k\nC1 [out gnd] 470n\nshow out\nsweep 10 .. 100k');
    expect(readout(r, 'out', 'peak')).toMatchObject({ value: 0, at: null });
  });

  it('corners are found by root-finding, not read off a coarse grid [RC1-b]', () => {
    const r = run('drive in\nR1 [in out] 2.2k\nC1 [out gnd] 470n\nshow out\nsweep 1 .. 1M, 2/decade');
    expect(rel(readout(r, 'out', 'corner').value, 1 / (2 * Math.PI * 2.2e3 * 470e-9))).toBeLessThan(1e-10);
  });

  it('a flat response has no corner; a ratio of two nodes is a plain trace', () => {
    const r = run('drive in\nR1 [in a] 1k\nR2 [a gnd] 1k\nshow a\nshow "r" in / a\nsweep 1 .. 1M, 10/decade');
    expect(r.readouts.some((x) => x.trace === 'a' && x.name === 'corner')).toBe(false);
    expect(readout(r, 'a', 'low-frequency-gain').value).toBeCloseTo(-6.0206, 4);
    expect(point(r, 'r', 1).re).toBeCloseTo(2, 14);
  });

  it("Brent's method keeps to its bracket and reaches full precision", () => {
    expect(brent((x) => x * x - 2, 0, 2, 1e-15)).toBeCloseTo(Math.SQRT2, 15);
    expect(Number.isNaN(brent((x) => x * x + 1, -1, 1, 1e-12))).toBe(true);
    expect(brent((x) => (x < 1 ? -Infinity : Math.log(x - 0.5)), 0, 10, 1e-14)).toBeCloseTo(1.5, 13);
  });
});
