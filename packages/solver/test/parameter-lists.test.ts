/** An expression in a block's parameter list or a `use` line needs parentheses; the message says so and the fix adds them. */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { run, trace } from './helpers/cell.js';

const block = 'let Cb = 1n\nblock rc [i o] (R = 1k, C = 1n)\n  R1 [i o] R\n  C1 [o gnd] C\nend\ndrive in\n';

describe('an unparenthesised expression in a parameter list', () => {
  it('in a use line: says parentheses are needed, points at the whole expression, and the fix adds them', () => {
    const line = 'use rc as B1 [in out] (R = 2*Cb*(1+1), C = 1n)';
    const text = `${block}${line}\nshow out\n`;
    const errors = analyze(text).diagnostics.filter((d) => d.severity === 'error');
    expect(errors).toHaveLength(1);
    const [e] = errors;
    expect(e.code).toBe('unparenthesised-expression');
    expect(e.message).toContain('needs parentheses');
    expect(e.hint).toContain('let');
    expect(line.slice(e.column - 1, e.endColumn - 1)).toBe('2*Cb*(1+1)');
    expect(e.fix?.replacement).toBe('(2*Cb*(1+1))');
    const fixed = text.replace('2*Cb*(1+1)', e.fix?.replacement ?? '');
    expect(trace(run(fixed), 'out').magnitude.length).toBeGreaterThan(0);
  });

  it('in a block’s defaults: the same message', () => {
    const text = 'let R = 1k\nblock rc [i o] (Rs = R/2, C = 1n)\n  R1 [i o] Rs\n  C1 [o gnd] C\nend\ndrive in\nuse rc as B1 [in out]\nshow out\n';
    const errors = analyze(text).diagnostics.filter((d) => d.severity === 'error');
    expect(errors.map((d) => d.code)).toEqual(['unparenthesised-expression']);
    expect(errors[0].fix?.replacement).toBe('(R/2)');
  });

  it('a negative number or a parenthesised expression is read as before', () => {
    const r = run(`${block}use rc as B1 [in out] (R = (2*Cb/1n*1k), C = -(-1n))\nshow out\n`);
    expect(trace(r, 'out').magnitude.length).toBeGreaterThan(0);
  });
});
