/**
 * The API's import graph, read from the source text, and the rules its layers keep
 * (style.md: routes → services → db, db imports no service, routes import no stand-in).
 * The rules are a pure function of the edges, so a test can feed them a bad graph too.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';

export interface ImportEdge {
  /** Both relative to `src/`, with `/` separators: `services/cells.ts`. */
  from: string;
  to: string;
  /** `import type …`: gone at run time, so it cannot form a cycle, but it still says who knows whom. */
  typeOnly: boolean;
}

const importPattern = /(?:^|\n)\s*(?:import|export)\s+(type\s+)?(?:[^'";]*?\s+from\s+)?['"](\.[^'"]+)['"]|import\(\s*['"](\.[^'"]+)['"]\s*\)/g;

function listSources(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const full = path.join(folder, name);
    if (statSync(full).isDirectory()) return listSources(full);
    return name.endsWith('.ts') && !name.endsWith('.test.ts') ? [full] : [];
  });
}

/** Every relative import between the non-test modules under `root` (`.js` specifiers name `.ts` files). */
export function importEdges(root: string): ImportEdge[] {
  const relative = (file: string) => path.relative(root, file).split(path.sep).join('/');
  return listSources(root).flatMap((file) =>
    [...readFileSync(file, 'utf8').matchAll(importPattern)].map((match) => ({
      from: relative(file),
      to: relative(path.resolve(path.dirname(file), (match[2] ?? match[3])!.replace(/\.js$/, '.ts'))),
      typeOnly: Boolean(match[1]),
    })),
  );
}

/** The layer of a module: its top folder under src/, or its own name for a top-level file (`policy`). */
export const layerOf = (file: string): string => file.split('/')[0]!.replace(/\.ts$/, '');

interface Rule {
  says: string;
  breaks(edge: ImportEdge): boolean;
}

const layers = (edge: ImportEdge) => [layerOf(edge.from), layerOf(edge.to)] as const;
const upperLayers = ['app', 'server', 'routes', 'auth', 'mail', 'seed', 'standins'];

export const rules: Rule[] = [
  {
    says: 'the contract imports nothing of the API (the web imports it)',
    breaks: (edge) => layerOf(edge.from) === 'contract' && layerOf(edge.to) !== 'contract',
  },
  {
    says: 'db imports nothing above it (only its own modules, config and the cell check its data migration runs)',
    breaks: (edge) => layerOf(edge.from) === 'db' && !['db', 'config', 'cell-check'].includes(layerOf(edge.to)),
  },
  {
    says: 'services import no route, sign-in, mail, demo data, stand-in or server module',
    breaks: (edge) => layerOf(edge.from) === 'services' && upperLayers.includes(layerOf(edge.to)),
  },
  {
    says: 'presenters only shape data: they call no service (a row type is fine) and nothing above',
    breaks: (edge) => {
      const [from, to] = layers(edge);
      return from === 'presenters' && ((to === 'services' && !edge.typeOnly) || upperLayers.includes(to));
    },
  },
  {
    says: 'routes import no stand-in and no demo data, and reach the database through services (db/connection only hands them the handle)',
    breaks: (edge) => {
      const [from, to] = layers(edge);
      return from === 'routes' && (to === 'standins' || to === 'seed' || (to === 'db' && edge.to !== 'db/connection.ts'));
    },
  },
  {
    says: 'stand-ins run without the app: they import only stand-ins, config, html and the demo people',
    breaks: (edge) => layerOf(edge.from) === 'standins' && !['standins', 'config', 'html'].includes(layerOf(edge.to)) && edge.to !== 'seed/demo-users.ts',
  },
];

/** Each edge that breaks a rule, as "from imports to: rule". */
export function ruleBreaks(edges: readonly ImportEdge[]): string[] {
  return edges.flatMap((edge) => rules.filter((rule) => rule.breaks(edge)).map((rule) => `${edge.from} imports ${edge.to}: ${rule.says}`));
}

/** The import cycles among run-time imports, each as the list of modules around it. */
export function findCycles(edges: readonly ImportEdge[]): string[][] {
  const next = new Map<string, string[]>();
  for (const edge of edges) if (!edge.typeOnly) next.set(edge.from, [...(next.get(edge.from) ?? []), edge.to]);
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
