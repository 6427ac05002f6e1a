/**
 * LANGUAGE.md is the users' reference: every `rolloff` example in it must compile with no
 * error, and it must not contain a line that starts with a dot directive.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { compile } from '../src/compile.js';

const doc = readFileSync(fileURLToPath(new URL('../LANGUAGE.md', import.meta.url)), 'utf8');
const examples = [...doc.matchAll(/```rolloff\n([\s\S]*?)```/g)].map((m) => m[1]);

describe('LANGUAGE.md', () => {
  it('has examples', () => {
    expect(examples.length).toBeGreaterThan(10);
  });

  examples.forEach((example, i) => {
    it(`example ${i + 1} compiles (${example.split('\n')[0]})`, () => {
      const { circuit, diagnostics } = compile(example);
      const expected = new Set(['not-available', 'dc-point']);
      const unexpected = diagnostics.filter((d) => d.severity === 'error' || !expected.has(d.code));
      expect(unexpected).toEqual([]);
      expect(circuit).not.toBeNull();
    });
  });

  it('has no line starting with a dot directive', () => {
    expect(doc.split('\n').filter((l) => /^\s*\.[A-Za-z]/.test(l))).toEqual([]);
  });
});
