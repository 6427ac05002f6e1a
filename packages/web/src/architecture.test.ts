import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { findCycles, importEdges } from './test/import-graph';

// The web's layering (style.md): features do not import each other, routes in app/ put them
// together, shared code (components/, hooks/, lib/) imports no feature and no route.
const src = path.dirname(fileURLToPath(import.meta.url));
const edges = importEdges(src);

/** "features/notebooks", "components", "app", "lib", … for a file under src/. */
function areaOf(file: string): string {
  const [top, second] = path.relative(src, file).split(path.sep);
  return top === 'features' ? `features/${second}` : top;
}

const describeEdge = (edge: { from: string; specifier: string }) => `${path.relative(src, edge.from)} imports ${edge.specifier}`;

describe('the import direction of the web app', () => {
  it('reads a real graph', () => {
    expect(edges.length).toBeGreaterThan(100);
    expect(edges.some((edge) => areaOf(edge.from) === 'app' && areaOf(edge.to).startsWith('features/'))).toBe(true);
  });

  it('has no feature importing another feature', () => {
    const crossing = edges.filter((edge) => {
      const from = areaOf(edge.from);
      const to = areaOf(edge.to);
      return from.startsWith('features/') && to.startsWith('features/') && from !== to;
    });
    expect(crossing.map(describeEdge)).toEqual([]);
  });

  it('has no feature importing a route', () => {
    const upward = edges.filter((edge) => areaOf(edge.from).startsWith('features/') && areaOf(edge.to) === 'app');
    expect(upward.map(describeEdge)).toEqual([]);
  });

  it('has shared code (components, hooks, lib) importing no feature and no route', () => {
    const shared = edges.filter((edge) => ['components', 'hooks', 'lib'].includes(areaOf(edge.from)));
    const wrong = shared.filter((edge) => areaOf(edge.to).startsWith('features/') || areaOf(edge.to) === 'app');
    expect(wrong.map(describeEdge)).toEqual([]);
  });

  it('has no import cycles', () => {
    expect(findCycles(edges).map((cycle) => cycle.map((file) => path.relative(src, file)).join(' → '))).toEqual([]);
  });
});
