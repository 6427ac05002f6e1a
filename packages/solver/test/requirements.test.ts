/** `require` lines: pointwise measures with exact range ends, single-number measures, and what cannot be checked yet. */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { rel } from './helpers/cell.js';

const RC = `
drive in
R1 [in out] 2.2k
C1 [out gnd] 470n
show out
show "z" impedance out
sweep 100 .. 100k, 10/decade
`;
/** RC1-b [DER]: f_c = 1/(2πRC). */
const FC = 1 / (2 * Math.PI * 2.2e3 * 470e-9);

function check(lines: string) {
  const r = analyze(RC + lines);
  expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  return r;
}

describe('pointwise requirements', () => {
  it('are checked at the exact ends of the range, not at the nearest grid point', () => {
    const r = check('require out gain >= -3.0103 dB over 100 .. 153.9216\nrequire out gain >= -3 dB over 100 .. 200');
    const [a, b] = r.requirements;
    expect(a.status).toBe('pass');
    expect(a.worstAt).toBe(153.9216);
    expect(a.measured).toBeCloseTo(-10 * Math.log10(1 + Math.pow(153.9216 / FC, 2)), 12);
    expect(b.status).toBe('fail');
    expect(b.worstAt).toBe(200);
    expect(b.measured).toBeCloseTo(-10 * Math.log10(1 + Math.pow(200 / FC, 2)), 12);
    expect(b.line).toBe(9);
    expect(b.text).toBe('require out gain >= -3 dB over 100 .. 200');
    expect(b.unit).toBe('dB');
  });

  it('a range end outside the sweep is still solved exactly', () => {
    const r = check('require out gain >= -0.005 dB over 1 .. 5');
    expect(r.requirements[0].status).toBe('pass');
    expect(r.requirements[0].worstAt).toBe(5);
  });

  it('`at F` checks one exact frequency; phase is the unwrapped phase, in degrees [RC1-d]', () => {
    const r = check(`require out phase = -45 ± 1e-6 at ${FC.toPrecision(17)}`);
    expect(r.requirements[0].status).toBe('pass');
    expect(Math.abs(r.requirements[0].measured - -45)).toBeLessThan(1e-9);
  });

  it('delay is the group delay in s, magnitude is linear in the trace unit [GD-1]', () => {
    const r = check('require out delay <= 1.034ms over 100 ..\nrequire z magnitude <= 100 over 10k ..');
    const [d, z] = r.requirements;
    expect(d.status).toBe('pass');
    expect(d.worstAt).toBe(100);
    expect(rel(d.measured, 1.034e-3 / (1 + Math.pow(100 / FC, 2)))).toBeLessThan(1e-12);
    expect(z.status).toBe('pass');
    expect(z.unit).toBe('Ω');
    expect(rel(z.measured, 1 / Math.hypot(1 / 2.2e3, 2 * Math.PI * 1e4 * 470e-9))).toBeLessThan(1e-12);
  });

  it('`=` passes within an absolute or a relative tolerance, and reports the worst deviation', () => {
    const r = check('require out gain = 0 ± 0.05 dB over 100 .. 110\nrequire out gain = -0.01 ± 10% over 100 .. 110');
    expect(r.requirements[0].status).toBe('fail');
    expect(r.requirements[0].worstAt).toBe(110);
    expect(r.requirements[1].status).toBe('fail');
  });
});

describe('single-number requirements', () => {
  it('corner and peak compare the readout, with no worstAt [RC1-b]', () => {
    const r = check('require out corner = 153.92 ± 0.1%\nrequire out peak <= 0.1 dB\nrequire out corner >= 1k');
    expect(r.requirements[0].status).toBe('pass');
    expect(rel(r.requirements[0].measured, FC)).toBeLessThan(1e-9);
    expect(r.requirements[0].worstAt).toBeNull();
    expect(r.requirements[1].status).toBe('pass');
    expect(r.requirements[2].status).toBe('fail');
  });

  it('loop measures: crossover, phase-margin, gain-margin [OA-PM, SCIPY]', () => {
    const r = analyze(`
drive in
A1 [a gnd in gnd] vgain 100k
R1 [a b] 1k
C1 [b gnd] (1/(2*pi*10*1k))
A2 [c gnd b gnd] vgain 1
R2 [c d] 1k
C2 [d gnd] (1/(2*pi*1M*1k))
show loop d
sweep 1 .. 100M
require loop d phase-margin >= 45 deg
require loop d crossover = 786.1514k ± 1e-5%
require loop d gain-margin >= 10 dB
`);
    expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(r.requirements.map((q) => q.status)).toEqual(['pass', 'pass', 'pass']);
    expect(Math.abs(r.requirements[0].measured - 51.82802)).toBeLessThan(1e-4);
    expect(r.requirements[2].measured).toBe(Infinity);
  });

  it('a band-pass trace has no single corner: not applicable, with a warning saying why in words the user can write', () => {
    const r = analyze('drive in\nL1 [in a] 10m\nC1 [a b] 1u\nR1 [b gnd] 10\nshow b\nsweep 100 .. 100k\nrequire b corner >= 1k');
    expect(r.requirements[0].status).toBe('not-applicable');
    expect(r.diagnostics.find((d) => d.line === 7 && d.severity === 'warning')!.message).toContain('a lower and an upper corner');
  });
});

describe('what a requirement result carries', () => {
  it('the trace, measure, operator, limit, band and range it was read into, ends resolved to the sweep', () => {
    const r = check('require out gain >= -3 dB over 100 .. 1k\nrequire out gain <= -20 dB over 10k ..\nrequire z magnitude <= 100');
    const [a, b, c] = r.requirements;
    expect(a).toMatchObject({ trace: 'out', measure: 'gain', op: '>=', limit: -3, tolerance: null, unit: 'dB' });
    expect(a).toMatchObject({ band: { low: -3, high: null }, over: { from: 100, to: 1000 }, at: null });
    expect(b).toMatchObject({ op: '<=', band: { low: null, high: -20 }, over: { from: 10_000, to: r.frequencies[r.frequencies.length - 1] } });
    expect(c).toMatchObject({ trace: 'z', unit: 'Ω', over: { from: r.frequencies[0], to: r.frequencies[r.frequencies.length - 1] } });
  });

  it('a limit written as a parameter or an expression is carried evaluated, with the band it gives', () => {
    const r = check('let fc = 150\nrequire out corner = fc ± 2%\nrequire out gain >= (-fc/50) over 100 .. 200');
    const [corner, gain] = r.requirements;
    expect(corner).toMatchObject({ measure: 'corner', op: '=', limit: 150, tolerance: { relative: 0.02 }, over: null, at: null, unit: 'Hz' });
    // 150 Hz ± 2 % is 147 Hz .. 153 Hz; the corner at 153.92 Hz [RC1-b] lies above it.
    expect(corner.band.low).toBeCloseTo(147, 12);
    expect(corner.band.high).toBeCloseTo(153, 12);
    expect(corner.status).toBe('fail');
    expect(gain).toMatchObject({ limit: -3, band: { low: -3, high: null }, over: { from: 100, to: 200 } });
  });

  it('the status is whether the measured value lies in the band carried, at the edge too', () => {
    const r = check(`require out corner = ${FC.toPrecision(17)} ± 1e-9%\nrequire out corner = 153.92 ± 1e-4%`);
    for (const q of r.requirements) {
      expect(q.tolerance).not.toBeNull();
      const inside = q.measured >= q.band.low! && q.measured <= q.band.high!;
      expect(q.status).toBe(inside ? 'pass' : 'fail');
    }
    // 153.92 Hz is 1e-5 (relative) away from f_c = 153.9216 Hz [RC1-b], outside ± 1e-6.
    expect(r.requirements.map((q) => q.status)).toEqual(['pass', 'fail']);
  });

  it('`at F` carries the frequency and an absolute tolerance in the measure’s unit', () => {
    const r = check('require out phase = -45 ± 1 deg at 150');
    expect(r.requirements[0]).toMatchObject({ measure: 'phase', at: 150, over: null, worstAt: 150 });
    expect(r.requirements[0]).toMatchObject({ tolerance: { absolute: 1 }, band: { low: -46, high: -44 }, unit: 'deg' });
  });

  it('a requirement that cannot be checked still carries what it was read into', () => {
    const r = analyze('drive in\nL1 [in a] 10m\nC1 [a b] 1u\nR1 [b gnd] 10\nshow b\nsweep 100 .. 100k\nrequire b corner >= 1k');
    expect(r.requirements[0]).toMatchObject({ status: 'not-applicable', trace: 'b', measure: 'corner', limit: 1000, worstAt: null });
    expect(r.requirements[0]).toMatchObject({ band: { low: 1000, high: null }, unit: 'Hz' });
  });
});
