/**
 * Active filters and op-amp loops against ../shared/reference/reference-values.md (beside the repository), each
 * check naming its row id and source key (DER, SCIPY, SK, KUG, WIN as listed there).
 */
import { describe, expect, it } from 'vitest';
import { point, readout, rel, run, sweepAt, trace } from './helpers/cell.js';

const TWO_PI = 2 * Math.PI;

describe('Butterworth orders 2–5 as cascaded unity-gain Sallen–Key sections (§5)', () => {
  /** Published monic denominators (WIN Table 3.2, KUG Table 16.7; SCIPY butter). */
  const POLY: Record<number, number[]> = {
    2: [1, 1.414214, 1],
    3: [1, 2, 2, 1],
    4: [1, 2.613126, 3.414214, 2.613126, 1],
    5: [1, 3.236068, 5.236068, 5.236068, 3.236068, 1],
  };
  const expected = (n: number, w: number): { db: number; deg: number } => {
    let re = 0;
    let im = 0;
    POLY[n].forEach((c, k) => {
      const p = n - k;
      const m = c * Math.pow(w, p);
      [() => (re += m), () => (im += m), () => (re -= m), () => (im -= m)][p % 4]();
    });
    return { db: -20 * Math.log10(Math.hypot(re, im)), deg: (-Math.atan2(im, re) * 180) / Math.PI };
  };
  /**
   * Each factor 1 + a·s + b·s² (s normalised to ω_c) as an equal-R unity-gain Sallen–Key:
   * C_gnd = a/(2Rω_c), C_fb = 2b/(aRω_c) (SK: H = 1/(1 + s·C_gnd(R1+R2) + s²R1R2C_fbC_gnd));
   * a real pole as RC and an ideal follower.
   */
  const cascade = (n: number): string => {
    const lines = ['let R = 10k', 'let wc = 2*pi*1k', 'drive in'];
    let node = 'in';
    let s = 0;
    if (n % 2 === 1) {
      lines.push(`R0 [in x0] R`, `C0 [x0 gnd] (1/(R*wc))`, `U0 [x0 y0 y0] opamp`);
      node = 'y0';
    }
    for (let k = 1; k <= Math.floor(n / 2); k++) {
      s++;
      const a = `(2*sin((2*${k}-1)*pi/(2*${n})))`;
      lines.push(
        `R${s}a [${node} a${s}] R`,
        `R${s}b [a${s} b${s}] R`,
        `C${s}a [a${s} o${s}] (2/(${a}*R*wc))  # feedback`,
        `C${s}b [b${s} gnd] (${a}/(2*R*wc))`,
        `U${s} [b${s} o${s} o${s}] opamp`,
      );
      node = `o${s}`;
    }
    lines.push(`show "out" ${node}`);
    return lines.join('\n') + '\n';
  };

  for (const n of [2, 3, 4, 5]) {
    it(`n = ${n}: magnitude and phase at 0.5, 1, 2, 10 f_c against the published polynomial; corner 1 kHz [WIN T3.2; KUG T16.7; SCIPY butter]`, () => {
      const fs = [500, 1000, 2000, 10000];
      const r = run(cascade(n) + sweepAt(...fs));
      for (const f of fs) {
        const e = expected(n, f / 1000);
        const p = point(r, 'out', f);
        expect(Math.abs(p.db - e.db), `${f} Hz`).toBeLessThan(1e-4);
        const d = ((((p.deg - e.deg) % 360) + 540) % 360) - 180;
        expect(Math.abs(d), `${f} Hz`).toBeLessThan(1e-4);
      }
      expect(Math.abs(point(r, 'out', 1000).db - -3.0103)).toBeLessThan(1e-6);
      // Phase at f_c is −45°·n exactly, unwrapped along the sweep.
      expect(Math.abs(point(r, 'out', 1000).deg - -45 * n)).toBeLessThan(1e-6);
      const wide = run(cascade(n) + 'sweep 10 .. 100k');
      expect(rel(readout(wide, 'out', 'corner').value, 1000)).toBeLessThan(1e-9);
      expect(Math.abs(readout(wide, 'out', 'rolloff').value - -20 * n)).toBeLessThan(0.01);
    });
  }

  it('τ_g(0) = a₁/a₀ for n = 2..5 (1.414214, 2, 2.613126, 3.236068 s normalised) [§12 all-pole row; WIN]', () => {
    const a1 = { 2: 1.414214, 3: 2, 4: 2.613126, 5: 3.236068 } as Record<number, number>;
    for (const n of [2, 3, 4, 5]) {
      const r = run(cascade(n) + 'sweep 0 .. 1, 2 linear');
      expect(rel(trace(r, 'out').groupDelay[0] * TWO_PI * 1000, a1[n])).toBeLessThan(1e-6);
    }
  });
});

describe('unity-gain Sallen–Key low-pass (§6, SK rows)', () => {
  const sk = (cfb: string, cgnd: string): string => `
drive in
R1 [in a] 10k
R2 [a b] 10k
C1 [a out] ${cfb}  # feedback
C2 [b gnd] ${cgnd}  # to ground
U1 [b out out] opamp
show out
`;
  const f0 = 7071.06781 / TWO_PI;

  it('SK-a/b/c/e: f₀ = 1125.3954 Hz is the −3 dB corner (Q = 1/√2); −90° there; −40.000434 dB at 10 f₀ [DER; SCIPY; MNA]', () => {
    const w0 = 1 / Math.sqrt(10e3 * 10e3 * 20e-9 * 10e-9);
    expect(rel(w0, 7071.06781)).toBeLessThan(1e-9);
    expect(Math.sqrt(10e3 * 10e3 * 20e-9 * 10e-9) / (10e-9 * 20e3)).toBeCloseTo(0.707106781, 9);
    const r = run(sk('20n', '10n') + 'sweep 10 .. 100k');
    expect(rel(readout(r, 'out', 'corner').value, w0 / TWO_PI)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'out', 'corner').value, 1125.3954)).toBeLessThan(1e-6);
    const p = run(sk('20n', '10n') + sweepAt(w0 / TWO_PI, (10 * w0) / TWO_PI));
    expect(Math.abs(point(p, 'out', w0 / TWO_PI).db - -3.0103)).toBeLessThan(1e-6);
    expect(Math.abs(point(p, 'out', w0 / TWO_PI).deg - -90)).toBeLessThan(1e-9);
    expect(Math.abs(point(p, 'out', (10 * w0) / TWO_PI).db - -40.000434)).toBeLessThan(1e-6);
  });

  it('SK-gd: τ_g(0) = C_gnd(R1+R2) = 200 µs [DER; SCIPY numerical dφ/dω]', () => {
    const r = run(sk('20n', '10n') + 'sweep 0 .. 10, 2 linear');
    expect(rel(trace(r, 'out').groupDelay[0], 200e-6)).toBeLessThan(1e-12);
  });

  it('SK-sw: capacitors swapped (the naming trap): Q = 0.353553 and −9.030900 dB at 1125.3954 Hz [DER; MNA]', () => {
    const r = run(sk('10n', '20n') + sweepAt(f0));
    expect(Math.abs(point(r, 'out', f0).db - -9.0309)).toBeLessThan(1e-6);
  });
});

describe('multiple-feedback filters, ideal op-amp (§7, MFB rows)', () => {
  it('MFB-BP: f₀ 1669.23113 Hz, Q 5.244044, −5 (13.979400 dB, ±180°) at f₀, corners 1517.646 / 1835.956 Hz, BW 318.3099 Hz [DER; MNA + brentq]', () => {
    const text = `
drive in
R1 [in a] 10k
R3 [a gnd] 1k
C1 [a out] 10n
C2 [a b] 10n
R2 [b out] 100k
U1 [gnd b out] opamp
show out
`;
    const r = run(text + 'sweep 10 .. 100k');
    const f0 = (1 / (TWO_PI * 10e-9)) * Math.sqrt((10e3 + 1e3) / (10e3 * 100e3 * 1e3));
    expect(rel(f0, 1669.23113)).toBeLessThan(1e-8);
    expect(rel(readout(r, 'out', 'center').value, f0)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'out', 'peak-frequency').value, f0)).toBeLessThan(1e-9);
    expect(rel(readout(r, 'out', 'q').value, 5.244044)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'out', 'corner-low').value, 1517.646)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'out', 'corner-high').value, 1835.956)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'out', 'bandwidth').value, 1 / (Math.PI * 100e3 * 10e-9))).toBeLessThan(1e-9);
    expect(Math.abs(readout(r, 'out', 'peak').value - 13.9794)).toBeLessThan(1e-6);
    const p = run(text + sweepAt(f0));
    expect(Math.abs(point(p, 'out', f0).re - -5)).toBeLessThan(1e-9);
    expect(Math.abs(Math.abs(point(p, 'out', f0).deg) - 180)).toBeLessThan(1e-9);
  });

  it('MFB-LP: f₀ 750.263597 Hz, −3.010300 dB and +90° there, 0 dB at 179.8920° at 1 Hz [DER; MNA]', () => {
    const text = `
drive in
R1 [in a] 10k
C1 [a gnd] 45n
R2 [a out] 10k
R3 [a b] 10k
C2 [b out] 10n
U1 [gnd b out] opamp
show out
`;
    const f0 = 1 / (TWO_PI * Math.sqrt(10e-9 * 45e-9 * 10e3 * 10e3));
    expect(rel(f0, 750.263597)).toBeLessThan(1e-8);
    const r = run(text + sweepAt(1, f0));
    expect(Math.abs(point(r, 'out', f0).db - -3.0103)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'out', f0).deg - 90)).toBeLessThan(1e-9);
    expect(Math.abs(point(r, 'out', 1).db)).toBeLessThan(1e-6);
    expect(Math.abs(point(r, 'out', 1).deg - 179.892)).toBeLessThan(1e-4);
    const w = run(text + 'sweep 1 .. 100k');
    expect(rel(readout(w, 'out', 'corner').value, f0)).toBeLessThan(1e-9);
  });
});

describe('op-amps (§9, OA rows)', () => {
  it('OA-1: non-inverting gain 10 on a one-pole op-amp (1e5, GBW 1 MHz): DC 9.9990001 (19.999131 dB), −3 dB at fp(1+A0β) = 100 010 Hz, −45° there [DER; SCIPY brentq; MNA]', () => {
    const text = `
drive in
U1 [in n out] opamp gain 100k gbw 1M
R1 [out n] 9k
R2 [n gnd] 1k
show out
`;
    const r = run(text);
    expect(Math.abs(readout(r, 'out', 'low-frequency-gain').value - 19.999131)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'out', 'corner').value, 100010)).toBeLessThan(1e-9);
    const p = run(text + 'sweep at 1m, 100.01k');
    const dc = point(p, 'out', 1e-3);
    expect(rel(dc.mag, 9.9990001)).toBeLessThan(1e-7);
    expect(Math.abs(point(p, 'out', 100010).db - dc.db - -3.0103)).toBeLessThan(1e-6);
    expect(Math.abs(point(p, 'out', 100010).deg - -45)).toBeLessThan(1e-6);
    // OA-1e: the ideal op-amp gives exactly 10.
    const ideal = run(text.replace('gain 100k gbw 1M', '') + 'sweep at 1k');
    expect(rel(point(ideal, 'out', 1e3).mag, 10)).toBeLessThan(1e-14);
  });

  /** L(s) = G / ((1 + s/2π·10)(1 + s/2π·f2)) as written with controlled sources, shown as a loop. */
  const loop = (g: string, f2: string | null): string => `
drive in
A1 [a gnd in gnd] vgain ${g}
R1 [a b] 1k
C1 [b gnd] (1/(2*pi*10*1k))
${f2 === null ? 'show loop b' : `A2 [c gnd b gnd] vgain 1\nR2 [c d] 1k\nC2 [d gnd] (1/(2*pi*${f2}*1k))\nshow loop d`}
sweep 1 .. 100M
`;
  const rows: [string, string, string | null, number, number][] = [
    ['OA-PM follower, second pole at GBW', '100k', '1M', 786151.4, 51.82802],
    ['OA-PM follower, second pole at 2·GBW', '100k', '2M', 910179.7, 65.53083],
    ['OA-PM gain 10, second pole at 1 MHz', '10k', '1M', 99508.55, 84.32305],
    ['OA-PM gain 10, second pole at 2 MHz', '10k', '2M', 99875.54, 87.14689],
    ['OA-PM1 single pole', '10k', null, 100000, 90.00573],
  ];
  for (const [name, g, f2, fc, pm] of rows) {
    it(`${name}: crossover ${fc} Hz, phase margin ${pm}° [SCIPY brentq on |freqs| − 1, numpy.angle]`, () => {
      const r = run(loop(g, f2));
      const label = f2 === null ? 'loop b' : 'loop d';
      const c = readout(r, label, 'crossover');
      // The table gives f_c to 7 digits: half a unit of the last digit is below 1e-6 relative.
      expect(rel(c.value, fc)).toBeLessThan(1e-6);
      const m = readout(r, label, 'phase-margin');
      expect(Math.abs(m.value - pm)).toBeLessThan(1e-4);
      expect(rel(m.at!, c.value)).toBeLessThan(1e-15);
      expect(readout(r, label, 'gain-margin').value).toBe(Infinity);
      expect(Math.abs(readout(r, label, 'low-frequency-gain').value - 20 * Math.log10(Number(g.replace('k', '')) * 1000))).toBeLessThan(1e-9);
    });
  }

  it('OA-PM: the follower loop as a real circuit (one-pole op-amp driving an RC pole at GBW, loop broken at the input) gives the same margin', () => {
    // T = A(s)·1/(1+s/ω2): the op-amp's output through R·C back to where the loop was opened.
    const r = run(`
drive in
U1 [in gnd x] opamp gain 100k gbw 1M
R1 [x fb] 1k
C1 [fb gnd] (1/(2*pi*1M*1k))
show loop fb
sweep 1 .. 100M
`);
    expect(rel(readout(r, 'loop fb', 'crossover').value, 786151.4)).toBeLessThan(1e-6);
    expect(Math.abs(readout(r, 'loop fb', 'phase-margin').value - 51.82802)).toBeLessThan(1e-4);
  });

  it('a three-pole loop has a phase crossover and a finite gain margin (closed forms)', () => {
    // T = K/(1 + s/ω)³ crosses −180° at ω√3, where |T| = K/8.
    const r = run(`
drive in
A1 [a gnd in gnd] vgain 4
R1 [a b] 1k
C1 [b gnd] (1/(2*pi*1k*1k))
A2 [c gnd b gnd] vgain 1
R2 [c d] 1k
C2 [d gnd] (1/(2*pi*1k*1k))
A3 [e gnd d gnd] vgain 1
R3 [e f] 1k
C3 [f gnd] (1/(2*pi*1k*1k))
show loop f
sweep 1 .. 1M
`);
    expect(rel(readout(r, 'loop f', 'phase-crossover').value, 1000 * Math.sqrt(3))).toBeLessThan(1e-9);
    expect(Math.abs(readout(r, 'loop f', 'gain-margin').value - 20 * Math.log10(2))).toBeLessThan(1e-9);
    // |T| = 1 where (1 + x²)^(3/2) = 4.
    const x = Math.sqrt(Math.pow(4, 2 / 3) - 1);
    expect(rel(readout(r, 'loop f', 'crossover').value, 1000 * x)).toBeLessThan(1e-9);
    expect(Math.abs(readout(r, 'loop f', 'phase-margin').value - (180 - (3 * Math.atan(x) * 180) / Math.PI))).toBeLessThan(1e-9);
  });
});

describe('group delay (§12, GD rows)', () => {
  /** 1/(1 + a·s + b·s²) at ω_c as an equal-R unity-gain Sallen–Key. */
  const section = (a: number, b: number, fc: number): string => `
let R = 10k
let wc = 2*pi*${fc}
drive in
R1 [in x] R
R2 [x y] R
C1 [x out] (${2 * b}/(${a}*R*wc))
C2 [y gnd] (${a}/(2*R*wc))
U1 [y out out] opamp
show out
`;

  it('GD-2: Bessel n = 2, delay-normalised 3/(s²+3s+3): τ_g(0) = 1 s, τ_g(ω = 1) = 12/13 = 0.9230769 s [DER; SCIPY bessel norm=delay]', () => {
    const f1 = 1 / TWO_PI;
    const r = run(section(1, 1 / 3, f1) + `sweep 0 .. ${f1.toPrecision(17)}, 2 linear`);
    expect(rel(trace(r, 'out').groupDelay[0], 1)).toBeLessThan(1e-12);
    expect(rel(trace(r, 'out').groupDelay[1], 12 / 13)).toBeLessThan(1e-12);
    expect(rel(12 / 13, 0.9230769)).toBeLessThan(1e-7);
  });

  it('GD-2c: Bessel n = 2 scaled to f₋₃dB = 1 kHz: τ_g(0) = 216.714 µs and the corner at 1 kHz (BE-w3 1.361654) [SCIPY bessel norm=mag; KUG T16.6]', () => {
    const w3 = 1.361654;
    const r = run(section(w3, (w3 * w3) / 3, 1000) + 'sweep 0 .. 1, 2 linear');
    expect(Math.abs(trace(r, 'out').groupDelay[0] - 216.714e-6)).toBeLessThan(0.0005e-6);
    const w = run(section(w3, (w3 * w3) / 3, 1000) + 'sweep 10 .. 100k');
    expect(rel(readout(w, 'out', 'corner').value, 1000)).toBeLessThan(1e-6);
  });

  it('GD-3: Butterworth n = 2 at 1 kHz: τ_g(0) = τ_g(f_c) = √2/ω_c = 225.0791 µs; normalised peak 1.707107 s at ω = 0.643548 [DER; SCIPY butter]', () => {
    const r = run(section(Math.SQRT2, 1, 1000) + 'sweep 0 .. 1k, 2 linear');
    expect(rel(trace(r, 'out').groupDelay[0], Math.SQRT2 / (TWO_PI * 1000))).toBeLessThan(1e-12);
    expect(rel(trace(r, 'out').groupDelay[1], Math.SQRT2 / (TWO_PI * 1000))).toBeLessThan(1e-12);
    expect(Math.abs(trace(r, 'out').groupDelay[1] - 225.0791e-6)).toBeLessThan(0.00005e-6);
    const pk = run(section(Math.SQRT2, 1, 1000) + 'sweep at 643.548');
    expect(Math.abs(point(pk, 'out', 643.548).delay * TWO_PI * 1000 - 1.707107)).toBeLessThan(1e-6);
  });
});
