/**
 * An accessibility sweep with axe-core (WCAG 2.1 A and AA rules) over every main page, in the
 * light and the dark theme: the goal is no violation at all.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { baseUrl, openBrowser } from './browser';
import type { Session } from './browser';
import { fetchFromPage, signIn } from './helpers';

// Evaluated through the browser's debugging protocol: the app's CSP rightly refuses inline scripts.
const axeSource = readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
// The site admin of the demo team (packages/api/src/seed/demo-users.ts) sees every page.
const admin = 'mara.lindqvist';

interface Violation {
  id: string;
  impact: string | null;
  help: string;
  nodes: { target: string[] }[];
}

/** Runs axe-core on the page as it stands and lists its violations, one line each. */
async function violationsOn(page: Page): Promise<string[]> {
  await page.evaluate(axeSource);
  const violations = await page.evaluate(async () => {
    const axe = (window as unknown as { axe: { run: (context: Document, options: object) => Promise<{ violations: Violation[] }> } }).axe;
    const result = await axe.run(document, { runOnly: { type: 'tag', values: ['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa'] } });
    return result.violations;
  });
  return violations.map((v) => `${v.id} (${v.impact}, ${v.nodes.length}×): ${v.help} — first at ${v.nodes[0]?.target.join(' ')}`);
}

/** The pages to sweep, found through the API so they exist in this database. */
async function mainPages(page: Page): Promise<[string, string][]> {
  const list = (await fetchFromPage(page, '/api/notebooks?limit=50', { method: 'GET' })).body as { items: { id: string }[] };
  const notebookId = list.items[0].id;
  const notebook = (await fetchFromPage(page, `/api/notebooks/${notebookId}`, { method: 'GET' })).body as { cells: { id: number }[] };
  const versions = (await fetchFromPage(page, `/api/notebooks/${notebookId}/versions`, { method: 'GET' })).body as { items: { number: number }[] };
  const pages: [string, string][] = [
    ['notebooks', '/notebooks'],
    ['notebook', `/notebooks/${notebookId}`],
    ['versions', `/notebooks/${notebookId}/versions`],
    ['activity', `/notebooks/${notebookId}/activity`],
    ['cell history', `/notebooks/${notebookId}/cells/${notebook.cells[0].id}/history`],
    ['settings', '/settings'],
    ['admin', '/admin'],
    ['help', '/help'],
    ['not found', '/no-such-page'],
  ];
  if (versions.items.length > 0) pages.push(['version', `/notebooks/${notebookId}/versions/${versions.items[0].number}`]);
  // The demo data holds a review in progress, with pins and a reply.
  for (const { id } of list.items) {
    const reviews = (await fetchFromPage(page, `/api/notebooks/${id}/reviews`, { method: 'GET' })).body as { items: { id: number }[] };
    if (reviews.items.length > 0) {
      pages.push(['review', `/notebooks/${id}/reviews/${reviews.items[0].id}`]);
      break;
    }
  }
  expect(pages.map(([name]) => name)).toContain('review');
  return pages;
}

/** Opens a page and waits until it has settled: data loaded, the editor and plots drawn. */
async function openSettled(page: Page, path: string): Promise<void> {
  await page.goto(`${baseUrl}${path}`);
  await page.locator('main').first().waitFor();
  await page.waitForLoadState('networkidle');
  const plots = page.locator('[data-testid="plot-bode"]');
  if ((await plots.count()) > 0) await plots.first().locator('.main-svg').first().waitFor({ timeout: 30_000 });
}

describe('accessibility of every main page (axe-core, WCAG 2.1 A/AA)', () => {
  let session: Session;
  let pages: [string, string][] = [];

  beforeAll(async () => {
    session = await openBrowser();
    await openSettled(session.page, '/');
  });
  afterAll(async () => {
    await session?.close();
  });

  for (const theme of ['light', 'dark'] as const) {
    it(`finds no violation on the landing page, ${theme} theme`, async () => {
      const { page } = session;
      await page.emulateMedia({ colorScheme: theme });
      await openSettled(page, '/');
      expect(await violationsOn(page)).toEqual([]);
    });

    it(`finds no violation on the signed-in pages, ${theme} theme`, async () => {
      const { page } = session;
      await page.emulateMedia({ colorScheme: theme });
      if (pages.length === 0) {
        await signIn(page, admin);
        pages = await mainPages(page);
      }
      const found: string[] = [];
      for (const [name, path] of pages) {
        await openSettled(page, path);
        found.push(...(await violationsOn(page)).map((line) => `${name}: ${line}`));
      }
      expect(found).toEqual([]);
    }, 180_000);
  }
});
