/**
 * The cell-language fixtures: each file in test/cases holds a cell, a separator line
 * `=== expected ===`, then what compile() must say about it (see render.ts). Set
 * UPDATE_CASES=1 to write the current output into the files (then read the diff!).
 */
import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { compile } from '../src/compile.js';
import { render } from './render.js';

const dir = fileURLToPath(new URL('./cases', import.meta.url));
const SEPARATOR = '=== expected ===';
const files = readdirSync(dir)
  .filter((f) => f.endsWith('.txt'))
  .sort();

describe('cell language fixtures', () => {
  it('has fixtures', () => {
    expect(files.length).toBeGreaterThan(0);
  });
  for (const file of files) {
    it(file.replace(/\.txt$/, ''), () => {
      const path = join(dir, file);
      const content = readFileSync(path, 'utf8');
      // The input may be empty, in which case the file starts with the separator.
      const padded = '\n' + content;
      const at = padded.search(new RegExp(`\\n${SEPARATOR}(\\n|$)`));
      if (at < 0 && !process.env.UPDATE_CASES) throw new Error(`${file} has no "${SEPARATOR}" line`);
      const input = at < 0 ? content.replace(/\n$/, '') : padded.slice(1, Math.max(1, at));
      const expected = at < 0 ? '' : padded.slice(at + SEPARATOR.length + 2).replace(/\s+$/, '');
      const actual = render(compile(input));
      if (process.env.UPDATE_CASES && actual !== expected) {
        writeFileSync(path, `${input === '' ? '' : input + '\n'}${SEPARATOR}\n${actual}\n`);
        return;
      }
      expect(actual).toBe(expected);
    });
  }
});
