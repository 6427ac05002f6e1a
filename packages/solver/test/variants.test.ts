/**
 * `vary`: each variant is exactly the cell with the parameter's value written on its `let`
 * line; requirements are checked per variant and pass only when every variant passes; bad
 * `vary` lines get clear messages; the variants together keep to the point limit.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { compile } from '../src/compile.js';
import { parse } from '../src/parser/index.js';
import { toCsv, toJson, toText } from '../src/output.js';
import type { Diagnostic, RequirementResult, Result } from '../src/result.js';

/** An RC low-pass whose R and C are parameters; `extra` is added at the end. */
const rc = (r: string, c: string, extra: string) => `let R = ${r}
let C = ${c}
drive in
R1 [in out] R
C1 [out gnd] C
show out
${extra}`;

const errors = (r: { diagnostics: Diagnostic[] }) => r.diagnostics.filter((d) => d.severity === 'error');
const withoutVariants = (q: RequirementResult) => {
  const { variants: _, ...rest } = q;
  return rest;
};

/** Everything a variant carries, compared with the same cell solved with the value written in. */
function expectSameAsWritten(variant: NonNullable<Result['variants']>[number], alone: Result): void {
  expect(errors(alone)).toEqual([]);
  expect(Array.from(variant.frequencies)).toEqual(Array.from(alone.frequencies));
  expect(variant.traces.length).toBe(alone.traces.length);
  variant.traces.forEach((t, i) => {
    const a = alone.traces[i];
    expect(t.label).toBe(a.label);
    for (const key of ['re', 'im', 'magnitudeDb', 'phaseDeg', 'groupDelay'] as const) expect(Array.from(t[key])).toEqual(Array.from(a[key]));
  });
  expect(variant.readouts).toEqual(alone.readouts);
  expect(variant.requirements).toEqual(alone.requirements);
  expect(variant.steps.map((st) => [st.label, Array.from(st.times), Array.from(st.values)])).toEqual(
    alone.steps.map((st) => [st.label, Array.from(st.times), Array.from(st.values)]),
  );
}

describe('each variant is the cell with the value written in', () => {
  it('a list of values, over a written sweep', () => {
    const text = rc('1k', '100n', 'sweep 10 .. 100k, 50/decade\nrequire out gain >= -3 dB over 10 .. 100\nvary R over 470, 4k7, 47k');
    const result = analyze(text);
    expect(errors(result)).toEqual([]);
    expect(result.variants?.map((v) => v.label)).toEqual(['R = 470', 'R = 4.7k', 'R = 47k']);
    ['470', '4k7', '47k'].forEach((written, i) => {
      expectSameAsWritten(result.variants![i], analyze(rc(written, '100n', 'sweep 10 .. 100k, 50/decade\nrequire out gain >= -3 dB over 10 .. 100')));
    });
  });

  it('a range of values over the default sweep, each variant with its own sweep', () => {
    const result = analyze(rc('1k', '1n', 'vary C over 1n .. 10u, 3 values'));
    expect(errors(result)).toEqual([]);
    const values = result.variants!.map((v) => v.value);
    expect(values[1] / values[0]).toBeCloseTo(100, 10);
    expect(values[2] / values[1]).toBeCloseTo(100, 10);
    values.forEach((value, i) => expectSameAsWritten(result.variants![i], analyze(rc('1k', String(value), ''))));
    // The 10 µF variant's corner is at 15.9 Hz: its own default sweep reaches lower than the 1 nF variant's.
    expect(result.variants![2].frequencies[0]).toBeLessThan(result.variants![0].frequencies[0]);
  });

  it('step responses too: each variant has its own, and an RC’s t63 is its RC (the time constant, common practice)', () => {
    const extra = 'show step out\ntime 0 .. 5m, 500 points';
    const result = analyze(rc('1k', '100n', `${extra}\nvary R over 1k, 10k`));
    expect(errors(result)).toEqual([]);
    expect(result.variants!.map((v) => v.steps.map((st) => st.label))).toEqual([['step out'], ['step out']]);
    ['1k', '10k'].forEach((written, i) => expectSameAsWritten(result.variants![i], analyze(rc(written, '100n', extra))));
    const t63 = result.variants!.map((v) => v.readouts.find((x) => x.name === 't63')!.value);
    expect(t63[0]).toBeCloseTo(100e-6, 9);
    expect(t63[1]).toBeCloseTo(1e-3, 8);
  });

  it('a parameter that others are computed from: they follow it', () => {
    const cell = (f0: string, extra: string) => `let f0 = ${f0} Hz
let R = 10k
let C = 1/(2*pi*f0*R)
drive in
R1 [in out] R
C1 [out gnd] C
show out
sweep 1 .. 1M
${extra}`;
    const result = analyze(cell('1k', 'vary f0 over 100 Hz, 1k, 10 kHz'));
    expect(errors(result)).toEqual([]);
    expect(result.variants!.map((v) => v.label)).toEqual(['f0 = 100 Hz', 'f0 = 1 kHz', 'f0 = 10 kHz']);
    ['100', '1k', '10k'].forEach((f0, i) => expectSameAsWritten(result.variants![i], analyze(cell(f0, ''))));
  });

  it('the top-level traces and readouts are the first variant’s; a cell without vary has no variants at all', () => {
    const result = analyze(rc('1k', '100n', 'vary R over 2k, 20k'));
    expect(result.traces).toBe(result.variants![0].traces);
    expect(result.readouts).toBe(result.variants![0].readouts);
    expect(Array.from(result.frequencies)).toEqual(Array.from(result.variants![0].frequencies));
    const plain = analyze(rc('1k', '100n', 'require out corner >= 1k'));
    expect('variants' in plain).toBe(false);
    expect('variants' in plain.requirements[0]).toBe(false);
  });
});

describe('the corner of each variant of an RC low-pass', () => {
  it('is 1/(2πRC) for every C of a range (first-order RC corner, common practice)', () => {
    const result = analyze(rc('10k', '1n', 'vary C over 1n .. 100n, 5 values'));
    expect(errors(result)).toEqual([]);
    const variants = result.variants!;
    expect(variants).toHaveLength(5);
    variants.forEach((v, k) => {
      // Equal ratios: 1n, 3.16n, 10n, 31.6n, 100n.
      expect(v.value / (1e-9 * 10 ** (k / 2))).toBeCloseTo(1, 12);
      const corner = v.readouts.find((r) => r.trace === 'out' && r.name === 'corner');
      const expected = 1 / (2 * Math.PI * 10e3 * v.value);
      expect(Math.abs((corner?.value ?? NaN) / expected - 1)).toBeLessThan(1e-6);
    });
  });

  it('evenly spaced values with linear', () => {
    const result = analyze(rc('1k', '1n', 'vary R over 1k .. 5k, 5 values linear'));
    expect(result.variants!.map((v) => v.value)).toEqual([1000, 2000, 3000, 4000, 5000]);
  });
});

describe('requirements over variants', () => {
  // Corners: R = 1k → 1.59 kHz, 10k → 159 Hz, 100k → 15.9 Hz (C = 100 nF).
  const text = rc('1k', '100n', 'vary R over 1k, 10k, 100k\nrequire out corner >= 100 Hz\nrequire out gain >= -80 dB at 1k');

  it('each variant has its own result; a requirement fails when any variant fails, naming those that fail', () => {
    const result = analyze(text);
    expect(errors(result)).toEqual([]);
    expect(result.variants!.map((v) => v.requirements[0].status)).toEqual(['pass', 'pass', 'fail']);
    const corner = result.requirements[0];
    expect(corner.status).toBe('fail');
    expect(corner.variants).toEqual({ worst: 2, failed: [2] });
    expect(withoutVariants(corner)).toEqual(result.variants![2].requirements[0]);
  });

  it('a requirement every variant passes shows the variant closest to its limit', () => {
    const result = analyze(text);
    const gain = result.requirements[1];
    expect(gain.status).toBe('pass');
    expect(gain.variants?.failed).toEqual([]);
    // The lowest gain at 1 kHz is the 100k variant's (its corner is lowest).
    expect(gain.variants?.worst).toBe(2);
    expect(gain.measured).toBe(Math.min(...result.variants!.map((v) => v.requirements[1].measured)));
  });

  it('the command line’s text names the variant measured and those that fail', () => {
    const result = analyze(text);
    const out = toText(result);
    expect(out).toContain('fail  line 8: require out corner >= 100 Hz  (measured 15.92 Hz with R = 100k); fail with R = 100k');
    expect(out).toMatch(/^ {2}corner +1\.592 kHz +159\.2 Hz +15\.92 Hz$/m);
  });

  it('JSON carries every variant, and CSV has one column per variant and quantity', () => {
    const result = analyze(text);
    const json = JSON.parse(toJson(result)) as { variants: { label: string; value: number; traces: unknown[] }[]; requirements: { variants: unknown }[] };
    expect(json.variants.map((v) => [v.label, v.value, v.traces.length])).toEqual([
      ['R = 1k', 1000, 1],
      ['R = 10k', 10000, 1],
      ['R = 100k', 100000, 1],
    ]);
    expect(json.requirements[0].variants).toEqual({ worst: 2, failed: [2] });
    const [header, first] = toCsv(result).split('\n');
    expect(header.split(',')).toContain('out · R = 10k · gain (dB)');
    expect(header.split(',')).toHaveLength(1 + 3 * 3);
    // The 100k variant's default sweep starts a decade lower: the others are empty there.
    expect(first.split(',').slice(1, 4)).toEqual(['', '', '']);
  });
});

describe('messages for bad vary lines', () => {
  const cell = (vary: string) => `let Rload = 1kΩ
drive in
R1 [in out] 1k
R2 [out gnd] Rload
block pad [a b] (Rs = 1k)
  R1 [a b] Rs
end
use pad as B1 [out x]
R3 [x gnd] 1k
show out
${vary}`;
  const first = (vary: string) => {
    const { diagnostics, circuit } = compile(cell(vary));
    expect(circuit).toBeNull();
    return diagnostics.filter((d) => d.severity === 'error')[0];
  };

  it('an unknown parameter: did you mean, with the quick fix', () => {
    const d = first('vary Rlaod over 1, 10');
    expect(d.code).toBe('undefined-name');
    expect(d.message).toBe('there is no parameter named Rlaod');
    expect(d.hint).toContain('did you mean `Rload`?');
    expect(d.fix?.replacement).toBe('Rload');
    expect([d.line, d.column, d.endColumn]).toEqual([11, 6, 11]);
  });

  it('an empty list, a trailing comma, and a value that is not a number', () => {
    expect(first('vary Rload over').message).toBe('vary Rload lists no values');
    expect(first('vary Rload over 1k,').message).toBe('a value after the comma is missing');
    expect(first('vary Rload over 1k, "ten", 100').message).toBe('`"ten"` is not a value: vary steps through numbers');
    expect(first('vary Rload over 1k, ten').message).toBe('there is no parameter named ten');
  });

  it('a range of 0 values, of one value, with ends equal, through 0 by ratios, without `values`', () => {
    expect(first('vary Rload over 1k .. 10k, 0 values').message).toBe(
      'a range of values has a whole number of values, at least 2 (its two ends); this asks for 0',
    );
    expect(first('vary Rload over 1k .. 10k, 1 values').code).toBe('vary-count');
    expect(first('vary Rload over 1k .. 1k, 3 values').message).toBe('this range starts and stops at 1 kΩ');
    expect(first('vary Rload over 0 .. 1k, 3 values').code).toBe('vary-range');
    const steps = first('vary Rload over 1k .. 10k, 5 steps');
    expect(steps.message).toBe('the count is followed by the word values, the ends included');
    expect(steps.fix?.replacement).toBe('values');
  });

  it('something that is not a let parameter', () => {
    expect(first('vary R1 over 1k, 2k').message).toBe('R1 is a part (line 3), not a parameter: vary steps a parameter defined with let');
    expect(first('vary out over 1k, 2k').message).toBe('out is a node, not a parameter: vary steps a parameter defined with let');
    expect(first('vary Rs over 1k, 2k').message).toBe('Rs is a parameter of block pad, not a parameter: vary steps a parameter defined with let');
    expect(first('vary pi over 1, 2').message).toBe('pi is a built-in constant, not a parameter: vary steps a parameter defined with let');
  });

  it('a value in another unit, a value that uses the parameter itself', () => {
    expect(first('vary Rload over 1k, 10nF').message).toBe('Rload is in Ω, as its let line writes it; this value is in F');
    expect(first('vary Rload over (2*Rload)').code).toBe('vary-self');
  });

  it('a value that breaks the network is reported on that value', () => {
    const d = first('vary Rload over 1k, -5');
    expect(d.message).toBe('with Rload = -5 Ω: R2’s value must be more than 0 Ω; it is -5 Ω (line 4)');
    expect([d.line, d.column, d.endColumn]).toEqual([11, 21, 23]);
  });

  it('a second vary line, and a vary line inside a block', () => {
    const d = first('vary Rload over 1k, 2k\nvary Rload over 3k');
    expect(d.code).toBe('duplicate-vary');
    expect(d.message).toBe('a cell varies one parameter; line 11 varies Rload already');
    expect(d.hint).toContain('copy the cell');
    const inBlock = compile('block b [a c]\n  R1 [a c] 1k\n  vary R over 1, 2\nend\n');
    expect(inBlock.diagnostics.find((x) => x.code === 'not-in-block')?.line).toBe(3);
  });

  it('the parser never throws on any vary line, and every problem is inside the text', () => {
    const words = ['vary', 'Rload', 'over', '1k', '10k', '..', ',', 'values', 'linear', '5', '0', '(', ')', '"x"', '-', 'steps', 'R1', '2*Rload'];
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...words), { maxLength: 10 }), (tokens) => {
        const text = cell(`vary ${tokens.join(' ')}`);
        const parsed = parse(text);
        const { diagnostics } = compile(text);
        const lines = text.split('\n');
        for (const d of [...parsed.diagnostics, ...diagnostics]) {
          expect(d.line).toBeGreaterThanOrEqual(1);
          expect(d.line).toBeLessThanOrEqual(lines.length);
          expect(d.endColumn).toBeLessThanOrEqual(lines[d.line - 1].length + 1);
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe('the point limit counts every variant', () => {
  it('a written sweep times the count of variants', () => {
    const text = rc('1k', '100n', 'sweep 1 .. 1M, 1000/decade\nvary R over 1k, 2k, 3k, 4k');
    const d = errors(compile(text))[0];
    expect(d.code).toBe('vary-too-many');
    expect(d.message).toBe('4 variants of 6,001 points each make 24,004 points; the limit is 20,000 points in all');
  });

  it('the default sweep, with a lower limit given by the caller', () => {
    const d = errors(analyze(rc('1k', '100n', 'vary R over 1k, 2k, 3k, 4k'), { maxPoints: 2000 }))[0];
    expect(d.message).toBe('4 variants of the default sweep’s 601 points each make 2,404 points; the limit is 2,000 points in all');
  });

  it('a default sweep that widens is thinned to its share, so all variants together stay within the limit', () => {
    const maxPoints = 1300;
    const result = analyze(rc('1k', '1n', 'vary C over 1n, 100m'), { maxPoints });
    expect(errors(result)).toEqual([]);
    const total = result.variants!.reduce((n, v) => n + v.frequencies.length, 0);
    // The 100 mF variant's corner is at 1.6 mHz, so its sweep widens below 1 Hz.
    expect(result.variants![1].frequencies[0]).toBeLessThan(1e-3);
    expect(total).toBeLessThanOrEqual(maxPoints);
  });

  it('a range with more values than the limit has points is refused before its values are made', () => {
    const d = errors(compile(rc('1k', '100n', 'vary R over 1k .. 2k, 1e9 values')))[0];
    expect(d.message).toBe('1,000,000,000 variants are more than the point limit allows: 20,000 points in all');
  });
});
