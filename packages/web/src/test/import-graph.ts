/**
 * The web's own import graph, read from the source text: which module imports which, by
 * relative specifier. Type-only imports are left out, since they vanish from the build and
 * cannot form a cycle at run time.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

export interface ImportEdge {
  from: string;
  to: string;
  specifier: string;
}

const sourceFile = /\.(ts|tsx)$/;
const importPattern = /(?:^|\n)\s*(import|export)\s+(type\s+)?(?:[^'";]*?\s+from\s+)?['"](\.[^'"]+)['"]|import\(\s*['"](\.[^'"]+)['"]\s*\)/g;

function listSources(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const full = path.join(folder, name);
    if (statSync(full).isDirectory()) return listSources(full);
    return sourceFile.test(name) ? [full] : [];
  });
}

function resolveModule(fromFile: string, specifier: string): string | null {
  const base = path.resolve(path.dirname(fromFile), specifier.replace(/\?raw$/, ''));
  for (const candidate of [base, `${base}.ts`, `${base}.tsx`, path.join(base, 'index.ts'), path.join(base, 'index.tsx')]) {
    if (existsSync(candidate) && statSync(candidate).isFile()) return candidate;
  }
  return null;
}

/** Every run-time relative import between source files under `root`. */
export function importEdges(root: string): ImportEdge[] {
  const edges: ImportEdge[] = [];
  for (const file of listSources(root)) {
    const text = readFileSync(file, 'utf8');
    for (const match of text.matchAll(importPattern)) {
      if (match[2]) continue;
      const specifier = match[3] ?? match[4];
      const target = resolveModule(file, specifier);
      if (target && sourceFile.test(target)) edges.push({ from: file, to: target, specifier });
    }
  }
  return edges;
}

/** The import cycles among the modules, each as the list of files around it. */
export function findCycles(edges: readonly ImportEdge[]): string[][] {
  const next = new Map<string, string[]>();
  for (const edge of edges) next.set(edge.from, [...(next.get(edge.from) ?? []), edge.to]);
  const state = new Map<string, 'open' | 'done'>();
  const stack: string[] = [];
  const cycles: string[][] = [];
  const visit = (file: string): void => {
    state.set(file, 'open');
    stack.push(file);
    for (const target of next.get(file) ?? []) {
      if (state.get(target) === 'open') cycles.push(stack.slice(stack.indexOf(target)));
      else if (!state.has(target)) visit(target);
    }
    stack.pop();
    state.set(file, 'done');
  };
  for (const file of next.keys()) if (!state.has(file)) visit(file);
  return cycles;
}
