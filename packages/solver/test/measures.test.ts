/**
 * Every readout a trace shows can be required, and the measures a sign-off needs. Each value
 * is checked against a closed form or a table of reference-values.md (the source named
 * beside it), again with the sweep moved or widened to show it does not change, and each
 * measure that cannot be computed reads n/a with its reason.
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import type { RequirementResult, Result } from '../src/result.js';
import { readout, rel, run } from './helpers/cell.js';

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
