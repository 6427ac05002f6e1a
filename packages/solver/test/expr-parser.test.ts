/** The expression parser: its tree (checked against mathjs `parse`), ranges and diagnostics. */
import { parse } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { lex } from '../src/lexer.js';
import { namesIn, parseExpression } from '../src/expr-parser.js';
import type { ExprNode } from '../src/expr-parser.js';
import type { Diagnostic } from '../src/result.js';

function read(text: string) {
  const lexed = lex(text);
  const tokens = lexed.lines[0].tokens;
  return { lexed, parsed: parseExpression(tokens, { line: 1, column: 1, endColumn: text.length + 1 }) };
}

function tree(text: string): ExprNode {
  const { parsed } = read(text);
  if (!parsed.ok) throw new Error(`${text}: ${parsed.diagnostics.map((d) => d.message).join('; ')}`);
  return parsed.tree;
}

function problem(text: string): Diagnostic {
  const { parsed } = read(text);
  if (parsed.ok) throw new Error(`${text} was read as ${render(parsed.tree)}`);
  expect(parsed.diagnostics).toHaveLength(1);
  return parsed.diagnostics[0];
}

/** Writes a tree as mathjs's `toString({ parenthesis: 'all' })` writes its own. */
function render(n: ExprNode): string {
  const wrap = (c: ExprNode) => (c.kind === 'number' || c.kind === 'name' ? render(c) : `(${render(c)})`);
  switch (n.kind) {
    case 'number':
      return String(n.value);
    case 'name':
      return n.name;
    case 'call':
      return `${n.name}(${n.args.map(render).join(', ')})`;
    case 'unary':
      return `${n.operator}${wrap(n.operand)}`;
    case 'binary':
      return `${wrap(n.left)} ${n.operator} ${wrap(n.right)}`;
  }
}

describe('parseExpression: structure', () => {
  // The reference for precedence and associativity is mathjs `parse` (a general-purpose math
  // library), whose rules the language keeps: ^ above the signs and to the right.
  const cases = [
    '1 + 2 * 3',
    '(1 + 2) * 3',
    '2^3^2',
    '-2^2',
    '2^-2',
    '-2^-2',
    '2^-3^2',
    '2 * -3',
    '2 - -3',
    '--3',
    '+ -3',
    '2^-+ -3',
    '8/4/2',
    '8-4-2',
    '2/-4*3',
    '-2*-3^-2',
    'a-b+c*d^-e^f/g',
    '-sqrt(2)^2',
    '2^sqrt(4)^2',
    'min(1 + 2, max(3, 4 * 5), -6)',
    '((2))',
    '(2)^(3)^(2)',
    '1/(2*pi*R*C)',
  ];
  it.each(cases)('%s groups as mathjs parse groups it', (text) => {
    expect(render(tree(text))).toBe(parse(text).toString({ parenthesis: 'all' }));
  });

  it('keeps each node’s source range, parentheses included', () => {
    const t = tree('(1 + 2) * sqrt(4)');
    expect(t.range).toEqual({ line: 1, column: 1, endColumn: 18 });
    if (t.kind !== 'binary' || t.right.kind !== 'call') throw new Error('expected a product with a call on its right');
    expect(t.left.range).toEqual({ line: 1, column: 1, endColumn: 8 });
    expect(t.right.range).toEqual({ line: 1, column: 11, endColumn: 18 });
    expect(t.right.nameRange).toEqual({ line: 1, column: 11, endColumn: 15 });
  });

  it('takes a unit standing after a number into it', () => {
    expect(tree('2 * 1 kHz')).toMatchObject({ right: { kind: 'number', value: 1000, unit: 'Hz', range: { column: 5, endColumn: 10 } } });
    expect(tree('10 Ω')).toMatchObject({ kind: 'number', value: 10, unit: 'Ω' });
    expect(tree('1k Hz')).toMatchObject({ kind: 'number', value: 1000, unit: 'Hz' });
  });

  it('lists the names it uses in reading order', () => {
    expect(namesIn(tree('B1.R * max(Cb, -pi) / B1.R')).map((n) => n.name)).toEqual(['B1.R', 'Cb', 'pi', 'B1.R']);
  });
});

describe('parseExpression: diagnostics point at the token where the problem is', () => {
  const at = (d: Diagnostic) => [d.column, d.endColumn];

  it('unbalanced parentheses', () => {
    const open = problem('2 * (1 + 2');
    expect(open).toMatchObject({ code: 'unclosed-parenthesis', message: 'this `(` is never closed' });
    expect(at(open)).toEqual([5, 6]);
    const call = problem('min(1, (2)');
    expect(at(call)).toEqual([4, 5]);
    const stray = problem('(1 + 2))');
    expect(stray.message).toBe('this `)` has no `(` to close');
    expect(at(stray)).toEqual([8, 9]);
    const empty = problem('1 + ()');
    expect(empty.message).toBe('the parentheses hold nothing');
    expect(at(empty)).toEqual([5, 7]);
  });

  it('an operator without its operand', () => {
    const twice = problem('2 * * 3');
    expect(twice.message).toBe('a value is missing here');
    expect(at(twice)).toEqual([5, 6]);
    expect(at(problem('* 3'))).toEqual([1, 2]);
    expect(at(problem('(1 +)'))).toEqual([5, 6]);
    const end = problem('2 * 3 -');
    expect(end.message).toBe('this expression ends too early: a value is missing');
    expect(at(end)).toEqual([7, 8]);
    expect(at(problem('2^'))).toEqual([2, 3]);
    expect(at(problem('min(1, )'))).toEqual([8, 9]);
  });

  it('two values with no operator between them', () => {
    const d = problem('R 2');
    expect(d.message).toBe('two values side by side: `R` and `2`');
    expect(d.hint).toBe('put an operator between them, such as * for a product');
    expect(at(d)).toEqual([3, 4]);
    expect(at(problem('2 (3)'))).toEqual([3, 4]);
    expect(problem('(2)(3)').message).toBe('two values side by side: `)` and `(`');
    expect(at(problem('min(1 2)'))).toEqual([7, 8]);
    expect(problem('1 kHz Hz').message).toBe('two values side by side: `kHz` and `Hz`');
  });

  it('a comma outside a call', () => {
    const d = problem('(1, 2)');
    expect(d.message).toBe('a comma only separates the arguments of a function, as in min(a, b)');
    expect(at(d)).toEqual([3, 4]);
    expect(at(problem('1, 2'))).toEqual([2, 3]);
  });

  it('an unknown function, with the nearest ones', () => {
    const d = problem('2 * sqt(4)');
    expect(d).toMatchObject({ code: 'unknown-function', message: '`sqt` is not a function the language knows' });
    expect(at(d)).toEqual([5, 8]);
    expect(d.hint).toMatch(/^did you mean `sqrt`\? The functions are sqrt, exp, ln, /);
    expect(d.fix).toMatchObject({ replacement: 'sqrt', column: 5, endColumn: 8 });
    const far = problem('frobnicate(1)');
    expect(far.hint).toMatch(/^the functions are sqrt, /);
    expect(far.fix).toBeUndefined();
  });

  it('a function without its parentheses, or with the wrong count of values', () => {
    expect(problem('2 * sqrt').message).toBe('sqrt is a function: write sqrt(x)');
    const many = problem('1 + sqrt(1, 2)');
    expect(many.message).toBe('sqrt takes one value; this gives it 2');
    expect(at(many)).toEqual([5, 9]);
    expect(problem('ln()').message).toBe('ln takes one value; this gives it none');
    const none = problem('max()');
    expect(none.message).toBe('max needs at least one value');
    expect(at(none)).toEqual([1, 4]);
  });

  it('a unit where it cannot go', () => {
    const second = problem('1kΩ Ω');
    expect(second.message).toBe('`1kΩ` already has a unit; `Ω` is one too many');
    expect(at(second)).toEqual([5, 6]);
    const prefixes = problem('1k kHz');
    expect(prefixes.message).toBe('`1k` has an SI prefix already; `kHz` would add a second');
    expect(prefixes.hint).toBe('write 1kHz');
    expect(at(problem('R Ω'))).toEqual([3, 4]);
  });

  it('tokens that have no place in an expression', () => {
    for (const [text, shown, column] of [
      ['a = 1', '=', 3],
      ['[1]', '[', 1],
      ['1 .. 2', '..', 3],
      ['2 * "x"', 'x', 5],
      ['1 >= 2', '>=', 3],
    ] as const) {
      const d = problem(text);
      expect(d.message).toBe(`\`${shown}\` cannot appear in an expression`);
      expect(d.column).toBe(column);
    }
  });

  it('leaves a token the lexer refused to the lexer’s own diagnostic', () => {
    for (const text of ['1 + 1cm', '2 ? 3', '(1 + 2 ;']) {
      const { lexed, parsed } = read(text);
      expect(lexed.diagnostics.length).toBeGreaterThan(0);
      expect(parsed).toEqual({ ok: false, diagnostics: [] });
    }
  });

  it('an empty expression', () => {
    const d = problem('');
    expect(d.message).toBe('the parentheses hold nothing');
    expect(at(d)).toEqual([1, 1]);
  });
});
