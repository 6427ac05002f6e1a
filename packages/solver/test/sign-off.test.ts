/**
 * Numbers a designer signs: exact between sweep points and independent of where the sweep
 * ends. Each case is a regression of something that misled before (issue 11), checked
 * against a closed form with its source or a scipy.signal call (named beside it).
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { readout, rel, run, trace } from './helpers/cell.js';

const TWO_PI = 2 * Math.PI;

/** Series RLC with Q = 300, its resonance centred between two points of the 100/decade default sweep. */
const F0 = Math.pow(10, 3.005);
const L = 10e-3;
const C = 1 / Math.pow(TWO_PI * F0, 2) / L;
const R = Math.sqrt(L / C) / 300;
const num = (x: number): string => x.toPrecision(17);
const RLC = `drive in\nL1 [in a] ${num(L)}\nC1 [a out] ${num(C)}\nR1 [out gnd] ${num(R)}\nshow out\n`;

/** Bridged-T notch of reference-values §13 (C = 10 nF both, R = 100 kΩ bridge, 1 kΩ shunt). */
const BRIDGED_T = 'drive in\nC1 [in m] 10n\nC2 [m out] 10n\nR1 [in out] 100k\nR2 [m gnd] 1k\nshow out\n';
/** Twin-T of reference-values §8: R, R, R/2 and C, C, 2C with R = 10 kΩ, C = 10 nF. */
const TWIN_T = 'drive in\nR1 [in a] 10k\nR2 [a out] 10k\nC3 [a gnd] 20n\nC1 [in b] 10n\nC2 [b out] 10n\nR3 [b gnd] 5k\nshow out\n';

describe('a range requirement finds the true extreme between sweep points', () => {
  it('a Q = 300 peak between two default sweep points fails `gain <= -10 dB`, at the peak the readout reports [RLC-1, DER: |V_R/V_in| = 1 at f₀; scipy.signal.freqs([RC, 0], [LC, RC, 1]) gives 1.0]', () => {
    const r = run(RLC + 'require out gain <= -10 dB over 100 .. 10k');
    const t = trace(r, 'out');
    // The case is a real one: no sweep point comes within 10 dB of the peak.
    expect(Math.max(...Array.from(t.magnitudeDb))).toBeLessThan(-10);
    const q = r.requirements[0];
    expect(q.status).toBe('fail');
    expect(Math.abs(q.measured)).toBeLessThan(1e-9);
    expect(rel(q.worstAt!, F0)).toBeLessThan(1e-9);
    const peak = readout(r, 'out', 'peak');
    expect(peak.value).toBe(q.measured);
    expect(peak.at).toBe(q.worstAt);
  });

  it('`>=` finds the true depth of a notch: the bridged-T reads −34.151404 dB at f₀ = 1591.549 Hz [BT-b: 2Rs/(Rb+2Rs); scipy.optimize.minimize_scalar on scipy.signal.freqs gives −34.15140352 dB]', () => {
    const r = run(BRIDGED_T + 'require out gain >= -34.15 dB over 1k .. 3k\nrequire out gain = -20 ± 14.1514 dB over 1k .. 3k');
    const [low, band] = r.requirements;
    expect(low.status).toBe('fail');
    expect(Math.abs(low.measured - 20 * Math.log10(2e3 / 102e3))).toBeLessThan(1e-9);
    expect(rel(low.worstAt!, 1 / (TWO_PI * 10e-9 * Math.sqrt(100e3 * 1e3)))).toBeLessThan(1e-6);
    // `=` takes the side that fails: the dip, not the gain near 0 dB at the range's ends.
    expect(band.status).toBe('fail');
    expect(band.measured).toBe(low.measured);
  });

  it('a twin-T reads its exact null, not the nearest grid point [TT-a/b: |H(1/(2πRC))| = 0]', () => {
    const r = run(TWIN_T + 'require out gain >= -60 dB over 1k .. 3k');
    const q = r.requirements[0];
    expect(q.status).toBe('fail');
    expect(q.measured).toBeLessThan(-200);
    expect(rel(q.worstAt!, 1 / (TWO_PI * 10e3 * 10e-9))).toBeLessThan(1e-9);
  });

  it('phase and delay ranges are refined too: a Q = 300 resonance’s delay peaks at 2Q/ω₀ near f₀ [DER: τ(ω₀) = 2Q/ω₀ for a 2nd-order section]', () => {
    const r = run(RLC + 'require out delay <= 1 ms over 100 .. 10k');
    const q = r.requirements[0];
    expect(q.status).toBe('fail');
    // τ(ω) of H = sRC/(1 − ω²LC + jωRC) is ≥ 2Q/ω₀ at its maximum, which lies within f₀/Q of f₀.
    expect(q.measured).toBeGreaterThanOrEqual(((2 * 300) / (TWO_PI * F0)) * (1 - 1e-9));
    expect(Math.abs(q.worstAt! - F0)).toBeLessThan(F0 / 300);
  });
});

describe('levels come from the network, not from the end of the sweep', () => {
  it('an RC high-pass at 159.155 Hz swept to 1 kHz reads its corner exactly [RC1-g, DER: f_c = 1/(2πRC)]', () => {
    const fc = 1 / (TWO_PI * 1e3 * 1e-6);
    for (const end of ['1k', '2k', '100k']) {
      const r = run(`drive in\nC1 [in out] 1u\nR1 [out gnd] 1k\nshow out\nsweep 10 .. ${end}`);
      expect(rel(readout(r, 'out', 'corner').value, fc)).toBeLessThan(1e-9);
    }
  });

  it('a low-pass whose op-amp output resistance lets the input through to a −40 dB floor keeps its corner [numpy nodal solve of the same network + scipy.optimize.brentq: 1000.3392537 Hz]', () => {
    const r = run(
      'drive in\nR1 [in a] 10k\nR2 [a b] 10k\nC1 [a out] 22.5n\nC2 [b gnd] 11.25n\nU1 [b out out] opamp gain 100dB gbw 1M zout 100\nshow out\nsweep 10 .. 100M\nrequire out corner = 1k ± 1%',
    );
    expect(rel(readout(r, 'out', 'corner').value, 1000.3392537138169)).toBeLessThan(1e-8);
    expect(r.requirements[0].status).toBe('pass');
  });
});

describe('readouts follow what the trace is', () => {
  it('a shelf that falls 4 dB between two plateaus is a low-pass with its corner [DER: |H|² = (1 + ω²a²)/(1 + ω²b²) = ½ at ω² = 1/(b² − 2a²), a = R2·C, b = (R1 + R2)·C]', () => {
    const r = run('drive in\nR1 [in out] 1k\nR2 [out m] 1.7k\nC1 [m gnd] 100n\nshow out\nrequire out corner = 1.3k ± 1%');
    const a = 1.7e3 * 100e-9;
    const b = 2.7e3 * 100e-9;
    expect(rel(readout(r, 'out', 'corner').value, 1 / (TWO_PI * Math.sqrt(b * b - 2 * a * a)))).toBeLessThan(1e-9);
    expect(r.requirements[0].status).toBe('pass');
  });

  it('a loop gain has no corner, Q or band readouts; asking for its corner says why, in the requirement itself', () => {
    const r = analyze(
      'drive in\nA1 [a gnd in gnd] vgain 100k\nR1 [a b] 1k\nC1 [b gnd] (1/(2*pi*10*1k))\nA2 [c gnd b gnd] vgain 1\nR2 [c d] 1k\nC2 [d gnd] (1/(2*pi*1M*1k))\nshow loop d\nsweep 1 .. 100M\nrequire loop d corner >= 1',
    );
    const names = r.readouts.map((x) => x.name);
    expect(names).toEqual(['low-frequency-gain', 'crossover', 'phase-margin', 'gain-margin', 'rolloff']);
    const q = r.requirements[0];
    expect(q.status).toBe('not-applicable');
    expect(q.reason).toMatch(/loop gain, which has no corner/);
  });

  it('a flat response asked for a corner says so in the requirement', () => {
    const r = analyze('drive in\nR1 [in a] 1k\nR2 [a gnd] 1k\nshow a\nrequire a corner >= 1k');
    expect(r.requirements[0]).toMatchObject({ status: 'not-applicable', reason: 'a stays within 3 dB of its level across the sweep, so it has no corner' });
  });

  it('a bare capacitor’s impedance has no corner, only its minimum [XC-1: |Z| = 1/(2πfC)]', () => {
    const r = analyze('C1 [a gnd] 1u\nshow impedance a\nrequire "impedance a" corner >= 1k');
    expect(r.readouts.map((x) => x.name)).toEqual(['min-impedance']);
    expect(rel(readout(r, 'impedance a', 'min-impedance').value, 1 / (TWO_PI * r.frequencies[r.frequencies.length - 1] * 1e-6))).toBeLessThan(1e-12);
    expect(r.requirements[0]).toMatchObject({ status: 'not-applicable', reason: expect.stringContaining('impedance, which has no corner') });
  });

  it('a parallel tank’s impedance has its resonance readouts, no corner and no peak in dB [RLC-2: f₀ = 1591.54943 Hz, Q = 10, −3 dB points 1513.960 / 1673.115 Hz]', () => {
    const r = run('R1 [a gnd] 1k\nL1 [a gnd] 10m\nC1 [a gnd] 1u\nshow impedance a');
    expect(r.readouts.map((x) => x.name)).toEqual(['corner-low', 'corner-high', 'bandwidth', 'center', 'q', 'peak-frequency', 'min-impedance']);
    expect(rel(readout(r, 'impedance a', 'center').value, 1591.54943)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'impedance a', 'q').value, 10)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'impedance a', 'corner-low').value, 1513.96)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'impedance a', 'corner-high').value, 1673.115)).toBeLessThan(1e-6);
  });

  it('rolloff is the asymptotic slope, n × 20 dB/decade: −100 for a 5th-order low-pass wherever its sweep ends [LAD-1g, MYJ: Butterworth g = 0.618, 1.618, 2, 1.618, 0.618]', () => {
    // The doubly terminated LC ladder, 1 Ω and ω_c = 1 rad/s scaled to 1 kΩ and 1 kHz.
    const z = 1e3;
    const w = TWO_PI * 1e3;
    const g = [0.61803, 1.61803, 2, 1.61803, 0.61803];
    const cell = `drive in\nR1 [in a] 1k\nC1 [a gnd] ${num(g[0] / (z * w))}\nL1 [a b] ${num((g[1] * z) / w)}\nC2 [b gnd] ${num(g[2] / (z * w))}\nL2 [b out] ${num((g[3] * z) / w)}\nC3 [out gnd] ${num(g[4] / (z * w))}\nR2 [out gnd] 1k\nshow out\n`;
    for (const end of ['2k', '10k', '1M']) expect(readout(run(cell + `sweep 10 .. ${end}`), 'out', 'rolloff').value).toBe(-100);
  });

  it('a band-pass response has no low-frequency gain; its rolloff is −20 dB/decade (one zero, two poles) [RLC-1, DER]', () => {
    const r = run(RLC);
    expect(r.readouts.some((x) => x.name === 'low-frequency-gain')).toBe(false);
    expect(readout(r, 'out', 'rolloff').value).toBe(-20);
    expect(rel(readout(r, 'out', 'q').value, 300)).toBeLessThan(1e-6);
  });
});

describe('loops written with the wrong sign', () => {
  it('a loop that is negative at low frequency gets a warning that says it is positive feedback as written [OA-PM loop, negated]', () => {
    const r = run(
      'drive in\nA1 [a gnd in gnd] vgain -100k\nR1 [a b] 1k\nC1 [b gnd] (1/(2*pi*10*1k))\nA2 [c gnd b gnd] vgain 1\nR2 [c d] 1k\nC2 [d gnd] (1/(2*pi*1M*1k))\nshow loop d\nsweep 1 .. 100M',
    );
    const w = r.diagnostics.find((d) => d.code === 'loop-sign')!;
    expect(w).toMatchObject({ severity: 'warning', line: 8 });
    expect(w.message).toMatch(/positive feedback/);
    expect(w.hint).toMatch(/check the sign/);
    const right = run('drive in\nA1 [a gnd in gnd] vgain 100k\nR1 [a b] 1k\nC1 [b gnd] 1u\nshow loop b');
    expect(right.diagnostics.some((d) => d.code === 'loop-sign')).toBe(false);
  });
});

describe('values that do not exist are never a silent pass', () => {
  const ladder = (n: number): string => {
    const lines = ['drive n0'];
    for (let k = 0; k < n; k++) lines.push(`R${k + 1} [n${k} n${k + 1}] 1k`, `C${k + 1} [n${k + 1} gnd] 1n`);
    return lines.concat(`show n${n}`, `require n${n} peak <= 1 dB`).join('\n');
  };

  it('a passive 50-section RC ladder peaks at 0 dB (it never rises above its DC level), and a 200-section one too [passive network: |H| ≤ 1, DER]', () => {
    for (const n of [50, 200]) {
      const r = run(ladder(n));
      expect(readout(r, `n${n}`, 'peak').value).toBe(0);
      expect(r.requirements[0]).toMatchObject({ status: 'pass', measured: 0 });
      expect(r.readouts.every((x) => Number.isFinite(x.value))).toBe(true);
    }
  });

  it('points beyond double precision are told: −∞ dB at the top of a 200-section ladder is explained on its show line', () => {
    const r = run(ladder(200));
    const t = trace(r, 'n200');
    expect(Array.from(t.magnitudeDb).some((x) => x === -Infinity)).toBe(true);
    expect(r.diagnostics.find((d) => d.code === 'trace-null')).toMatchObject({ line: 402, message: expect.stringContaining('exactly 0 at') });
  });

  it('a trace that is zero everywhere gets a warning, and a gain requirement on it is not applicable, not a pass', () => {
    const r = analyze('drive in\nR1 [in a] 1k\nR2 [a out] 1k\nC1 [a gnd] 1n\nshow out - a\nrequire "out - a" gain <= -3 dB');
    expect(r.diagnostics.find((d) => d.code === 'trace-zero')).toMatchObject({ severity: 'warning', line: 5 });
    expect(r.requirements[0]).toMatchObject({ status: 'not-applicable', reason: expect.stringContaining('zero at every frequency') });
    expect(r.readouts).toEqual([]);
  });

  it('a requirement that measured −∞ (an RC high-pass at 0 Hz, an exact null) says why on its line', () => {
    const r = run('drive in\nC1 [in out] 1u\nR1 [out gnd] 1k\nshow out\nrequire out gain <= -100 dB at 0');
    expect(r.requirements[0]).toMatchObject({ status: 'pass', measured: -Infinity, worstAt: 0 });
    expect(r.diagnostics.find((d) => d.code === 'requirement-infinite')).toMatchObject({ line: 5, message: expect.stringContaining('exact null') });
  });
});
