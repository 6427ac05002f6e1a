/** Expressions: their values and units, and only the listed operations are allowed. */
import { describe, expect, it } from 'vitest';
import { evaluateExpression, evaluateTokens } from '../src/expr.js';
import type { Quantity } from '../src/expr.js';
import { diagnostic } from '../src/diagnostic.js';
import { lex } from '../src/lexer.js';

function value(text: string, params: Record<string, number> = {}): number {
  const r = evaluateExpression(text, params);
  if ('error' in r) throw new Error(`${text}: ${r.error}`);
  return r.value;
}

function error(text: string, params: Record<string, number> = {}): string {
  const r = evaluateExpression(text, params);
  if (!('error' in r)) throw new Error(`${text} gave ${r.value}, not an error`);
  return r.error;
}

describe('evaluateExpression', () => {
  it('reads SI prefixes and IEC forms as the lexer reads them', () => {
    expect(value('2*11.25n')).toBeCloseTo(22.5e-9, 20);
    expect(value('4k7 + 300')).toBe(5000);
    expect(value('1M/1k')).toBe(1000);
    expect(value('1m*1M')).toBe(1000);
    expect(value('2n2 * 1e9')).toBeCloseTo(2.2, 12);
  });

  it('follows the usual precedence', () => {
    expect(value('1 + 2 * 3')).toBe(7);
    expect(value('(1 + 2) * 3')).toBe(9);
    expect(value('2^3^2')).toBe(512);
    expect(value('-2^2')).toBe(-4);
    expect(value('8/4/2')).toBe(1);
    expect(value('--3')).toBe(3);
  });

  it('knows pi, e and the listed functions', () => {
    const R = 10e3;
    const C = 15.915494309189533e-9;
    expect(value('1/(2*pi*R*C)', { R, C })).toBeCloseTo(1000, 9);
    expect(value('ln(e)')).toBe(1);
    expect(value('log10(1k)')).toBe(3);
    expect(value('sqrt(2)^2')).toBeCloseTo(2, 14);
    expect(value('exp(0) + sin(0) + cos(0) + tan(0) + atan(1)*4')).toBeCloseTo(2 + Math.PI, 14);
    expect(value('abs(-3) + min(4, 2, 8) + max(1, 5)')).toBe(10);
  });

  it('takes parameter names, dotted ones too', () => {
    expect(value('Cb*2', { Cb: 1e-9 })).toBe(2e-9);
    expect(value('B1.R + 1', { 'B1.R': 1 })).toBe(2);
  });

  it('carries units and refuses to add unlike ones', () => {
    expect(evaluateExpression('10kΩ + 1k')).toEqual({ value: 11000, unit: 'Ω' });
    expect(evaluateExpression('2 * 1 kHz')).toEqual({ value: 2000, unit: 'Hz' });
    expect(evaluateExpression('1kΩ / 1kΩ')).toEqual({ value: 1, unit: null });
    const product = evaluateExpression('1kΩ * 1nF');
    expect(product).toMatchObject({ unit: 'compound' });
    expect('value' in product && product.value).toBeCloseTo(1e-6, 20);
    expect(error('1kΩ + 1nF')).toBe('cannot add Ω and F');
  });

  it('refuses what is not on the list, without throwing', () => {
    expect(error('a = 1', { a: 1 })).toBe('`=` cannot appear in an expression');
    expect(error('f(x) = x')).toBe('`f` is not a function the language knows');
    expect(error('[1, 2]')).toBe('`[` cannot appear in an expression');
    expect(error('import(1)')).toBe('`import` is not a function the language knows');
    expect(error('evaluate(1)')).toBe('`evaluate` is not a function the language knows');
    expect(error('2 3')).toBe('two values side by side: `2` and `3`');
    expect(error('2 pi')).toBe('two values side by side: `2` and `pi`');
    expect(error('1cm')).toBe('`cm` after 1 is not an SI prefix or a unit');
    expect(error('1 cm')).toBe('two values side by side: `1` and `cm`');
    expect(error('x + 1')).toBe('there is no parameter named `x`');
    expect(error('1, 2')).toBe('a comma only separates the arguments of a function, as in min(a, b)');
    expect(error('2 * ')).toBe('this expression ends too early: a value is missing');
    expect(error('(1 + 2')).toBe('this `(` is never closed');
    expect(error('sqrt')).toBe('sqrt is a function: write sqrt(x)');
    expect(error('sqrt(1, 2)')).toBe('sqrt takes one value; this gives it 2');
    expect(error('1/0')).toBe('this expression is infinite (a division by zero?)');
    expect(error('sqrt(-1)')).toBe('this expression has no value (a square root or logarithm of a negative number?)');
    expect(error('"text"')).toBe('`text` cannot appear in an expression');
    expect(error('1 ? 2 : 3')).toBe('the character `?` has no meaning here');
    expect(error("x'")).toBe("the character `'` has no meaning here");
    expect(error('5!')).toBe('the character `!` has no meaning here');
  });
});

describe('evaluateTokens', () => {
  const params: Record<string, Quantity> = { R: { value: 1e3, unit: 'Ω' }, C: { value: 1e-9, unit: 'F' } };
  function evaluate(text: string) {
    const tokens = lex(text).lines[0].tokens;
    const looked: string[] = [];
    const result = evaluateTokens(tokens, { line: 1, column: 1, endColumn: text.length + 1 }, (name, range) => {
      looked.push(name);
      return Object.hasOwn(params, name) ? params[name] : diagnostic(range, 'undefined-name', `there is no parameter named ${name}`);
    });
    return { result, looked };
  }
  function problems(text: string) {
    const { result } = evaluate(text);
    if (result.ok) throw new Error(`${text} gave ${result.quantity.value}`);
    return result.diagnostics.map((d) => ({ message: d.message, at: [d.column, d.endColumn] }));
  }

  it('says where a value stopped being finite, and why', () => {
    expect(problems('2 + 1/(R - 1k)')).toEqual([{ message: 'this expression is infinite (a division by zero?)', at: [5, 15] }]);
    expect(problems('1 + 0/0')).toEqual([{ message: 'this expression has no value (zero divided by zero)', at: [5, 8] }]);
    expect(problems('3 * ln(0)')).toEqual([{ message: 'this expression is infinite (the logarithm of zero)', at: [5, 10] }]);
    expect(problems('1 + 0^-1')).toEqual([{ message: 'this expression is infinite (zero to a negative power)', at: [5, 9] }]);
    expect(problems('2*(-8)^(1/3)')).toEqual([{ message: 'this expression has no value (a fractional power of a negative number)', at: [3, 13] }]);
    expect(problems('1 + sqrt(-1)')).toEqual([{ message: 'this expression has no value (a square root or logarithm of a negative number?)', at: [5, 13] }]);
    expect(problems('10^400 / 2')).toEqual([{ message: 'this expression is too large to compute (beyond ±1.8e308)', at: [1, 7] }]);
    expect(problems('1e999 - 1')).toEqual([{ message: 'this expression is too large to compute (beyond ±1.8e308)', at: [1, 6] }]);
  });

  it('refuses a value that is not finite inside, even when the whole would come out finite', () => {
    // IEEE 754 arithmetic (and mathjs `evaluate`) give 0 and π/2 here.
    expect(problems('1/(1/0)')).toEqual([{ message: 'this expression is infinite (a division by zero?)', at: [3, 8] }]);
    expect(problems('atan(R/0)')).toEqual([{ message: 'this expression is infinite (a division by zero?)', at: [6, 9] }]);
  });

  it('says where units do not match', () => {
    expect(problems('2 * (R + C) / 3')).toEqual([{ message: 'cannot add Ω and F', at: [5, 12] }]);
    expect(problems('1 + max(R, C)')).toEqual([{ message: 'max compares values in different units', at: [5, 8] }]);
  });

  it('reports every undefined name, and looks up neither constants nor functions', () => {
    expect(problems('x * R + sqrt(y) * pi')).toEqual([
      { message: 'there is no parameter named x', at: [1, 2] },
      { message: 'there is no parameter named y', at: [14, 15] },
    ]);
    expect(evaluate('R * e * pi').looked).toEqual(['R']);
    expect(problems('constructor + 1')).toEqual([{ message: 'there is no parameter named constructor', at: [1, 12] }]);
  });
});
