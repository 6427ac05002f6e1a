/**
 * Passive networks against ../shared/reference/reference-values.md (beside the repository). Each check names the
 * row id and the source key of that file (DER: derived by hand with nodal analysis; SCIPY:
 * recomputed with scipy; TT, MYJ, WIN: published sources as listed there).
 */
import { describe, expect, it } from 'vitest';
import { point, readout, rel, run, sweepAt, trace } from './helpers/cell.js';

const TWO_PI = 2 * Math.PI;

describe('first-order RC (§1, RC1 rows)', () => {
  const R = 2.2e3;
  const C = 470e-9;
  const fc = 1 / (TWO_PI * R * C);
  const lp = `
drive in
R1 [in out] 2.2k
C1 [out gnd] 470n
show out
`;

  it('RC1-a/b: corner 1/(2πRC) = 153.921608 Hz [DER; SCIPY brentq]', () => {
    const r = run(lp + 'sweep 1 .. 153.921608k, 100/decade');
    expect(rel(fc, 153.921608)).toBeLessThan(1e-8);
    expect(R * C).toBeCloseTo(1.034e-3, 9); // RC1-a
    expect(rel(readout(r, 'out', 'corner').value, fc)).toBeLessThan(1e-9);
    expect(readout(r, 'out', 'low-frequency-gain').value).toBeCloseTo(0, 9);
  });

  it('RC1-c/d/e: −3.010300 dB and −45° at f_c; 0.1/10/100/1000 f_c [SCIPY freqs]', () => {
    const r = run(lp + sweepAt(fc, 0.1 * fc, 10 * fc, 100 * fc, 1000 * fc));
    expect(point(r, 'out', fc).db).toBeCloseTo(-3.0103, 4);
    expect(Math.abs(point(r, 'out', fc).db - -10 * Math.log10(2))).toBeLessThan(1e-10);
    expect(point(r, 'out', fc).deg).toBeCloseTo(-45, 9);
    const rows: [number, number, number][] = [
      [0.1, -0.043214, -5.710593],
      [10, -20.043214, -84.289407],
      [100, -40.000434, -89.427061],
      [1000, -60.000004, -89.942704],
    ];
    for (const [k, db, deg] of rows) {
      expect(Math.abs(point(r, 'out', k * fc).db - db)).toBeLessThan(1e-6);
      expect(Math.abs(point(r, 'out', k * fc).deg - deg)).toBeLessThan(1e-6);
    }
  });

  it('RC1-f: the rolloff readout is the asymptotic slope, −20 dB/decade, wherever the sweep ends; the slope over a decade tends to it (−19.999570 over 100 f_c → 1000 f_c) [SCIPY freqs]', () => {
    for (const end of [1000 * fc, 100 * fc, 2 * fc]) {
      const r = run(lp + `sweep 1 .. ${end.toPrecision(17)}, 20/decade`);
      expect(readout(r, 'out', 'rolloff').value).toBe(-20);
    }
    const r = run(lp + sweepAt(100 * fc, 1000 * fc));
    expect(Math.abs(point(r, 'out', 1000 * fc).db - point(r, 'out', 100 * fc).db - -19.99957)).toBeLessThan(1e-6);
  });

  it('RC1-g: as a high-pass, −3.010300 dB and +45° at f_c; corner from the settled high-frequency level [SCIPY freqs]', () => {
    const hp = `
drive in
C1 [in out] 470n
R1 [out gnd] 2.2k
show out
`;
    const r = run(hp + sweepAt(fc));
    expect(Math.abs(point(r, 'out', fc).db - -3.0103)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'out', fc).deg - 45)).toBeLessThan(1e-9);
    const wide = run(hp + 'sweep 1 .. 100k');
    expect(rel(readout(wide, 'out', 'corner').value, fc)).toBeLessThan(1e-9);
  });

  it('GD-1: group delay RC/(1+(ωRC)²) at ω = 0, 1/RC, 10/RC [DER; SCIPY]', () => {
    const r = run(lp + 'sweep 0 .. 1, 2 linear');
    expect(rel(trace(r, 'out').groupDelay[0], 1.034e-3)).toBeLessThan(1e-9);
    const r2 = run(lp + sweepAt(fc, 10 * fc));
    expect(rel(point(r2, 'out', fc).delay, 0.517e-3)).toBeLessThan(1e-9);
    expect(rel(point(r2, 'out', 10 * fc).delay, 10.2376e-6)).toBeLessThan(1e-5);
    expect(rel(point(r2, 'out', 10 * fc).delay, (R * C) / 101)).toBeLessThan(1e-10);
  });
});

describe('reactance and series-RC impedance (§2, XC rows)', () => {
  it('XC-1, XC-1′: X_C = 1/(2πfC) of 2.2 µF: 1446.863 Ω at 50 Hz, 7.2343 Ω at 10 kHz [DER]', () => {
    const r = run('C1 [a gnd] 2.2u\nshow impedance a\nsweep at 50, 10k');
    expect(Math.abs(point(r, 'impedance a', 50).mag - 1446.863)).toBeLessThan(5e-4);
    expect(Math.abs(point(r, 'impedance a', 10e3).mag - 7.2343)).toBeLessThan(5e-5);
    expect(point(r, 'impedance a', 50).deg).toBeCloseTo(-90, 9);
  });

  it('XC-2/3, XC-2′/3′: 680 Ω + 2.2 µF: |Z| = 1598.691 Ω and ∠Z = −64.827308° at 50 Hz; 680.0385 Ω at 10 kHz [DER]', () => {
    const r = run('R1 [a m] 680\nC1 [m gnd] 2.2u\nshow impedance a\nsweep at 50, 10k');
    expect(Math.abs(point(r, 'impedance a', 50).mag - 1598.691)).toBeLessThan(5e-4);
    expect(Math.abs(point(r, 'impedance a', 50).deg - -64.827308)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'impedance a', 10e3).mag - 680.0385)).toBeLessThan(5e-5);
  });

  it('XC-3, XC-3′, XC-4: the current leads the voltage by atan(X_C/R); by 90° in a pure C [DER]', () => {
    const r = run('drive a\nR1 [a m] 680\nC1 [m gnd] 2.2u\nshow current R1\nsweep at 50, 10k');
    expect(Math.abs(point(r, 'current R1', 50).deg - 64.827308)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'current R1', 10e3).deg - 0.60953)).toBeLessThan(1e-6);
    const c = run('drive a\nC1 [a gnd] 2.2u\nshow current C1\nsweep at 50');
    expect(point(c, 'current C1', 50).deg).toBeCloseTo(90, 9);
  });

  it('XL-1/2: 10 mH at 1 kHz: X_L = 62.83185 Ω, ∠(I/V) = −90° [DER]', () => {
    const r = run('drive a\nL1 [a gnd] 10m\nshow current L1\nsweep at 1k');
    expect(Math.abs(1 / point(r, 'current L1', 1e3).mag - 62.83185)).toBeLessThan(5e-6);
    expect(point(r, 'current L1', 1e3).deg).toBeCloseTo(-90, 9);
  });

  it('1 kΩ + 1 µF: 2652.58 Ω reactance and 2834.82 Ω at 60 Hz, 1012.59 Ω at 1 kHz, current leading by atan(X/R) [formula plus common practice]', () => {
    const x60 = 1 / (TWO_PI * 60 * 1e-6);
    expect(Math.abs(x60 - 2652.58)).toBeLessThan(5e-3);
    const z = run('C1 [a gnd] 1u\nshow impedance a\nsweep at 60');
    expect(Math.abs(point(z, 'impedance a', 60).mag - 2652.58)).toBeLessThan(5e-3);
    const r = run('drive a\nR1 [a m] 1k\nC1 [m gnd] 1u\nshow current R1\nshow impedance a\nsweep at 60, 1k');
    expect(Math.abs(1 / point(r, 'current R1', 60).mag - 2834.82)).toBeLessThan(5e-3);
    expect(Math.abs(1 / point(r, 'current R1', 1e3).mag - 1012.59)).toBeLessThan(5e-3);
    expect(Math.abs(point(r, 'current R1', 60).deg - (Math.atan(x60 / 1e3) * 180) / Math.PI)).toBeLessThan(1e-9);
    // The driving-point impedance with the drive zeroed: the drive shorts node a.
    expect(point(r, 'impedance a', 60).mag).toBeLessThan(1e-12);
  });
});

describe('RLC resonance (§4, RLC rows)', () => {
  const f0 = 1 / (TWO_PI * Math.sqrt(10e-3 * 1e-6));
  const series = `
drive in
L1 [in a] 10m
C1 [a b] 1u
R1 [b gnd] 10
show "vr" b
sweep 100 .. 100k
`;

  it('RLC-1a..g: series V_R/V_in: f₀ 1591.54943 Hz, Q 10, BW 159.1549 Hz, −3 dB points 1513.960 / 1673.115 Hz [DER; SCIPY brentq]', () => {
    const r = run(series);
    expect(rel(f0, 1591.54943)).toBeLessThan(1e-8);
    expect(rel(readout(r, 'vr', 'center').value, f0)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'vr', 'peak-frequency').value, f0)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'vr', 'q').value, 10)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'vr', 'bandwidth').value, 159.1549)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'vr', 'corner-low').value, 1513.96)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'vr', 'corner-high').value, 1673.115)).toBeLessThan(1e-6);
    // exact closed form f₀(√(1+1/4Q²) ∓ 1/2Q)
    expect(rel(readout(r, 'vr', 'corner-low').value, f0 * (Math.sqrt(1 + 1 / 400) - 1 / 20))).toBeLessThan(1e-9);
    expect(readout(r, 'vr', 'peak').value).toBeCloseTo(0, 9);
  });

  it('RLC-1h/i: V_C/V_in is +20 dB and −90° at f₀; peak 10.01252 at 1587.566 Hz [DER; MNA]', () => {
    const text = `
drive in
R1 [in a] 10
L1 [a b] 10m
C1 [b gnd] 1u
show "vc" b
sweep 100 .. 100k
`;
    const r = run(text);
    expect(rel(readout(r, 'vc', 'peak-frequency').value, 1587.566)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'vc', 'peak-frequency').value, f0 * Math.sqrt(1 - 1 / 200))).toBeLessThan(1e-9);
    expect(Math.abs(readout(r, 'vc', 'peak').value - 20 * Math.log10(10 / Math.sqrt(1 - 1 / 400)))).toBeLessThan(1e-9);
    expect(rel(Math.pow(10, readout(r, 'vc', 'peak').value / 20), 10.01252)).toBeLessThan(1e-6);
    const p = run(text.replace('sweep 100 .. 100k', sweepAt(f0)));
    expect(Math.abs(point(p, 'vc', f0).db - 20)).toBeLessThan(1e-9);
    expect(Math.abs(point(p, 'vc', f0).deg - -90)).toBeLessThan(1e-9);
  });

  it('RLC-1j: series |Z(f₀)| = R = 10 Ω, the minimum of |Z| [DER]', () => {
    const r = run('L1 [a m] 10m\nC1 [m n] 1u\nR1 [n gnd] 10\nshow impedance a\nsweep 100 .. 100k');
    const m = readout(r, 'impedance a', 'min-impedance');
    expect(rel(m.value, 10)).toBeLessThan(1e-9);
    expect(rel(m.at!, f0)).toBeLessThan(1e-9);
  });

  it('RLC-2: parallel 1 kΩ ∥ 10 mH ∥ 1 µF: |Z(f₀)| 1000 Ω, Q 10, BW 159.1549 Hz, |Z| −3 dB points 1513.960 / 1673.115 Hz [DER; MNA]', () => {
    const r = run('R1 [a gnd] 1k\nL1 [a gnd] 10m\nC1 [a gnd] 1u\nshow impedance a\nsweep 100 .. 100k');
    expect(rel(readout(r, 'impedance a', 'center').value, f0)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'impedance a', 'q').value, 10)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'impedance a', 'bandwidth').value, 159.1549)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'impedance a', 'corner-low').value, 1513.96)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'impedance a', 'corner-high').value, 1673.115)).toBeLessThan(1e-6);
    const p = run('R1 [a gnd] 1k\nL1 [a gnd] 10m\nC1 [a gnd] 1u\nshow impedance a\n' + sweepAt(f0));
    expect(rel(point(p, 'impedance a', f0).mag, 1000)).toBeLessThan(1e-9);
  });
});

describe('twin-T notch (§8, TT rows)', () => {
  const text = `
let R = 10k
let C = 10n
drive in
R1 [in m1] R
R2 [m1 out] R
C3 [m1 gnd] (2*C)
C1 [in m2] C
C2 [m2 out] C
R3 [m2 gnd] (R/2)
show out
`;
  const w0 = 1 / (10e3 * 10e-9);
  const f0 = w0 / TWO_PI;
  const exact = (f: number): number => {
    const w = TWO_PI * f;
    const num = w0 * w0 - w * w;
    return Math.abs(num) / Math.hypot(w0 * w0 - w * w, 4 * w0 * w);
  };

  it('TT-a/d: null at 1/(2πRC) = 1591.54943 Hz; −3 dB edges (√5 ∓ 2)·f₀ = 375.7139 / 6741.912 Hz [TT; DER]', () => {
    const r = run(text + 'sweep 10 .. 100k');
    expect(rel(readout(r, 'out', 'center').value, f0)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'out', 'corner-low').value, (Math.sqrt(5) - 2) * f0)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'out', 'corner-high').value, (Math.sqrt(5) + 2) * f0)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'out', 'corner-low').value, 375.7139)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'out', 'corner-high').value, 6741.912)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'out', 'q').value, 0.25)).toBeLessThan(1e-9);
    // Finite-depth check (caveat 4): the grid point nearest f₀ is deep, and not NaN.
    const t = trace(r, 'out');
    const min = Math.min(...Array.from(t.magnitudeDb));
    expect(min).toBeLessThan(-20);
  });

  it('TT-b/c: |H| at f₀(1+10⁻⁶) ≈ −126.02 dB against the exact TF; −0.656726 / −9.090804 / −9.090804 dB at f₀/10, f₀/2, 2f₀ [MNA; DER]', () => {
    const r = run(text + sweepAt(f0 / 10, f0 / 2, f0 * (1 + 1e-6), 2 * f0));
    expect(Math.abs(point(r, 'out', f0 * (1 + 1e-6)).db - -126.0206)).toBeLessThan(1e-3);
    expect(rel(point(r, 'out', f0 * (1 + 1e-6)).mag, exact(f0 * (1 + 1e-6)))).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'out', f0 / 10).db - -0.656726)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'out', f0 / 2).db - -9.090804)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'out', 2 * f0).db - -9.090804)).toBeLessThan(1e-6);
  });
});

describe('doubly terminated Butterworth LC ladders (§13 LAD rows, §5 Butterworth polynomials)', () => {
  /** Published monic Butterworth denominators, §5 (WIN Table 3.2, KUG Table 16.7; SCIPY butter). */
  const POLY: Record<number, number[]> = {
    2: [1, 1.414214, 1],
    3: [1, 2, 2, 1],
    4: [1, 2.613126, 3.414214, 2.613126, 1],
    5: [1, 3.236068, 5.236068, 5.236068, 3.236068, 1],
  };
  /** 0.5/B(jw): the doubly terminated ladder's V_L/V_S (LAD-1 for n = 3). */
  const expected = (n: number, w: number): { db: number; deg: number } => {
    const c = POLY[n];
    let re = 0;
    let im = 0;
    for (let k = 0; k <= n; k++) {
      // coefficient of s^(n−k), s = jw
      const p = n - k;
      const mag = c[k] * Math.pow(w, p);
      const turn = p % 4;
      if (turn === 0) re += mag;
      else if (turn === 1) im += mag;
      else if (turn === 2) re -= mag;
      else im -= mag;
    }
    return { db: 20 * Math.log10(0.5 / Math.hypot(re, im)), deg: (-Math.atan2(im, re) * 180) / Math.PI };
  };
  const ladder = (n: number): string => {
    const lines = ['let R0 = 1k', 'let fc = 1k', 'drive in', 'R1 [in n1] R0'];
    let node = 1;
    for (let k = 1; k <= n; k++) {
      const g = `(2*sin((2*${k}-1)*pi/(2*${n})))`;
      if (k % 2 === 1) lines.push(`C${k} [n${node} gnd] (${g}/(2*pi*fc*R0))`);
      else {
        lines.push(`L${k} [n${node} n${node + 1}] (${g}*R0/(2*pi*fc))`);
        node++;
      }
    }
    lines.push(`R2 [n${node} gnd] R0`, `show "out" n${node}`);
    return lines.join('\n') + '\n';
  };

  for (const n of [2, 3, 4, 5]) {
    it(`n = ${n}: 20·log|V_L/V_S| and phase at 0.3, 1, 2, 10 f_c match 0.5/B_${n}(s) [LAD-1, MYJ g_k formula; WIN/KUG polynomials]`, () => {
      const fs = [300, 1000, 2000, 10000];
      const r = run(ladder(n) + sweepAt(...fs));
      for (const f of fs) {
        const e = expected(n, f / 1000);
        const p = point(r, 'out', f);
        expect(Math.abs(p.db - e.db), `${f} Hz`).toBeLessThan(1e-4);
        // Unwrapped phase against the principal value of the polynomial's phase.
        const d = ((((p.deg - e.deg) % 360) + 540) % 360) - 180;
        expect(Math.abs(d), `${f} Hz`).toBeLessThan(1e-4);
      }
      expect(Math.abs(point(r, 'out', 1000).db - (-6.0206 - 3.0103))).toBeLessThan(1e-4);
    });
  }

  it('LAD-1: n = 3 ladder at 1 Ω, 1 rad/s: −6.020600 / −9.030900 / −66.020604 dB, −135° at ω = 1 [MYJ; MNA]', () => {
    const w = (x: number): number => x / TWO_PI;
    const r = run(`drive in\nR1 [in a] 1\nC1 [a gnd] 1\nL2 [a b] 2\nC3 [b gnd] 1\nR2 [b gnd] 1\nshow b\n${sweepAt(w(1e-6), w(1), w(10))}`);
    expect(Math.abs(point(r, 'b', w(1e-6)).db - -6.0206)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'b', w(1)).db - -9.0309)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'b', w(10)).db - -66.020604)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'b', w(1)).deg - -135)).toBeLessThan(1e-9);
  });

  it('LAD-1d/e: 50 Ω, 1 MHz version: C = 3.183099 nF, L = 15.915494 µH, −9.030900 dB at 1 MHz [DER; MNA]', () => {
    const r = run('drive in\nR1 [in a] 50\nC1 [a gnd] 3.183099n\nL2 [a b] 15.915494u\nC3 [b gnd] 3.183099n\nR2 [b gnd] 50\nshow b\nsweep at 1M');
    expect(Math.abs(point(r, 'b', 1e6).db - -9.0309)).toBeLessThan(1e-4);
  });

  it('LAD-3/3d: RC phase-shift networks give −1/29 at 1/(2πRC√6) and √6/(2πRC) [RCO; DER; MNA]', () => {
    const f1 = 1 / (TWO_PI * 10e3 * 10e-9 * Math.sqrt(6));
    const hp = run(`drive in\nC1 [in a] 10n\nR1 [a gnd] 10k\nC2 [a b] 10n\nR2 [b gnd] 10k\nC3 [b c] 10n\nR3 [c gnd] 10k\nshow c\n${sweepAt(f1)}`);
    expect(rel(f1, 649.7473)).toBeLessThan(1e-6);
    expect(Math.abs(point(hp, 'c', f1).re - -1 / 29)).toBeLessThan(1e-12);
    expect(Math.abs(point(hp, 'c', f1).im)).toBeLessThan(1e-12);
    const f2 = Math.sqrt(6) / (TWO_PI * 10e3 * 10e-9);
    const lp = run(`drive in\nR1 [in a] 10k\nC1 [a gnd] 10n\nR2 [a b] 10k\nC2 [b gnd] 10n\nR3 [b c] 10k\nC3 [c gnd] 10n\nshow c\n${sweepAt(f2)}`);
    expect(Math.abs(point(lp, 'c', f2).re - -1 / 29)).toBeLessThan(1e-12);
  });

  it('LAD-4: Wien network gives 1/3 at 0° at 1/(2πRC) [DER; MNA]', () => {
    const f = 1 / (TWO_PI * 10e3 * 10e-9);
    const r = run(`drive in\nR1 [in m] 10k\nC1 [m out] 10n\nR2 [out gnd] 10k\nC2 [out gnd] 10n\nshow out\n${sweepAt(f)}`);
    expect(Math.abs(point(r, 'out', f).re - 1 / 3)).toBeLessThan(1e-12);
    expect(Math.abs(point(r, 'out', f).deg)).toBeLessThan(1e-9);
  });

  it('BT-a/b/c: bridged-T notch: −34.151404 dB at f₀ = 1591.549 Hz; −1.503790 / −5.763531 dB at 100 Hz / 10 kHz [DER; MNA]', () => {
    const f0 = 1 / (TWO_PI * 10e-9 * Math.sqrt(100e3 * 1e3));
    const r = run(`drive in\nC1 [in m] 10n\nC2 [m out] 10n\nR1 [m gnd] 1k\nR2 [in out] 100k\nshow out\n${sweepAt(100, f0, 10e3)}`);
    expect(Math.abs(point(r, 'out', f0).db - -34.151404)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'out', 100).db - -1.50379)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'out', 10e3).db - -5.763531)).toBeLessThan(1e-6);
    const w = run(`drive in\nC1 [in m] 10n\nC2 [m out] 10n\nR1 [m gnd] 1k\nR2 [in out] 100k\nshow out\nsweep 10 .. 1M`);
    expect(rel(readout(w, 'out', 'center').value, 1591.549)).toBeLessThan(1e-6);
  });
});
