import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { findCycles, importEdges, layerOf, ruleBreaks } from '../test/import-graph.js';
import type { ImportEdge } from '../test/import-graph.js';

const edges = importEdges(path.dirname(fileURLToPath(import.meta.url)));
const edge = (from: string, to: string, typeOnly = false): ImportEdge => ({ from, to, typeOnly });

describe('the import direction of the API', () => {
  it('reads a real graph', () => {
    expect(edges.length).toBeGreaterThan(150);
    expect(edges.some((e) => layerOf(e.from) === 'routes' && layerOf(e.to) === 'services')).toBe(true);
    expect(edges.some((e) => layerOf(e.from) === 'services' && layerOf(e.to) === 'db')).toBe(true);
  });

  it('keeps every layer rule', () => {
    expect(ruleBreaks(edges)).toEqual([]);
  });

  it('has no import cycles', () => {
    expect(findCycles(edges).map((cycle) => cycle.join(' → '))).toEqual([]);
  });
});

describe('the import rules, fed a bad graph', () => {
  it('name every forbidden import', () => {
    const bad = [
      edge('db/data-source.ts', 'services/cells.ts'),
      edge('db/entities/cell.ts', 'seed/demo-users.ts', true),
      edge('routes/dev-mail/page.ts', 'standins/smtp/mailbox.ts', true),
      edge('routes/cells/router.ts', 'db/entities/cell.ts'),
      edge('services/reviews.ts', 'mail/notifier.ts'),
      edge('presenters/cell.ts', 'services/cells.ts'),
      edge('contract/cells.ts', 'policy.ts', true),
      edge('standins/oauth/standin.ts', 'services/users.ts'),
    ];
    expect(ruleBreaks(bad).map((line) => line.split(':')[0])).toEqual(bad.map((e) => `${e.from} imports ${e.to}`));
  });

  it('allow what the layering allows', () => {
    const good = [
      edge('routes/cells/router.ts', 'services/cells.ts'),
      edge('routes/cells/router.ts', 'db/connection.ts'),
      edge('services/cells.ts', 'db/entities/cell.ts'),
      edge('presenters/cell.ts', 'services/cells.ts', true),
      edge('db/data-source.ts', 'config.ts'),
      edge('seed/demo-data.ts', 'services/cells.ts'),
      edge('standins/oauth/identities.ts', 'seed/demo-users.ts'),
    ];
    expect(ruleBreaks(good)).toEqual([]);
  });

  it('find a cycle of run-time imports, and not one closed only by a type import', () => {
    const cycle = [edge('services/a.ts', 'services/b.ts'), edge('services/b.ts', 'services/c.ts'), edge('services/c.ts', 'services/a.ts')];
    expect(findCycles(cycle)).toEqual([['services/a.ts', 'services/b.ts', 'services/c.ts']]);
    expect(findCycles([...cycle.slice(0, 2), edge('services/c.ts', 'services/a.ts', true)])).toEqual([]);
  });
});
