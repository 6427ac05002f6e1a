/**
 * Rewriting cells of the language's earlier forms: each rule on its own, references that
 * follow a renamed designator, what stays as written, idempotence, and the property that a
 * modernized cell compiles when the old one did.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compile } from '../src/compile.js';
import { modernizeCellText } from '../src/modernize.js';
import { FIRST_EXAMPLE } from '../src/examples.js';

const modern = (text: string) => modernizeCellText(text).text;

describe('modernizeCellText: one rule at a time', () => {
  const table: [string, string, string][] = [
    ['ground 0 becomes gnd', 'C1 [out 0] 1n', 'C1 [out gnd] 1n'],
    ['a digits-only node becomes nN', 'R1 [1 2] 1k', 'R1 [n1 n2] 1k'],
    ['nodes in commas keep their commas', 'R1 [1, 0] 1k', 'R1 [n1, gnd] 1k'],
    ['a free-form designator takes the next number', 'R1 [a b] 1k\nRfb [b c] 10k', 'R1 [a b] 1k\nR2 [b c] 10k'],
    ['numbers follow the highest of the class', 'R7 [a b] 1k\nRx [b c] 1k\nRy [c d] 1k', 'R7 [a b] 1k\nR8 [b c] 1k\nR9 [c d] 1k'],
    ['each class counts on its own', 'Cin [a b] 1n\nRin [b c] 1k', 'C1 [a b] 1n\nR1 [b c] 1k'],
    ['a lower-case suffix is kept', 'R4b [a b] 1k', 'R4b [a b] 1k'],
    ['a bare class letter gets a number', 'R [a b] 1k', 'R1 [a b] 1k'],
    ['noiseless becomes noise off', 'R1 [a b] 1k noiseless', 'R1 [a b] 1k noise off'],
    ['noiseless after a tolerance', 'R1 [a b] 1k ±1% noiseless', 'R1 [a b] 1k ±1% noise off'],
    ['op-amp en and in', 'U1 [p n o] opamp gain 100 dB en 10n in 1p', 'U1 [p n o] opamp gain 100 dB vnoise 10n inoise 1p'],
    ['a parameter named in is a value, not an option', 'U1 [p n o] opamp inoise in', 'U1 [p n o] opamp inoise in'],
    ['montecarlo', 'tolerance montecarlo 200', 'spread 200 draws'],
    ['montecarlo with a seed', 'tolerance montecarlo 500 seed 7', 'spread 500 draws seed 7'],
    ['montecarlo with an expression', 'tolerance montecarlo (2*N) seed 1', 'spread (2*N) draws seed 1'],
    ['worstcase', 'tolerance worstcase', 'spread extremes'],
    ['27°C is the user’s value', 'temperature 27°C', 'temperature 27°C'],
    ['drive of a numbered node', 'drive 1 2', 'drive n1 2'],
    ['drive between numbered nodes', 'drive current [1 0] 1m', 'drive current [n1 gnd] 1m'],
    ['show of numbered nodes', 'show 2 - 1', 'show n2 - n1'],
    ['show loop of a ratio', 'show loop 2 / 1', 'show loop n2 / n1'],
    ['show impedance', 'show impedance [1 0]', 'show impedance [n1 gnd]'],
    ['require of a numbered node', 'require 2 gain >= -3 dB over 10 .. 100', 'require n2 gain >= -3 dB over 10 .. 100'],
    ['a numbered name already taken gets another', 'R1 [n1 1] 1k', 'R1 [n1 n1_2] 1k'],
    ['a free number skips a name in use', 'let R1 = 1k\nRfb [a b] R1', 'let R1 = 1k\nR2 [a b] R1'],
  ];
  for (const [what, before, after] of table) {
    it(what, () => {
      expect(modern(before)).toBe(after);
    });
  }
});

describe('modernizeCellText: references follow a renamed designator', () => {
  it('updates of, couple, show current and require current', () => {
    const before = [
      'drive in',
      'Rsense [in 0] 10',
      'Lp [in a] 1m',
      'Ls [a 0] 1m',
      'couple Lp Ls 0.9',
      'Aout [o 0] igain 2 of Rsense',
      'Rload [o 0] 1k',
      'show current Rsense',
      'show "x" step current Rload',
      'require current Rsense gain <= 0 dB',
    ].join('\n');
    const after = [
      'drive in',
      'R1 [in gnd] 10',
      'L1 [in a] 1m',
      'L2 [a gnd] 1m',
      'couple L1 L2 0.9',
      'A1 [o gnd] igain 2 of R1',
      'R2 [o gnd] 1k',
      'show current R1',
      'show "x" step current R2',
      'require current R1 gain <= 0 dB',
    ].join('\n');
    expect(modern(before)).toBe(after);
  });

  it('renames inside a block in the block’s own scope, and names reaching into an instance', () => {
    const before = [
      'block stage [i o]',
      '  Rfb [i o] 10k',
      '  R1 [i 3] 1k',
      '  C1 [3 0] 1n',
      'end',
      'Rfb [in x] 1k',
      'drive in',
      'use stage as Bamp [x out]',
      'show current Bamp.Rfb',
      'show Bamp.3',
      'show current Rfb',
    ].join('\n');
    const after = [
      'block stage [i o]',
      '  R2 [i o] 10k',
      '  R1 [i n3] 1k',
      '  C1 [n3 gnd] 1n',
      'end',
      'R3 [in x] 1k',
      'drive in',
      'use stage as B1 [x out]',
      'show current B1.R2',
      'show B1.n3',
      'show current R3',
    ].join('\n');
    expect(modern(before)).toBe(after);
  });

  it('leaves a requirement that names a label alone', () => {
    const text = 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1n\nshow "2" out\nrequire 2 gain >= -3 dB';
    expect(modern(text)).toBe(text);
  });
});

describe('modernizeCellText: what stays as written', () => {
  it('keeps comments, spacing and line breaks', () => {
    const before = '# a comment with 0 and Rfb and noiseless\r\nRfb  [in   0]   10k   # feedback, noiseless\r\n\r\n  tolerance   montecarlo  200   # draws\n';
    const after = '# a comment with 0 and Rfb and noiseless\r\nR1  [in   gnd]   10k   # feedback, noiseless\r\n\r\n  spread 200 draws   # draws\n';
    expect(modernizeCellText(before)).toEqual({ text: after, changed: true });
  });

  it('says nothing changed for text in today’s forms', () => {
    expect(modernizeCellText(FIRST_EXAMPLE)).toEqual({ text: FIRST_EXAMPLE, changed: false });
    expect(modernizeCellText('')).toEqual({ text: '', changed: false });
  });

  it('does not touch values or labels that look like nodes', () => {
    const text = 'drive in 2\nR1 [in out] 0.5k\nC1 [out gnd] 1n ±0.1n\nshow "0" out\nsweep at 0, 10, 100';
    expect(modern(text)).toBe(text);
  });
});

const casesDir = fileURLToPath(new URL('./cases', import.meta.url));
const fixtureInputs = readdirSync(casesDir)
  .filter((f) => f.endsWith('.txt'))
  .map((f) => readFileSync(`${casesDir}/${f}`, 'utf8').split('\n=== expected ===')[0]);

/** Pieces of cells in the earlier forms, put together at random. */
const oldLines = [
  'drive 1',
  'drive in',
  'drive [1 0]',
  'R1 [1 2] 1k',
  'Rfb [2 0] 10k',
  'Rload [out 0] 1k noiseless',
  'C1 [2 out] 1n ±5%',
  'Cx [out 0] 10n esr 20m',
  'Lp [1 3] 1m',
  'Ls [3 0] 1m',
  'couple Lp Ls 0.9',
  'U1 [0 2 out] opamp gain 100dB en 10n in 1p',
  'Ubuf [out x out] opamp',
  'Aa [x 0] igain 2 of Rfb',
  'show out',
  'show 2',
  'show current Rfb',
  'show loop out / 2',
  'tolerance montecarlo 100 seed 3',
  'tolerance worstcase',
  'require out gain >= -3 dB',
  'require 2 gain <= 0 dB',
  'block lp [a b]',
  'Rb [a b] 1k',
  'C9 [b 0] 1n',
  'end',
  'use lp as Bx [out 4]',
  'show Bx.b',
  '# comment 0',
  '',
];
const oldCell = fc.array(fc.constantFrom(...oldLines), { maxLength: 14 }).map((xs) => xs.join('\n'));

/** The earlier forms of a cell written today: what a saved notebook may hold. */
const antiques: [RegExp, string][] = [
  [/\bgnd\b/g, '0'],
  [/\bnoise off\b/g, 'noiseless'],
  [/\bvnoise\b/g, 'en'],
  [/\binoise\b/g, 'in'],
  [/\bspread (\S+) draws\b/g, 'tolerance montecarlo $1'],
  [/\bspread extremes\b/g, 'tolerance worstcase'],
  [/\b([RCLUAB])(\d+)\b/g, '$1part$2'],
];
const antique = (text: string, which: readonly number[]) => which.reduce((t, i) => t.replace(antiques[i][0], antiques[i][1]), text);

describe('modernizeCellText: properties', () => {
  it('is idempotent on every fixture and on random old-form cells', () => {
    for (const text of fixtureInputs) expect(modern(modern(text))).toBe(modern(text));
    fc.assert(
      fc.property(oldCell, (text) => {
        const once = modern(text);
        expect(modernizeCellText(once)).toEqual({ text: once, changed: false });
      }),
    );
  });

  it('changes nothing in the fixtures that are valid today', () => {
    for (const text of fixtureInputs.filter((t) => compile(t).circuit !== null)) expect(modern(text)).toBe(text);
  });

  it('keeps the line count', () => {
    fc.assert(
      fc.property(oldCell, (text) => {
        expect(modern(text).split('\n').length).toBe(text.split('\n').length);
      }),
    );
  });

  it('a valid cell written in the earlier forms has only their errors, and compiles once modernized', () => {
    const valid = [FIRST_EXAMPLE, ...fixtureInputs.filter((t) => compile(t).circuit !== null)];
    const retired = new Set(['ground-is-gnd', 'digit-node', 'bad-designator', 'retired-word']);
    fc.assert(
      fc.property(
        fc.constantFrom(...valid),
        fc.subarray(
          antiques.map((_, i) => i),
          { minLength: 1 },
        ),
        (cell, which) => {
          const old = antique(cell, which);
          fc.pre(old !== cell);
          const before = compile(old).diagnostics.filter((d) => d.severity === 'error');
          expect(before.length).toBeGreaterThan(0);
          expect(before.filter((d) => !retired.has(d.code))).toEqual([]);
          expect(compile(modern(old)).diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
        },
      ),
      { numRuns: 150 },
    );
  }, 30_000);
});
