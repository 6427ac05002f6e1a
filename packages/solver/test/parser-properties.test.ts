/**
 * Properties of the front end that must hold for any text at all: parse and compile never
 * throw, every diagnostic (and quick fix) lies inside the text, a circuit comes back
 * exactly when there is no error; and formatSi/parseSi round-trip.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { compile } from '../src/compile.js';
import { parse } from '../src/parser/index.js';
import { formatSi, parseSi } from '../src/units.js';
import type { Diagnostic } from '../src/result.js';

const casesDir = fileURLToPath(new URL('./cases', import.meta.url));
/** The inputs of the fixtures that compile cleanly: valid cells to mutate. */
const validCells = readdirSync(casesDir)
  .filter((f) => f.startsWith('valid-'))
  .map((f) => readFileSync(`${casesDir}/${f}`, 'utf8').split('\n=== expected ===')[0]);

/** Pieces of the language, so that random text often gets deep into the parser. */
const fragments = [
  'R1',
  'C1',
  'L1',
  'U1',
  'A1',
  'B1',
  'R',
  'Cb',
  'x',
  'in',
  'out',
  'gnd',
  '0',
  '12',
  'B1.x',
  '[',
  ']',
  '(',
  ')',
  ',',
  '=',
  '>=',
  '<=',
  '±',
  '..',
  '+',
  '-',
  '*',
  '/',
  '^',
  '%',
  '°',
  'Ω',
  '°C',
  '"',
  '"lbl"',
  '10k',
  '4k7',
  '2n2',
  '4R7',
  '1e-9',
  '0.47',
  '100dB',
  '10meg',
  '1MEG',
  '10K',
  '1khz',
  '-3',
  '1µF',
  '.5',
  'let',
  'block',
  'end',
  'use',
  'as',
  'drive',
  'current',
  'phase',
  'show',
  'loop',
  'step',
  'noise',
  'impedance',
  'sweep',
  'at',
  'decade',
  'linear',
  'time',
  'points',
  'temperature',
  'spread',
  'draws',
  'extremes',
  'seed',
  'tolerance',
  'montecarlo',
  'require',
  'gain',
  'corner',
  'phase-margin',
  'over',
  'opamp',
  'gbw',
  'zout',
  'en',
  'vgain',
  'gm',
  'igain',
  'rm',
  'of',
  'couple',
  'esr',
  'esl',
  'dcr',
  'tol',
  'noise',
  'off',
  'noiseless',
  'vnoise',
  'inoise',
  'sqrt',
  'pi',
  'e',
  'min',
  '#',
  ' ',
  ' ',
  ' ',
  '\n',
  '\n',
  '\t',
  '\r\n',
];
const languageLike = fc.array(fc.constantFrom(...fragments), { maxLength: 60 }).map((xs) => xs.join(' '));
const denseLanguageLike = fc.array(fc.constantFrom(...fragments), { maxLength: 60 }).map((xs) => xs.join(''));
const anyText = fc.oneof(
  fc.string({ maxLength: 200 }),
  fc.string({ unit: 'binary', maxLength: 200 }),
  fc.string({ unit: 'grapheme', maxLength: 100 }),
  languageLike,
  denseLanguageLike,
);

/** A valid cell with a few random edits: deletions, insertions, swapped or doubled lines. */
const mutatedCell = fc
  .tuple(
    fc.constantFrom(...validCells),
    fc.array(fc.tuple(fc.nat(), fc.nat({ max: 12 }), fc.oneof(fc.constantFrom(...fragments), fc.string({ maxLength: 4 })), fc.nat({ max: 3 })), {
      minLength: 1,
      maxLength: 6,
    }),
  )
  .map(([cell, edits]) => {
    let text = cell;
    for (const [at, length, insert, kind] of edits) {
      const i = text.length === 0 ? 0 : at % (text.length + 1);
      if (kind === 0) text = text.slice(0, i) + text.slice(i + length);
      else if (kind === 1) text = text.slice(0, i) + insert + text.slice(i);
      else {
        const lines = text.split('\n');
        const a = at % lines.length;
        const b = (at + length) % lines.length;
        if (kind === 2) [lines[a], lines[b]] = [lines[b], lines[a]];
        else lines.splice(a, 0, lines[b]);
        text = lines.join('\n');
      }
    }
    return text;
  });

function rangeInside(text: string, r: { line: number; column: number; endColumn: number }, nonEmpty: boolean): boolean {
  const lines = text.split(/\r\n|\r|\n/);
  if (!Number.isInteger(r.line) || r.line < 1 || r.line > lines.length) return false;
  const length = lines[r.line - 1].length;
  if (!(r.column >= 1 && r.column <= r.endColumn && r.endColumn <= length + 1)) return false;
  return !nonEmpty || length === 0 || r.column < r.endColumn;
}

function checkDiagnostics(text: string, diagnostics: Diagnostic[]): void {
  for (const d of diagnostics) {
    if (!rangeInside(text, d, true)) throw new Error(`range out of the text: ${JSON.stringify(d)} in ${JSON.stringify(text)}`);
    if (d.fix !== undefined && !rangeInside(text, d.fix, false)) throw new Error(`fix out of the text: ${JSON.stringify(d)}`);
    expect(d.message.length).toBeGreaterThan(0);
    expect(d.code).toMatch(/^[a-z]+(-[a-z]+)*$/);
    expect(d.code).not.toBe('internal-error');
  }
}

// Thousands of cells each: a generous time limit, so that a busy machine does not fail them.
describe('parse and compile on any text', () => {
  it('never throw, and keep every diagnostic inside the text', () => {
    fc.assert(
      fc.property(anyText, (text) => {
        const parsed = parse(text);
        checkDiagnostics(text, parsed.diagnostics);
        const compiled = compile(text);
        checkDiagnostics(text, compiled.diagnostics);
        const errors = compiled.diagnostics.some((d) => d.severity === 'error');
        expect(compiled.circuit === null).toBe(errors);
      }),
      { numRuns: 1500 },
    );
  }, 30_000);

  it('never throw on mutated valid cells, and keep every diagnostic inside the text', () => {
    fc.assert(
      fc.property(mutatedCell, (text) => {
        checkDiagnostics(text, parse(text).diagnostics);
        const compiled = compile(text);
        checkDiagnostics(text, compiled.diagnostics);
        expect(compiled.circuit === null).toBe(compiled.diagnostics.some((d) => d.severity === 'error'));
        if (compiled.circuit !== null) {
          const c = compiled.circuit;
          expect(c.nodeNames[0]).toBe('gnd');
          for (const e of c.elements) if ('value' in e) expect(e.value).toBeGreaterThan(0);
          for (const r of c.requirements) expect(r.trace).toBeLessThan(c.traces.length);
        }
      }),
      { numRuns: 1500 },
    );
  }, 30_000);

  // How fast is `npm run bench`'s business (case d); here only that it comes out right.
  it('elaborates a very long cell whole', () => {
    const lines = ['drive in'];
    for (let i = 0; i < 20000; i++) lines.push(`R${i} [n${i} n${i + 1}] 1k`);
    lines[1] = 'R0 [in n1] 1k';
    lines.push('R20000 [n20000 gnd] 1k', 'show n20000');
    const { circuit, diagnostics } = compile(lines.join('\n'));
    expect(diagnostics).toEqual([]);
    expect(circuit?.elements.length).toBe(20001);
  }, 60_000);
});

describe('formatSi and parseSi', () => {
  const units = ['', 'Ω', 'F', 'H', 'Hz', 'V', 'A', 's', 'S', 'dB', '%', 'deg', 'K'];
  const magnitudes = fc.oneof(
    fc.double({ min: 1e-18, max: 1e18, noNaN: true }),
    fc.integer({ min: -30, max: 30 }).chain((e) => fc.double({ min: 1, max: 10, noNaN: true }).map((m) => m * 10 ** e)),
  );
  const values = fc.tuple(magnitudes, fc.boolean()).map(([m, negative]) => (negative ? -m : m));

  it('round-trip at full precision', () => {
    fc.assert(
      fc.property(values, fc.constantFrom(...units), (x, unit) => {
        const text = formatSi(x, unit, 15);
        const back = parseSi(text);
        expect(back, text).not.toBeNull();
        expect(Math.abs((back as number) - x)).toBeLessThanOrEqual(Math.abs(x) * 1e-13);
      }),
      { numRuns: 3000 },
    );
  });

  it('round-trip to the digits shown', () => {
    fc.assert(
      fc.property(values, fc.constantFrom(...units), fc.integer({ min: 1, max: 8 }), (x, unit, digits) => {
        const text = formatSi(x, unit, digits);
        const back = parseSi(text);
        expect(back, text).not.toBeNull();
        expect(Math.abs((back as number) - x)).toBeLessThanOrEqual(Math.abs(x) * 0.5 * 10 ** (1 - digits) * (1 + 1e-9));
      }),
      { numRuns: 3000 },
    );
  });

  it('round-trip zero', () => {
    for (const unit of units) expect(parseSi(formatSi(0, unit))).toBe(0);
  });
});
