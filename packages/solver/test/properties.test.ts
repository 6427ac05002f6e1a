/** Properties of passive networks that hold for any element values (fast-check). */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { analyze } from '../src/analyze.js';

const value = (lo: number, hi: number): fc.Arbitrary<number> => fc.double({ min: lo, max: hi, noNaN: true }).map((x) => Math.pow(10, x));
const num = (x: number): string => x.toPrecision(17);

describe('passive networks', { timeout: 30_000 }, () => {
  it('any passive RC ladder driven at one end has |H| ≤ 1 at its other end', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ r: value(-1, 9), c: value(-15, -3), series: fc.boolean() }), { minLength: 1, maxLength: 8 }),
        value(-2, 8),
        (sections, f) => {
          const lines = ['drive n0'];
          sections.forEach((s, k) => {
            // Series R with shunt C, or series C with shunt R: low-pass or high-pass sections.
            if (s.series) lines.push(`R${k} [n${k} n${k + 1}] ${num(s.r)}`, `C${k} [n${k + 1} gnd] ${num(s.c)}`);
            else lines.push(`C${k} [n${k} n${k + 1}] ${num(s.c)}`, `R${k} [n${k + 1} gnd] ${num(s.r)}`);
          });
          lines.push(`show n${sections.length}`, `sweep at ${num(f)}`);
          const r = analyze(lines.join('\n'));
          expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
          const m = r.traces[0].magnitude[0];
          expect(Number.isFinite(m)).toBe(true);
          expect(m).toBeLessThanOrEqual(1 + 1e-12);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('reciprocity: the transfer impedance Z12 equals Z21 in any network of R, L, C and coupled inductors', () => {
    const part = fc.record({
      kind: fc.constantFrom('R', 'C', 'L'),
      a: fc.integer({ min: 0, max: 6 }),
      b: fc.integer({ min: 0, max: 6 }),
      v: fc.double({ min: 0, max: 1, noNaN: true }),
    });
    fc.assert(
      fc.property(fc.array(part, { minLength: 2, maxLength: 14 }), fc.double({ min: 0.1, max: 0.95, noNaN: true }), value(0, 6), (parts, k, f) => {
        const lines: string[] = [];
        // A resistor tree ties nodes 1..6 to ground, so every node has a path.
        for (let n = 1; n <= 6; n++) lines.push(`R${n}t [n${n} ${n === 1 ? 'gnd' : `n${n - 1}`}] ${100 * n}`);
        const node = (i: number): string => (i === 0 ? 'gnd' : `n${i}`);
        const inductors: string[] = [];
        parts.forEach((p, i) => {
          const b = p.a === p.b ? (p.b + 1) % 7 : p.b;
          if (p.kind === 'R') lines.push(`R${i} [${node(p.a)} ${node(b)}] ${num(Math.pow(10, 1 + 4 * p.v))}`);
          else if (p.kind === 'C') lines.push(`C${i} [${node(p.a)} ${node(b)}] ${num(Math.pow(10, -9 + 3 * p.v))}`);
          else {
            lines.push(`L${i} [${node(p.a)} ${node(b)}] ${num(Math.pow(10, -4 + 2 * p.v))} dcr 1`);
            inductors.push(`L${i}`);
          }
        });
        if (inductors.length >= 2) lines.push(`couple ${inductors[0]} ${inductors[1]} ${num(k)}`);
        const body = lines.join('\n');
        const z = (from: number, to: number): { re: number; im: number } => {
          const r = analyze(`${body}\ndrive current [n${from} gnd] 1\nshow n${to}\nsweep at ${num(f)}`);
          expect(r.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
          return { re: r.traces[0].re[0], im: r.traces[0].im[0] };
        };
        const z12 = z(2, 5);
        const z21 = z(5, 2);
        expect(Math.hypot(z12.re - z21.re, z12.im - z21.im)).toBeLessThanOrEqual(1e-9 * Math.hypot(z12.re, z12.im) + 1e-300);
      }),
      { numRuns: 100 },
    );
  });
});
