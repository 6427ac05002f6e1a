/**
 * The nodal analysis part by part, each against its closed form (DER: derived by hand),
 * and the handling of 0 Hz and of singular frequencies.
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { point, readout, rel, run, sweepAt, trace } from './helpers/cell.js';

const TWO_PI = 2 * Math.PI;

describe('parts', () => {
  it('coupled inductors: V2/V1 = (M/L1)/(1 + jω(L2 − M²/L1)/R), and the turns ratio √(L2/L1) at k = 1 [DER]', () => {
    for (const k of [0.5, 0.9, 1]) {
      const L1 = 1e-3;
      const L2 = 4e-3;
      const R = 50;
      const f = 2e3;
      const r = run(`drive a\nL1 [a gnd] 1m\nL2 [b gnd] 4m\ncouple L1 L2 ${k}\nR1 [b gnd] 50\nshow b\nsweep at 2k`);
      const M = k * Math.sqrt(L1 * L2);
      const w = TWO_PI * f;
      const dRe = 1;
      const dIm = (w * (L2 - (M * M) / L1)) / R;
      const d2 = dRe * dRe + dIm * dIm;
      const hr = ((M / L1) * dRe) / d2;
      const hi = (-(M / L1) * dIm) / d2;
      const p = point(r, 'b', f);
      expect(Math.hypot(p.re - hr, p.im - hi) / Math.hypot(hr, hi)).toBeLessThan(1e-12);
      if (k === 1) expect(rel(p.mag, 2)).toBeLessThan(1e-12);
    }
  });

  it('controlled sources: vgain, gm, igain of a resistor, rm of a capacitor and of an inductor [DER]', () => {
    const r = run(`
drive in
R1 [in gnd] 1k
A1 [v gnd in gnd] vgain 2
R2 [v gnd] 1k
A2 [g gnd in gnd] gm 1m
R3 [g gnd] 1k
A3 [i gnd] igain 3 of R1
R4 [i gnd] 1k
C1 [in gnd] 1u
A4 [rc gnd] rm 10 of C1
R5 [rc gnd] 1k
L1 [in m] 1m
R6 [m gnd] 1
A5 [rl gnd] rm 10 of L1
R7 [rl gnd] 1k
show v
show g
show i
show rc
show rl
sweep at 1k
`);
    const w = TWO_PI * 1e3;
    expect(point(r, 'v', 1e3).re).toBeCloseTo(2, 14);
    expect(point(r, 'g', 1e3).re).toBeCloseTo(1, 14);
    expect(point(r, 'i', 1e3).re).toBeCloseTo(3, 14);
    // rm·I(C1) = 10·jωC·V(in)
    expect(point(r, 'rc', 1e3).im).toBeCloseTo(10 * w * 1e-6, 14);
    expect(Math.abs(point(r, 'rc', 1e3).re)).toBeLessThan(1e-15);
    // rm·I(L1) = 10/(1 + jωL)
    const d = 1 + Math.pow(w * 1e-3, 2);
    expect(rel(point(r, 'rl', 1e3).re, 10 / d)).toBeLessThan(1e-12);
    expect(rel(point(r, 'rl', 1e3).im, (-10 * w * 1e-3) / d)).toBeLessThan(1e-12);
  });

  it('a capacitor with esr and esl is one series branch: |Z| = esr at its self-resonance, open at 0 Hz [DER]', () => {
    const f0 = 1 / (TWO_PI * Math.sqrt(1e-6 * 10e-9));
    const r = run(`R0 [a gnd] 1G\nC1 [a gnd] 1u esr 0.1 esl 10n\nshow impedance a\n${sweepAt(1e3, f0)}`);
    // 0.1 Ω in parallel with 1 GΩ
    expect(rel(point(r, 'impedance a', f0).mag, 1 / (10 + 1e-9))).toBeLessThan(1e-9);
    const w = TWO_PI * 1e3;
    const x = w * 10e-9 - 1 / (w * 1e-6);
    const zr = 0.1;
    // series branch ∥ 1 GΩ
    const br = zr;
    const bi = x;
    const den = (br + 1e9) * (br + 1e9) + bi * bi;
    const pr = (1e9 * (br * (br + 1e9) + bi * bi)) / den;
    const pi = (1e9 * (bi * (br + 1e9) - br * bi)) / den;
    expect(rel(point(r, 'impedance a', 1e3).mag, Math.hypot(pr, pi))).toBeLessThan(1e-9);
    const dc = run('R0 [a gnd] 1k\nC1 [a gnd] 1u esr 0.1 esl 10n\nshow impedance a\nsweep 0 .. 1, 2 linear');
    expect(trace(dc, 'impedance a').magnitude[0]).toBeCloseTo(1000, 9);
  });

  it('an inductor with dcr is a short of dcr Ω at 0 Hz [DER]', () => {
    const r = run('L1 [a gnd] 1m dcr 2\nshow impedance a\nsweep 0 .. 1k, 2 linear');
    expect(trace(r, 'impedance a').magnitude[0]).toBeCloseTo(2, 12);
    expect(rel(trace(r, 'impedance a').magnitude[1], Math.hypot(2, TWO_PI * 1e3 * 1e-3))).toBeLessThan(1e-12);
  });

  it('op-amp: flat gain with zout in a loaded follower gives G/(G + 1 + zout/R_L) [DER]', () => {
    const r = run('drive in\nU1 [in out out] opamp gain 1000 zout 100\nR1 [out gnd] 100\nshow out\nsweep at 1k');
    expect(rel(point(r, 'out', 1e3).re, 1000 / 1002)).toBeLessThan(1e-13);
  });

  it('op-amp: gbw alone is an integrator, so a follower has its corner at the gbw [DER]', () => {
    const r = run('drive in\nU1 [in out out] opamp gbw 1M\nshow out');
    expect(rel(readout(r, 'out', 'corner').value, 1e6)).toBeLessThan(1e-9);
    expect(readout(r, 'out', 'low-frequency-gain').value).toBeCloseTo(0, 12);
  });

  it('drive between two nodes, and a current drive gives a transimpedance in Ω', () => {
    const r = run('drive [a b]\nR1 [a gnd] 1k\nR2 [b gnd] 3k\nshow a\nsweep at 1k');
    expect(point(r, 'a', 1e3).re).toBeCloseTo(0.25, 14);
    const i = run('drive current [a gnd] 1m\nR1 [a gnd] 1k\nC1 [a gnd] 1u\nshow a\nsweep at 1k');
    const t = trace(i, 'a');
    expect(t.kind).toBe('transimpedance');
    const w = TWO_PI * 1e3;
    expect(rel(t.magnitude[0], 1 / Math.hypot(1e-3, w * 1e-6))).toBeLessThan(1e-12);
  });

  it('group delay of a current trace: I/V = jωC/(1 + jωRC) has τ = RC/(1+(ωRC)²), through a resistor and a capacitor alike [DER]', () => {
    const r = run('drive in\nR1 [in a] 1k\nC1 [a gnd] 1u\nshow current R1\nshow current C1\nsweep at 50, 159.155, 1k');
    for (const f of [50, 159.155, 1e3]) {
      const wrc = 2 * Math.PI * f * 1e-3;
      expect(rel(point(r, 'current R1', f).delay, 1e-3 / (1 + wrc * wrc))).toBeLessThan(1e-10);
      expect(rel(point(r, 'current C1', f).delay, 1e-3 / (1 + wrc * wrc))).toBeLessThan(1e-10);
    }
  });

  it('current through a part runs from its first node to its second', () => {
    const r = run('drive in\nR1 [in a] 1k\nR2 [gnd a] 1k\nshow current R1\nshow current R2\nsweep at 1k');
    expect(point(r, 'current R1', 1e3).re).toBeCloseTo(0.5e-3, 15);
    expect(point(r, 'current R2', 1e3).re).toBeCloseTo(-0.5e-3, 15);
  });
});

describe('0 Hz and singular frequencies', () => {
  it('0 Hz: capacitors open, inductors short', () => {
    const r = run('drive in\nR1 [in a] 1k\nC1 [a gnd] 1u\nR2 [in b] 1k\nL1 [b gnd] 1m\nshow a\nshow b\nsweep 0 .. 1k, 3 linear');
    expect(trace(r, 'a').re[0]).toBe(1);
    expect(trace(r, 'a').phaseDeg[0]).toBe(0);
    expect(trace(r, 'b').magnitude[0]).toBe(0);
    expect(trace(r, 'b').magnitudeDb[0]).toBe(-Infinity);
    // No warning or error, and one note (on the sweep line) that a log frequency axis cannot draw 0 Hz.
    expect(r.diagnostics.filter((d) => d.severity !== 'info')).toEqual([]);
    expect(r.diagnostics.filter((d) => d.code === 'dc-point').map((d) => d.line)).toEqual([8]);
  });

  it('an inductor loop at 0 Hz gives NaN there and one warning naming 0 Hz, never a throw', () => {
    const r = analyze('drive in\nR1 [in a] 1k\nL1 [a gnd] 1m\nL2 [a gnd] 2m\nshow a\nsweep 0 .. 2k, 3 linear');
    const t = trace(r, 'a');
    expect(Number.isNaN(t.re[0])).toBe(true);
    expect(Number.isNaN(t.magnitudeDb[0])).toBe(true);
    expect(Number.isNaN(t.phaseDeg[0])).toBe(true);
    expect(Number.isFinite(t.magnitudeDb[1])).toBe(true);
    const singular = r.diagnostics.filter((d) => d.code === 'singular');
    expect(singular).toHaveLength(1);
    expect(singular[0].severity).toBe('warning');
    expect(singular[0].message).toContain('0 Hz');
    expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  });

  it('a network singular at every frequency still gives one warning and NaN traces', () => {
    const r = analyze('drive in\nR1 [in a] 1k\nA1 [a gnd b gnd] vgain 1\nA2 [b gnd a gnd] vgain 1\nshow a\nsweep 1 .. 1M, 10/decade');
    expect(r.diagnostics.filter((d) => d.code === 'singular')).toHaveLength(1);
    expect(r.diagnostics.find((d) => d.code === 'singular')!.message).toMatch(/and \d+ more/);
    expect(Array.from(trace(r, 'a').magnitude).every(Number.isNaN)).toBe(true);
    expect(r.readouts.filter((x) => Number.isFinite(x.value))).toEqual([]);
  });
});
