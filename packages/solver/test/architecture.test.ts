/**
 * The solver's import rules (style.md): the vocabulary and diagnostics modules import nothing
 * of the solver at run time, so every other module (and the web editor) can read them without
 * pulling the analysis in; only the command line touches Node's APIs, so the same code runs
 * in the browser's worker.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { builtinModules } from 'node:module';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

interface Module {
  /** Path under src/, e.g. `lexer.ts` or `parser/index.ts`. */
  file: string;
  imports: { specifier: string; typeOnly: boolean }[];
  /** Whether the text uses Node's globals (`process`, `Buffer`, `__dirname`). */
  nodeGlobals: boolean;
}

const importPattern = /(?:^|\n)\s*(?:import|export)\s+(type\s+)?(?:[^'";]*?\s+from\s+)?['"]([^'"]+)['"]|import\(\s*['"]([^'"]+)['"]\s*\)/g;
const nodeGlobalPattern = /\b(?:process\.|Buffer\.|__dirname|__filename)/;

function readModule(file: string, text: string): Module {
  const imports = [...text.matchAll(importPattern)].map((m) => ({ specifier: m[2] ?? m[3], typeOnly: Boolean(m[1]) }));
  return { file, imports, nodeGlobals: nodeGlobalPattern.test(text.replace(/\/\/.*|\/\*[\s\S]*?\*\//g, '')) };
}

const isNodeApi = (specifier: string) => specifier.startsWith('node:') || builtinModules.includes(specifier);
const isSolverModule = (specifier: string) => specifier.startsWith('./') || specifier.startsWith('../');
const FREESTANDING = ['vocabulary.ts', 'diagnostic.ts'];
const NODE_ALLOWED = ['cli.ts'];

/** Every import (or global) that breaks a rule, as "file: what it does". */
function ruleBreaks(modules: readonly Module[]): string[] {
  return modules.flatMap((module) => [
    ...module.imports
      .filter((i) => FREESTANDING.includes(module.file) && isSolverModule(i.specifier) && !i.typeOnly)
      .map((i) => `${module.file} imports ${i.specifier}: the vocabulary and diagnostics import nothing of the solver`),
    ...module.imports
      .filter((i) => !NODE_ALLOWED.includes(module.file) && isNodeApi(i.specifier))
      .map((i) => `${module.file} imports ${i.specifier}: only the command line touches Node's APIs`),
    ...(module.nodeGlobals && !NODE_ALLOWED.includes(module.file) ? [`${module.file} uses Node's globals: only the command line touches Node's APIs`] : []),
  ]);
}

const src = fileURLToPath(new URL('../src/', import.meta.url));
const modules = readdirSync(src, { recursive: true, encoding: 'utf8' })
  .map((name) => name.replaceAll('\\', '/'))
  .filter((name) => name.endsWith('.ts'))
  .map((name) => readModule(name, readFileSync(`${src}${name}`, 'utf8')));

describe('the import rules of the solver', () => {
  it('reads the real modules', () => {
    expect(modules.map((m) => m.file)).toEqual(expect.arrayContaining(['cli.ts', 'parser/index.ts', 'elaborate/index.ts', ...FREESTANDING]));
    expect(modules.find((m) => m.file === 'cli.ts')?.imports.some((i) => isNodeApi(i.specifier))).toBe(true);
  });

  it('keeps them', () => {
    expect(ruleBreaks(modules)).toEqual([]);
  });

  it('catches a module that breaks them', () => {
    const bad = [
      readModule('vocabulary.ts', "import { lex } from './lexer.js';\nimport type { Unit } from './units.js';"),
      readModule('parser/index.ts', "import { readFileSync } from 'node:fs';\nimport path from 'path';"),
      readModule('analysis.ts', 'const home = process.env.HOME;'),
    ];
    expect(ruleBreaks(bad)).toEqual([
      'vocabulary.ts imports ./lexer.js: the vocabulary and diagnostics import nothing of the solver',
      "parser/index.ts imports node:fs: only the command line touches Node's APIs",
      "parser/index.ts imports path: only the command line touches Node's APIs",
      "analysis.ts uses Node's globals: only the command line touches Node's APIs",
    ]);
  });
});
