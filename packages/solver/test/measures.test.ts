/**
 * Every readout a trace shows can be required, and the measures a sign-off needs. Each value
 * is checked against a closed form or a table of reference-values.md (the source named
 * beside it), again with the sweep moved or widened to show it does not change, and each
 * measure that cannot be computed reads n/a with its reason.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyze } from '../src/analyze.js';
import type { RequirementResult, Result } from '../src/result.js';
import { readout, rel, run } from './helpers/cell.js';
import { network, num } from './helpers/networks.js';

const TWO_PI = 2 * Math.PI;

/** The one requirement of a run, checked with no error. */
function only(text: string): RequirementResult {
  const r = run(text);
  expect(r.requirements).toHaveLength(1);
  return r.requirements[0];
}

/** A requirement that could not be checked: n/a, no value, and its reason on its own line. */
function notApplicable(result: Result, reason: RegExp): void {
  const q = result.requirements[0];
  expect(q.status).toBe('not-applicable');
  expect(q.measured).toBeNaN();
  expect(q.reason).toMatch(reason);
  const warning = result.diagnostics.find((d) => d.code === 'requirement-not-checked');
  expect(warning?.line).toBe(q.line);
  expect(warning?.message).toContain(q.reason);
}

/** RLC-1: series R = 10 Ω, L = 10 mH, C = 1 µF; V_R across R, V_C across C. */
const SERIES_RLC = 'drive in\nL1 [in a] 10m\nC1 [a vr] 1u\nR1 [vr gnd] 10\nshow vr\n';
const SERIES_RLC_VC = 'drive in\nR1 [in a] 10\nL1 [a vc] 10m\nC1 [vc gnd] 1u\nshow vc\n';
/** Sweeps that hold the resonance near the middle, at one end, and far inside. */
const SWEEPS = ['', 'sweep 300 .. 9k, 37/decade\n', 'sweep 1 .. 10M, 20/decade\n'];

describe('readouts as measures', () => {
  const f0 = 1 / (TWO_PI * Math.sqrt(10e-3 * 1e-6));
  const cases: [string, string, number, string][] = [
    // [measure, op and limit, the reference value, its source]
    ['centre', '= 1591.549 ± 0.01%', f0, 'RLC-1a, DER: f₀ = 1/(2π√(LC))'],
    ['q', '= 10 ± 0.01%', 10, 'RLC-1b, DER: Q = (1/R)√(L/C)'],
    ['bandwidth', '<= 160', 159.1549, 'RLC-1c, DER: BW = f₀/Q'],
    ['lower-corner', '>= 1.5k', 1513.96, 'RLC-1d, DER: f₀(√(1+1/4Q²) − 1/2Q); scipy brentq on freqs'],
    ['upper-corner', '<= 1.7k', 1673.115, 'RLC-1e, DER: f₀(√(1+1/4Q²) + 1/2Q); scipy brentq on freqs'],
    ['peak-frequency', '= 1591.549 ± 0.01%', f0, 'RLC-1a: V_R peaks at f₀'],
  ];
  for (const [measure, limit, expected, source] of cases) {
    it(`${measure} of a series RLC’s V_R reads ${expected} wherever the sweep lies [${source}]`, () => {
      for (const sweep of SWEEPS) {
        const q = only(`${SERIES_RLC}${sweep}require vr ${measure} ${limit}`);
        expect(q.status).toBe('pass');
        expect(rel(q.measured, expected)).toBeLessThan(1e-6);
        expect(q.unit).toBe(measure === 'q' ? '' : 'Hz');
        expect(q.over).toBeNull();
      }
    });
  }

  it('peak-frequency of V_C is below f₀ [RLC-1i, DER: f_pk = f₀√(1 − 1/2Q²) = 1587.566 Hz]', () => {
    for (const sweep of SWEEPS) {
      const q = only(`${SERIES_RLC_VC}${sweep}require vc peak-frequency <= 1588`);
      expect(q.status).toBe('pass');
      expect(rel(q.measured, f0 * Math.sqrt(1 - 1 / 200))).toBeLessThan(1e-9);
    }
  });

  it('min-impedance of a series RLC is R at f₀, in Ω [RLC-1j, DER: |Z(f₀)| = R]', () => {
    for (const sweep of SWEEPS) {
      const q = only(`L1 [a b] 10m\nC1 [b c] 1u\nR1 [c gnd] 10\nshow impedance a\n${sweep}require impedance a min-impedance <= 10.001 Ω`);
      expect(q.status).toBe('pass');
      expect(q.unit).toBe('Ω');
      expect(rel(q.measured, 10)).toBeLessThan(1e-9);
    }
  });

  it('low-frequency-gain and asymptotic-slope of the 3rd-order Butterworth ladder [LAD-1: 0.5/(s³+2s²+2s+1), so −6.0206 dB and −60 dB/decade]', () => {
    const ladder = 'drive in\nR1 [in a] 50\nC1 [a gnd] 3.183099n\nL1 [a b] 15.915494u\nC2 [b gnd] 3.183099n\nR2 [b gnd] 50\nshow b\n';
    for (const sweep of ['', 'sweep 100k .. 2M\n', 'sweep 10 .. 100M\n']) {
      const r = run(`${ladder}${sweep}require b low-frequency-gain = -6.0206 ± 0.0001 dB\nrequire b asymptotic-slope <= -60`);
      const [level, slope] = r.requirements;
      expect(level.status).toBe('pass');
      expect(Math.abs(level.measured - 20 * Math.log10(0.5))).toBeLessThan(1e-9);
      expect(slope.status).toBe('pass');
      expect(slope.measured).toBe(-60);
      expect(slope.unit).toBe('dB/decade');
    }
  });

  it('phase-crossover of three buffered equal RC poles is √3·f_p, with the gain margin there [DER: each pole gives −60° at ω = √3·ω_p; |T| = 10/2³]', () => {
    const loop =
      'drive in\nR1 [in a] 1k\nC1 [a gnd] (1/(2*pi*1M))\nA1 [b gnd a gnd] vgain 1\nR2 [b c] 1k\nC2 [c gnd] (1/(2*pi*1M))\n' +
      'A2 [d gnd c gnd] vgain 1\nR3 [d e] 1k\nC3 [e gnd] (1/(2*pi*1M))\nA3 [f gnd e gnd] vgain 10\nshow loop f / in\n';
    for (const sweep of ['', 'sweep 1.5k .. 2k\n']) {
      const r = run(`${loop}${sweep}require loop phase-crossover = 1.732k ± 0.1%\nrequire loop gain-margin <= 0 dB`);
      const [crossover, margin] = r.requirements;
      expect(crossover.status).toBe('pass');
      expect(rel(crossover.measured, 1000 * Math.sqrt(3))).toBeLessThan(1e-9);
      expect(margin.status).toBe('pass');
      expect(Math.abs(margin.measured + 20 * Math.log10(10 / 8))).toBeLessThan(1e-9);
    }
  });

  it('the value is the readout the run shows, to the last bit', () => {
    const r = run(`${SERIES_RLC}require vr q >= 9\nrequire vr centre >= 1k`);
    expect(r.requirements[0].measured).toBe(readout(r, 'vr', 'q').value);
    expect(r.requirements[1].measured).toBe(readout(r, 'vr', 'center').value);
  });
});

describe('a readout the trace does not have is n/a with its reason', () => {
  const RC = 'drive in\nR1 [in out] 1k\nC1 [out gnd] 100n\nshow out\n';
  it('a low-pass has no Q, no centre and no bandwidth', () => {
    for (const measure of ['q', 'centre', 'bandwidth', 'lower-corner']) {
      notApplicable(analyze(`${RC}require out ${measure} >= 1`), /out is low-pass: it has one corner/);
    }
  });

  it('a low-pass has no peak frequency: its highest point is at an end', () => {
    notApplicable(analyze(`${RC}require out peak-frequency >= 1`), /no peak inside the sweep/);
  });

  it('a band-pass whose lower corner lies below the sweep has no lower corner, and says to widen the sweep', () => {
    notApplicable(analyze(`${SERIES_RLC}sweep 1.55k .. 10k\nrequire vr lower-corner >= 1`), /on both sides within the sweep.*widen the sweep/);
  });

  it('a high-pass has no low-frequency gain', () => {
    notApplicable(
      analyze('drive in\nC1 [in out] 100n\nR1 [out gnd] 1k\nshow out\nrequire out low-frequency-gain >= -1 dB'),
      /high-pass: its low-frequency level/,
    );
  });

  it('a one-pole loop never reaches −180°, so it has no phase crossover', () => {
    const loop = 'drive in\nR1 [in a] 1k\nC1 [a gnd] 1u\nA1 [b gnd a gnd] vgain 100\nshow loop b / in\n';
    notApplicable(analyze(`${loop}require loop phase-crossover >= 1`), /never reaches −180°/);
  });

  it('a loop gain has no Q', () => {
    const loop = 'drive in\nR1 [in a] 1k\nC1 [a gnd] 1u\nA1 [b gnd a gnd] vgain 100\nshow loop b / in\n';
    notApplicable(analyze(`${loop}require loop q >= 1`), /loop gain, which has no Q/);
  });
});

/**
 * A doubly terminated 3rd-order 0.5 dB Chebyshev LC ladder, 50 Ω, ripple band edge 1 MHz,
 * with its element values from the closed-form g-values of Matthaei, Young & Jones §4.05
 * (reference-values.md LAD-2: 1.5963, 1.0967, 1.5963).
 */
const RIPPLE_DB = 0.5;
const EPS2 = Math.pow(10, RIPPLE_DB / 10) - 1;
function chebyshevLadder(): string {
  const n = 3;
  const beta = Math.log(1 / Math.tanh((RIPPLE_DB * Math.LN10) / 40));
  const gamma = Math.sinh(beta / (2 * n));
  const a = (k: number) => Math.sin(((2 * k - 1) * Math.PI) / (2 * n));
  const b = (k: number) => gamma * gamma + Math.pow(Math.sin((k * Math.PI) / n), 2);
  const g = [(2 * a(1)) / gamma];
  for (let k = 2; k <= n; k++) g.push((4 * a(k - 1) * a(k)) / (b(k - 1) * g[k - 2]));
  const w = TWO_PI * 1e6;
  return `drive in\nR1 [in a] 50\nC1 [a gnd] ${num(g[0] / (w * 50))}\nL1 [a b] ${num((g[1] * 50) / w)}\nC2 [b gnd] ${num(g[2] / (w * 50))}\nR2 [b gnd] 50\nshow b\n`;
}
const LADDER = chebyshevLadder();
/** Sweeps: the default, a coarse one that starts inside the band, a wide coarse one. */
const LADDER_SWEEPS = ['', 'sweep 100k .. 3M, 6/decade\n', 'sweep 1 .. 1G, 10/decade\n'];
/** 20·log10(1/2): the divider of two equal terminations. */
const DIVIDER_DB = 20 * Math.log10(0.5);

/** Bridged-T notch of reference-values §13 (C = 10 nF both, R = 100 kΩ bridge, 1 kΩ shunt) and the twin-T of §8. */
const BRIDGED_T = 'drive in\nC1 [in m] 10n\nC2 [m out] 10n\nR1 [in out] 100k\nR2 [m gnd] 1k\nshow out\n';
const TWIN_T = 'drive in\nR1 [in a] 10k\nR2 [a out] 10k\nC3 [a gnd] 20n\nC1 [in b] 10n\nC2 [b out] 10n\nR3 [b gnd] 5k\nshow out\n';
const NOTCH_SWEEPS = ['', 'sweep 1k .. 3k, 3/decade\n', 'sweep 10 .. 100M, 13/decade\n'];

/** Two decoupling capacitors in parallel, each with its ESL and ESR. */
const C_SMALL = { c: 10e-9, l: 0.5e-9, r: 1e-3 };
const C_LARGE = { c: 1e-6, l: 1e-9, r: 1e-3 };
const DECOUPLING = `C1 [a gnd] 10n esl 0.5n esr 1m\nC2 [a gnd] 1u esl 1n esr 1m\nshow impedance a\n`;

/** Unity-gain Sallen–Key Butterworth low-pass of reference-values §6 (SK-a), ω₀ = 7071.06781 rad/s. */
const SALLEN_KEY = 'drive in\nR1 [in a] 10k\nR2 [a b] 10k\nC1 [a out] 20n\nC2 [b gnd] 10n\nU1 [b out out] opamp\nshow out\n';
const W0_SK = 1 / Math.sqrt(10e3 * 10e3 * 20e-9 * 10e-9);

describe('ripple over a band', () => {
  it('the Chebyshev ladder ripples by exactly 0.5 dB up to its band edge, its ripple peaks found between sweep points [Chebyshev definition: |2V_L/V_S|² = 1/(1 + ε²T₃²), 10·log10(1 + ε²) = 0.5 dB; LAD-2c scipy: −0.5000 dB at ω = 1]', () => {
    for (const sweep of LADDER_SWEEPS) {
      const q = only(`${LADDER}${sweep}require b ripple <= 0.51 dB over 1 .. 1M`);
      expect(q.status).toBe('pass');
      expect(Math.abs(q.measured - RIPPLE_DB)).toBeLessThan(1e-9);
      expect(q.unit).toBe('dB');
      expect(q.over).toEqual({ from: 1, to: 1e6 });
      expect(q.band).toEqual({ low: null, high: 0.51 });
    }
  });

  it('a band that misses the ripple peak at 0.866 MHz reads less [DER: T₃ = 4w³ − 3w is 0 at w = cos(π/6) and −1 at w = 0.5]', () => {
    // Over 0.5 .. 0.8 MHz the gain runs from the ripple's bottom (T₃ = −1) up towards its top.
    const q = only(`${LADDER}require b ripple <= 0.5 dB over 500k .. 800k`);
    const t3 = (w: number) => 4 * w * w * w - 3 * w;
    const expected = 10 * Math.log10(1 + EPS2) - 10 * Math.log10(1 + EPS2 * t3(0.8) ** 2);
    expect(Math.abs(q.measured - expected)).toBeLessThan(1e-9);
  });

  it('n/a with the reason: a band past the end of the sweep, an impedance', () => {
    notApplicable(analyze(`${LADDER}sweep 1k .. 1M\nrequire b ripple <= 1 dB over 2M ..`), /range of this requirement is empty/);
    notApplicable(analyze(`${DECOUPLING}require impedance a ripple <= 1 dB over 1k .. 1M`), /impedance a is an impedance.*require its magnitude/);
  });
});

describe('minimum attenuation over a stop band', () => {
  it('the Chebyshev ladder’s stop band from 2 MHz up is attenuated at least 6.02 + 10·log10(1 + ε²·26²) dB [Chebyshev definition, T₃(2) = 26]', () => {
    const expected = -DIVIDER_DB + 10 * Math.log10(1 + EPS2 * 26 * 26);
    for (const sweep of LADDER_SWEEPS) {
      const q = only(`${LADDER}${sweep}require b min-attenuation >= 25 dB over 2M ..`);
      expect(q.status).toBe('pass');
      expect(Math.abs(q.measured - expected)).toBeLessThan(1e-9);
      expect(q.worstAt).toBe(2e6);
    }
  });

  it('a Q = 300 resonance between two sweep points is found: the band is not attenuated at f₀ [RLC-1, DER: |V_R/V_in| = 1 at f₀]', () => {
    const f0 = Math.pow(10, 3.005);
    const L = 10e-3;
    const C = 1 / Math.pow(TWO_PI * f0, 2) / L;
    const R = Math.sqrt(L / C) / 300;
    const rlc = `drive in\nL1 [in a] ${num(L)}\nC1 [a out] ${num(C)}\nR1 [out gnd] ${num(R)}\nshow out\n`;
    const r = run(`${rlc}require out min-attenuation >= 10 dB over 100 .. 10k`);
    // No sweep point comes within 10 dB of the peak.
    expect(Math.max(...Array.from(r.traces[0].magnitudeDb))).toBeLessThan(-10);
    const q = r.requirements[0];
    expect(q.status).toBe('fail');
    expect(Math.abs(q.measured)).toBeLessThan(1e-9);
    expect(rel(q.worstAt!, f0)).toBeLessThan(1e-9);
  });

  it('n/a with the reason: a trace that is zero everywhere', () => {
    notApplicable(
      analyze('drive in\nR1 [in a] 1k\nC1 [a gnd] 1u\nR2 [a out] 1k\nshow out - a\nrequire out - a min-attenuation >= 3 dB over 1k ..'),
      /zero at every frequency/,
    );
  });
});

describe('insertion loss at a frequency', () => {
  it('the Chebyshev ladder loses 6.02 + 0.5 dB at its band edge, wherever the sweep’s points are [Chebyshev definition: |2V_L/V_S| = −0.5 dB at ω = 1; LAD-2c]', () => {
    for (const sweep of LADDER_SWEEPS) {
      const q = only(`${LADDER}${sweep}require b insertion-loss <= 6.6 dB at 1M`);
      expect(q.status).toBe('pass');
      expect(Math.abs(q.measured - (RIPPLE_DB - DIVIDER_DB))).toBeLessThan(1e-9);
      expect(q.at).toBe(1e6);
      expect(q.worstAt).toBe(1e6);
    }
  });

  it('an RC low-pass loses 3.0103 dB at its corner, positive for a loss [RC1-c: 20·log10(1/√2)]', () => {
    const q = only(`drive in\nR1 [in out] 2.2k\nC1 [out gnd] 470n\nshow out\nrequire out insertion-loss <= 3 dB at 153.921608`);
    expect(q.status).toBe('fail');
    expect(Math.abs(q.measured - 3.0103)).toBeLessThan(1e-6);
  });

  it('n/a with the reason: an impedance', () => {
    notApplicable(analyze(`${DECOUPLING}require impedance a insertion-loss <= 1 dB at 1M`), /impedance a is an impedance/);
  });
});

describe('notch depth and frequency', () => {
  it('the bridged-T notch is 34.151404 dB deep at 1591.549 Hz, wherever the sweep lies [BT-a: f₀ = 1/(2πC√(R_b·R_s)); BT-b: 2R_s/(R_b + 2R_s)]', () => {
    const depth = -20 * Math.log10(2e3 / 102e3);
    const f0 = 1 / (TWO_PI * 10e-9 * Math.sqrt(100e3 * 1e3));
    for (const sweep of NOTCH_SWEEPS) {
      const r = run(`${BRIDGED_T}${sweep}require out notch-depth >= 34 dB\nrequire out notch-frequency = 1591.5 ± 0.1%`);
      const [d, f] = r.requirements;
      expect(d.status).toBe('pass');
      expect(Math.abs(d.measured - depth)).toBeLessThan(1e-9);
      expect(rel(d.worstAt!, f0)).toBeLessThan(1e-7);
      expect(f.status).toBe('pass');
      expect(rel(f.measured, f0)).toBeLessThan(1e-7);
      expect(f.unit).toBe('Hz');
    }
  });

  it('the twin-T notch is an exact null at 1/(2πRC), with a note [TT-a/b: |H(f₀)| = 0]', () => {
    for (const sweep of NOTCH_SWEEPS) {
      const r = run(`${TWIN_T}${sweep}require out notch-depth >= 60 dB\nrequire out notch-frequency = 1591.5 ± 0.1%`);
      const [d, f] = r.requirements;
      expect(d.status).toBe('pass');
      expect(d.measured).toBeGreaterThan(200);
      expect(rel(f.measured, 1 / (TWO_PI * 10e3 * 10e-9))).toBeLessThan(1e-9);
      if (d.measured === Infinity) expect(r.diagnostics.some((x) => x.line === d.line && x.code === 'requirement-infinite')).toBe(true);
    }
  });

  it('`over` picks the notch: none between 2 and 3 kHz, where the gain only rises', () => {
    notApplicable(analyze(`${BRIDGED_T}require out notch-frequency >= 1k over 2k .. 3k`), /no notch in 2 kHz .. 3 kHz/);
  });

  it('n/a with the reason: a loop gain has no passband level to measure a notch’s depth from', () => {
    notApplicable(
      analyze(`${BRIDGED_T.replace('show out', 'show loop out')}require loop notch-depth >= 20 dB`),
      /loop out is a loop gain, so it has no passband level/,
    );
  });

  it('n/a with the reason: a low-pass has no notch', () => {
    notApplicable(
      analyze('drive in\nR1 [in out] 1k\nC1 [out gnd] 100n\nshow out\nrequire out notch-depth >= 20 dB'),
      /no notch in the sweep: its lowest point there is at an end/,
    );
  });
});

describe('maximum impedance and its anti-resonance', () => {
  it('two decoupling capacitors anti-resonate where L₁ + L₂ resonates with C₁ in series with C₂, and peak at X²/(R₁ + R₂) [LC resonance formula f = 1/(2π√(LC)); parallel resonance R_p = X²/R]', () => {
    const lTotal = C_SMALL.l + C_LARGE.l;
    const cSeries = (C_SMALL.c * C_LARGE.c) / (C_SMALL.c + C_LARGE.c);
    const far = 1 / (TWO_PI * Math.sqrt(lTotal * cSeries));
    const w = TWO_PI * far;
    const x = w * C_SMALL.l - 1 / (w * C_SMALL.c);
    const peak = (x * x) / (C_SMALL.r + C_LARGE.r);
    for (const sweep of ['', 'sweep 10M .. 100M, 5/decade\n', 'sweep 1k .. 10G, 10/decade\n']) {
      const r = run(`${DECOUPLING}${sweep}require impedance a max-impedance <= 1 Ω\nrequire impedance a anti-resonance = 41M ± 5%`);
      const [m, f] = r.requirements;
      expect(m.status).toBe('fail');
      expect(m.unit).toBe('Ω');
      // The ESRs move the peak by about (R/X)² ≈ 1e-4 of itself.
      expect(rel(m.measured, peak)).toBeLessThan(1e-3);
      expect(f.status).toBe('pass');
      expect(rel(f.measured, far)).toBeLessThan(1e-4);
      expect(m.worstAt).toBe(f.measured);
    }
  });

  it('is the true highest point of |Z| near the peak [DER: Z = Z₁Z₂/(Z₁ + Z₂) of the two branches, evaluated beside the found frequency]', () => {
    const q = only(`${DECOUPLING}require impedance a max-impedance <= 1 Ω`);
    const z = (f: number): number => {
      const w = TWO_PI * f;
      const branch = (p: { c: number; l: number; r: number }) => ({ re: p.r, im: w * p.l - 1 / (w * p.c) });
      const [a, b] = [branch(C_SMALL), branch(C_LARGE)];
      const product = { re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re };
      const sum = { re: a.re + b.re, im: a.im + b.im };
      return Math.hypot(product.re, product.im) / Math.hypot(sum.re, sum.im);
    };
    expect(rel(q.measured, z(q.worstAt!))).toBeLessThan(1e-9);
    for (const step of [1e-6, 1e-4, 1e-2]) {
      expect(z(q.worstAt! * (1 + step))).toBeLessThanOrEqual(q.measured * (1 + 1e-12));
      expect(z(q.worstAt! * (1 - step))).toBeLessThanOrEqual(q.measured * (1 + 1e-12));
    }
  });

  it('n/a with the reason: one capacitor has no peak, so no max-impedance and no anti-resonance', () => {
    notApplicable(analyze('C1 [a gnd] 1u esl 1n esr 1m\nshow impedance a\nrequire impedance a max-impedance <= 1'), /no peak \(anti-resonance\)/);
    notApplicable(
      analyze('C1 [a gnd] 1u esl 1n esr 1m\nshow impedance a\nrequire impedance a anti-resonance >= 1M'),
      /no peak \(anti-resonance\) in the sweep/,
    );
  });
});

describe('group-delay variation over a band', () => {
  it('a first-order all-pass varies by τ(f₁) − τ(f₂), τ = 2RC/(1 + (ωRC)²) [DER: H = (1 − sRC)/(1 + sRC)]', () => {
    const allPass = 'drive in\nR1 [in n] 10k\nR2 [n out] 10k\nR3 [in p] 1k\nC1 [p gnd] 100n\nU1 [p n out] opamp\nshow out\n';
    const tau = (f: number) => (2 * 1e-4) / (1 + Math.pow(TWO_PI * f * 1e-4, 2));
    for (const sweep of ['', 'sweep 10 .. 100k, 4/decade\n']) {
      const q = only(`${allPass}${sweep}require out delay-variation <= 100u over 100 .. 3k`);
      expect(q.status).toBe('fail');
      expect(q.unit).toBe('s');
      expect(rel(q.measured, tau(100) - tau(3e3))).toBeLessThan(1e-9);
    }
  });

  it('the Butterworth low-pass’s delay peak is found between points: (1 − 1/√2)/ω₀ from 0 Hz to 1 kHz [DER: τ(w) = √2(1 + w²)/(1 + w⁴)/ω₀, peak 1 + 1/√2 at w² = √2 − 1; GD-3c scipy 1.707107; SK-gd τ(0) = 200 µs]', () => {
    for (const sweep of ['', 'sweep 100 .. 10k, 5/decade\n', 'sweep 0 .. 5k, 11 linear\n']) {
      const q = only(`${SALLEN_KEY}${sweep}require out delay-variation <= 50u over 0 .. 1k`);
      expect(q.status).toBe('pass');
      expect(rel(q.measured, (1 - Math.SQRT1_2) / W0_SK)).toBeLessThan(1e-7);
    }
  });

  it('n/a with the reason: a band past the end of the sweep', () => {
    notApplicable(analyze(`${SALLEN_KEY}sweep 10 .. 10k\nrequire out delay-variation <= 1m over 20k ..`), /range of this requirement is empty/);
  });
});

describe('a range measure is never better than a 10× finer sweep sees', { timeout: 120_000 }, () => {
  it('ripple, delay variation and minimum attenuation over a random band of a random RLC', () => {
    fc.assert(
      fc.property(network, fc.double({ min: 0.05, max: 0.5, noNaN: true }), ({ body, f0 }, width) => {
        const from = f0 * Math.pow(10, -width);
        const to = f0 * Math.pow(10, width * 1.3);
        const range = `over ${num(from)} .. ${num(to)}`;
        const reqs = `require out ripple <= 0 dB ${range}\nrequire out delay-variation <= 0 ${range}\nrequire out min-attenuation >= 400 dB ${range}\n`;
        const coarse = run(`${body}sweep ${num(f0 / 100)} .. ${num(f0 * 100)}, 10/decade\n${reqs}`);
        const fine = run(`${body}sweep ${num(f0 / 100)} .. ${num(f0 * 100)}, 100/decade\n${reqs}`);
        const t = fine.traces[0];
        const inside = Array.from(fine.frequencies.keys()).filter((k) => fine.frequencies[k] >= from && fine.frequencies[k] <= to);
        const spread = (values: number[]) => Math.max(...values) - Math.min(...values);
        const gains = inside.map((k) => t.magnitudeDb[k]);
        const delays = inside.map((k) => t.groupDelay[k]);
        const [ripple, variation, attenuation] = coarse.requirements.map((q) => q.measured);
        expect(ripple).toBeGreaterThanOrEqual(spread(gains) - 1e-9);
        expect(variation).toBeGreaterThanOrEqual(spread(delays) * (1 - 1e-9));
        expect(attenuation).toBeLessThanOrEqual(-Math.max(...gains) + 1e-9);
      }),
      { numRuns: 40 },
    );
  });

  it('delay variation finds a delay peak in the last interval of its band, where no sweep point stands out (found by the property above)', () => {
    // A series RLC band-pass (Q = 1 at f0 = 503.29 Hz) whose band ends just past the delay
    // peak: the coarse sweep's points rise all the way to the band's end.
    const body = 'drive in\nL1 [in a] 0.1\nC1 [a out] 1u\nR1 [out gnd] 316.22776601683796\nshow out\n';
    const f0 = 503.2921210448704;
    const range = `over ${num(f0 * 10 ** -0.0923)} .. ${num(f0 * 10 ** (0.0923 * 1.3))}`;
    const coarse = run(`${body}sweep ${num(f0 / 100)} .. ${num(f0 * 100)}, 10/decade\nrequire out delay-variation <= 0 ${range}\n`);
    // The independent value: a sweep 100 times finer (1 000 points a decade).
    const fine = run(`${body}sweep ${num(f0 / 100)} .. ${num(f0 * 100)}, 1000/decade\nrequire out delay-variation <= 0 ${range}\n`);
    const [from, to] = [f0 * 10 ** -0.0923, f0 * 10 ** (0.0923 * 1.3)];
    const delays = Array.from(fine.frequencies.keys())
      .filter((k) => fine.frequencies[k] >= from && fine.frequencies[k] <= to)
      .map((k) => fine.traces[0].groupDelay[k]);
    const spread = Math.max(...delays) - Math.min(...delays);
    expect(coarse.requirements[0].measured).toBeGreaterThanOrEqual(spread * (1 - 1e-9));
    // And it does not depend on the sweep: the fine sweep's own refined value is the same.
    expect(coarse.requirements[0].measured).toBeCloseTo(fine.requirements[0].measured!, 9);
  });
});

describe('a notch on a sweep point', () => {
  it('is never read shallower than the sweep point itself, and a flat response has no notch [TT-a: the twin-T null at 1/(2πRC) on the grid]', () => {
    const f0 = 1 / (TWO_PI * 10e3 * 10e-9);
    const fs = [100, 500, 1000, f0, 2000, 5000, 10000].map((f) => f.toPrecision(17)).join(', ');
    const r = run(`${TWIN_T}sweep at ${fs}\nrequire out notch-depth >= 60 dB\nrequire out notch-frequency = 1591.5 ± 0.1%`);
    const [depth, frequency] = r.requirements;
    expect(depth.measured).toBeGreaterThanOrEqual(-r.traces[0].magnitudeDb[3]);
    expect(rel(frequency.measured, f0)).toBeLessThan(1e-9);
    notApplicable(analyze('drive in\nR1 [in out] 1k\nR2 [out gnd] 1k\nshow out\nrequire out notch-depth >= 1 dB'), /no notch in the sweep/);
  });
});
