/** The ideal transformer `T1 [p+ p- s+ s-] turns N`: V(s) = N·V(p), and a load Z on the secondary looks like Z/N² from the primary. */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { point, rel, run, sweepAt } from './helpers/cell.js';

const TWO_PI = 2 * Math.PI;
const fs = [0, 10, 1e3, 1e6];

describe('an ideal transformer against the closed forms [ideal transformer: v2 = n·v1, i1 = n·i2, Z_in = Z_L/n²; DER]', () => {
  for (const n of [2, 0.1, 10]) {
    it(`turns ${n}: the secondary voltage is ${n}× the primary's at every frequency, DC included, and the primary current ${n}× the secondary's`, () => {
      const r = run(`drive p\nR1 [p gnd] 1k\nT1 [p gnd s gnd] turns ${n}\nR2 [s gnd] 330\nshow s\nshow current R2\nshow current R1\n${sweepAt(...fs)}\n`);
      for (const f of fs) {
        const s = point(r, 's', f);
        expect(rel(s.re, n)).toBeLessThan(1e-13);
        expect(Math.abs(s.im)).toBeLessThan(1e-13 * n);
        // The drive's own current into p is I(R1) plus the primary's n·I(R2); I(R2) = n/330.
        expect(rel(point(r, 'current R2', f).re, n / 330)).toBeLessThan(1e-13);
      }
    });

    it(`turns ${n}: a resistor on the secondary is R/n² from the primary, a capacitor C·n²`, () => {
      const r = run(
        `T1 [p gnd s gnd] turns ${n}\nR2 [s gnd] 330\nT2 [q gnd t gnd] turns ${n}\nC1 [t gnd] 1u\nshow impedance p\nshow impedance q\n${sweepAt(...fs.slice(1))}\n`,
      );
      for (const f of fs.slice(1)) {
        expect(rel(point(r, 'impedance p', f).mag, 330 / n ** 2)).toBeLessThan(1e-13);
        const zc = point(r, 'impedance q', f);
        expect(rel(zc.mag, 1 / (TWO_PI * f * 1e-6 * n ** 2))).toBeLessThan(1e-12);
        expect(zc.deg).toBeCloseTo(-90, 9);
      }
    });
  }

  it('a 50 Ω source matched to a 200 Ω load by turns 2 delivers half the drive to the primary and the full drive to the load [maximum power transfer; DER]', () => {
    const r = run(`drive in\nR1 [in p] 50\nT1 [p gnd s gnd] turns 2\nR2 [s gnd] 200\nshow p\nshow s\n${sweepAt(1e3)}\n`);
    expect(rel(point(r, 'p', 1e3).mag, 0.5)).toBeLessThan(1e-13);
    expect(rel(point(r, 's', 1e3).mag, 1)).toBeLessThan(1e-13);
  });

  it('swapping the secondary’s nodes reverses its phase; a floating winding pair gets its own reference through the other side', () => {
    const r = run(`drive p\nT1 [p gnd a b] turns 3\nR1 [a b] 1k\nR2 [b gnd] 1k\nshow a - b\nshow b - a\n${sweepAt(100)}\n`);
    expect(rel(point(r, 'a - b', 100).re, 3)).toBeLessThan(1e-13);
    expect(rel(point(r, 'b - a', 100).re, -3)).toBeLessThan(1e-13);
  });
});

describe('what a transformer line may not say', () => {
  const errors = (line: string) =>
    analyze(`drive p\nR1 [p gnd] 1k\n${line}\nR2 [s gnd] 1k\nshow s\n`)
      .diagnostics.filter((d) => d.severity === 'error')
      .map((d) => ({ code: d.code, column: d.column, endColumn: d.endColumn, fix: d.fix?.replacement }));

  it('each problem positioned on its words', () => {
    expect(errors('T1 [p gnd s] turns 2')).toEqual([{ code: 'node-count', column: 4, endColumn: 13, fix: undefined }]);
    expect(errors('T1 [p gnd s gnd]')).toEqual([{ code: 'missing-turns', column: 4, endColumn: 17, fix: undefined }]);
    expect(errors('T1 [p gnd s gnd] turn 2')).toEqual([{ code: 'missing-turns', column: 18, endColumn: 22, fix: 'turns' }]);
    expect(errors('T1 [p gnd s gnd] turns')).toEqual([{ code: 'missing-value', column: 18, endColumn: 23, fix: undefined }]);
    expect(errors('T1 [p gnd s gnd] turns 0')).toEqual([{ code: 'value-out-of-range', column: 24, endColumn: 25, fix: undefined }]);
    expect(errors('T1 [p gnd s gnd] turns 2Ω')).toEqual([{ code: 'unit-mismatch', column: 25, endColumn: 26, fix: undefined }]);
    expect(errors('T1 [p gnd s s] turns 2')).toEqual([{ code: 'shorted-part', column: 4, endColumn: 15, fix: undefined }]);
    expect(errors('T1 [p gnd s gnd] turns 2 3')).toEqual([{ code: 'unexpected-token', column: 26, endColumn: 27, fix: undefined }]);
  });

  it('a secondary with no path to gnd is reported, not solved into a singular matrix', () => {
    const codes = analyze('drive p\nR1 [p gnd] 1k\nT1 [p gnd a b] turns 2\nR2 [a b] 1k\nshow a - b\n').diagnostics.map((d) => d.code);
    expect(codes).toContain('no-path-to-ground');
  });
});
