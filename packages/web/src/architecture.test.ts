import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { findCycles, importEdges } from './test/import-graph';
import type { ImportEdge } from './test/import-graph';

// The web's layering (style.md): features do not import each other, routes in app/ put them
// together, shared code (components/, hooks/, lib/) imports no feature and no route.
const src = path.dirname(fileURLToPath(import.meta.url));
const edges = importEdges(src);

/** "features/notebooks", "components", "app", "lib", … for a file under src/. */
function areaOf(file: string): string {
  const [top, second] = path.relative(src, file).split(path.sep);
  return top === 'features' ? `features/${second}` : top;
}

const SHARED = ['components', 'hooks', 'lib'];

/** Each import that breaks a layering rule, as "from imports specifier: rule". */
function ruleBreaks(graph: readonly ImportEdge[]): string[] {
  return graph.flatMap((edge) => {
    const from = areaOf(edge.from);
    const to = areaOf(edge.to);
    const says = (rule: string) => [`${path.relative(src, edge.from)} imports ${edge.specifier}: ${rule}`];
    if (from.startsWith('features/') && to.startsWith('features/') && from !== to) return says('a feature imports no other feature');
    if (from.startsWith('features/') && to === 'app') return says('a feature imports no route');
    if (SHARED.includes(from) && (to.startsWith('features/') || to === 'app')) return says('shared code imports no feature and no route');
    return [];
  });
}

/** An import of `to` from `from`, both paths under src/. */
const edge = (from: string, to: string): ImportEdge => ({ from: path.join(src, from), to: path.join(src, to), specifier: to });

describe('the import direction of the web app', () => {
  it('reads a real graph', () => {
    expect(edges.length).toBeGreaterThan(100);
    expect(edges.some((e) => areaOf(e.from) === 'app' && areaOf(e.to).startsWith('features/'))).toBe(true);
  });

  it('keeps its layering: features apart, routes on top, shared code below', () => {
    expect(ruleBreaks(edges)).toEqual([]);
  });

  it('catches an import that breaks the layering', () => {
    const bad = [
      edge('features/pins/components/pin-list.tsx', 'features/reviews/components/review-badge.tsx'),
      edge('features/cells/components/cell-list.tsx', 'app/route-params.ts'),
      edge('lib/paths.ts', 'features/auth/api/get-me.ts'),
      edge('hooks/use-document-title.ts', 'app/router.tsx'),
      edge('app/routes/notebook.tsx', 'features/cells/components/cell-list.tsx'),
    ];
    expect(ruleBreaks(bad)).toEqual([
      'features/pins/components/pin-list.tsx imports features/reviews/components/review-badge.tsx: a feature imports no other feature',
      'features/cells/components/cell-list.tsx imports app/route-params.ts: a feature imports no route',
      'lib/paths.ts imports features/auth/api/get-me.ts: shared code imports no feature and no route',
      'hooks/use-document-title.ts imports app/router.tsx: shared code imports no feature and no route',
    ]);
  });

  it('has no import cycles, and would see one', () => {
    expect(findCycles(edges).map((cycle) => cycle.map((file) => path.relative(src, file)).join(' → '))).toEqual([]);
    expect(findCycles([edge('lib/a.ts', 'lib/b.ts'), edge('lib/b.ts', 'lib/a.ts')])).toHaveLength(1);
  });
});
