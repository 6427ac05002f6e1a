/**
 * Properties of the numbers a designer signs (fast-check): a range check's worst value is
 * never better than what a 10× finer sweep sees, and a trace's readouts do not move when
 * the sweep widens past its features.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyze } from '../src/analyze.js';
import type { Result } from '../src/result.js';
import { network, num } from './helpers/networks.js';

function solved(text: string): Result {
  const r = analyze(text);
  expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  return r;
}

describe('sign-off properties', { timeout: 120_000 }, () => {
  it("a range check's worst value is never better than a 10× finer sweep's worst", () => {
    fc.assert(
      fc.property(network, fc.double({ min: 0.05, max: 0.5, noNaN: true }), ({ body, f0 }, width) => {
        const from = f0 * Math.pow(10, -width);
        const to = f0 * Math.pow(10, width * 1.3);
        const range = `over ${num(from)} .. ${num(to)}`;
        const reqs = `require out gain <= -400 dB ${range}\nrequire out gain >= 400 dB ${range}\nrequire out phase <= -400 ${range}\nrequire out phase >= 400 ${range}\n`;
        const coarse = solved(`${body}sweep ${num(f0 / 100)} .. ${num(f0 * 100)}, 10/decade\n${reqs}`);
        const fine = solved(`${body}sweep ${num(f0 / 100)} .. ${num(f0 * 100)}, 100/decade\n${reqs}`);
        const t = fine.traces[0];
        const inside = Array.from(fine.frequencies.keys()).filter((k) => fine.frequencies[k] >= from && fine.frequencies[k] <= to);
        const gains = inside.map((k) => t.magnitudeDb[k]);
        const phases = inside.map((k) => t.phaseDeg[k]);
        const [maxGain, minGain, maxPhase, minPhase] = coarse.requirements.map((q) => q.measured);
        expect(maxGain).toBeGreaterThanOrEqual(Math.max(...gains) - 1e-9);
        expect(minGain).toBeLessThanOrEqual(Math.min(...gains) + 1e-9);
        expect(maxPhase).toBeGreaterThanOrEqual(Math.max(...phases) - 1e-9);
        expect(minPhase).toBeLessThanOrEqual(Math.min(...phases) + 1e-9);
      }),
      { numRuns: 40 },
    );
  });

  it('the readouts of a trace do not change when the sweep widens past its features', () => {
    fc.assert(
      fc.property(network, fc.double({ min: 1, max: 4, noNaN: true }), ({ body, f0 }, extra) => {
        const narrow = solved(`${body}sweep ${num(f0 / 1e3)} .. ${num(f0 * 1e3)}\n`);
        const wide = solved(`${body}sweep ${num(f0 / Math.pow(10, 3 + extra))} .. ${num(f0 * Math.pow(10, 3 + extra))}\n`);
        expect(wide.readouts.map((r) => r.name)).toEqual(narrow.readouts.map((r) => r.name));
        narrow.readouts.forEach((r, k) => {
          const w = wide.readouts[k];
          expect(Math.abs(w.value - r.value), r.name).toBeLessThanOrEqual(1e-7 * Math.abs(r.value) + 1e-9);
          if (r.at !== null) expect(Math.abs(w.at! - r.at)).toBeLessThanOrEqual(1e-7 * r.at);
        });
      }),
      { numRuns: 40 },
    );
  });

  it('no random network shows a non-finite number without a diagnostic on its line (a gain margin of +∞ is a value)', () => {
    const part = fc.record({
      kind: fc.constantFrom('R', 'C', 'L'),
      a: fc.integer({ min: 0, max: 5 }),
      b: fc.integer({ min: 0, max: 5 }),
      v: fc.double({ min: 0, max: 1, noNaN: true }),
    });
    const node = (i: number): string => (i === 0 ? 'gnd' : i === 1 ? 'in' : `n${i}`);
    const shows = ['n3', 'n4 - n5', 'n2 / n3', 'impedance n4', 'loop n5', 'n2 - n2b'];
    fc.assert(
      fc.property(fc.array(part, { minLength: 1, maxLength: 10 }), fc.integer({ min: -2, max: 6 }), fc.integer({ min: 1, max: 8 }), (parts, start, decades) => {
        const lines = ['drive in', 'R90 [in n2] 1k', 'R91 [n2 n3] 1k', 'R92 [n3 n4] 1k', 'R93 [n4 n5] 1k', 'R94 [n5 gnd] 1k', 'R95 [n2b n2] 1k'];
        parts.forEach((p, i) => {
          const b = p.a === p.b ? (p.b + 1) % 6 : p.b;
          const value = p.kind === 'R' ? Math.pow(10, 6 * p.v) : p.kind === 'C' ? Math.pow(10, -12 + 6 * p.v) : Math.pow(10, -6 + 5 * p.v);
          lines.push(`${p.kind}${i + 1} [${node(p.a)} ${node(b)}] ${num(value)}`);
        });
        const first = lines.length + 1;
        lines.push(...shows.map((x) => `show ${x}`), `sweep ${num(Math.pow(10, start))} .. ${num(Math.pow(10, start + decades))}, 20/decade`);
        lines.push('require n3 gain <= 0 dB', 'require "loop n5" gain-margin >= 0 dB', 'require n3 peak <= 100 dB');
        const r = analyze(lines.join('\n'));
        expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
        const said = (line: number): boolean => r.diagnostics.some((d) => d.line === line || d.code === 'singular');
        for (const x of r.readouts)
          expect(Number.isFinite(x.value) || (x.name === 'gain-margin' && x.value === Infinity), `${x.trace} ${x.name} ${x.value}`).toBe(true);
        r.traces.forEach((t, k) => {
          if (Array.from(t.magnitudeDb).some((x) => !Number.isFinite(x))) expect(said(first + k), t.label).toBe(true);
        });
        for (const q of r.requirements) if (!Number.isFinite(q.measured)) expect(said(q.line) || q.measured === Infinity, q.text).toBe(true);
      }),
      { numRuns: 60 },
    );
  });
});
